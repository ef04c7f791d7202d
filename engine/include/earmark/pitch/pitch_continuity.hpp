// Earmark's continuity step for YIN tracks: one Viterbi search decides, frame
// by frame, between "unvoiced" and one of a few YIN period candidates, so
// that isolated octave jumps, one-frame voicing holes and voiced blips in
// noise disappear while real F0 movement stays.
//
// States per frame: U (unvoiced) and V_k (candidate k; k = 0 is YIN's own
// pick from steps 4–6, always present). The path minimises the sum of
//   local costs:  U → unvoicedCost (the voicing threshold on d′; raised in noisy frames);
//                 V_k → d′_k + shorterLagPreference·log2(lag_k / shortest lag
//                       of the frame), all V_k shifted together so that the
//                       cheapest keeps the cost min_k d′_k: the preference
//                       ranks candidates, it does not make a frame look less
//                       voiced. V_k is impossible where the frame failed an
//                       energy gate (`allowed` = 0);
//   transitions:  V_j → V_k: octaveJumpCost·max(0, |log2(lag_k / lag_j)| − freeOctavesPerFrame);
//                 U → V and V → U: switchCost; U → U: 0.
//
// Consequences: without switch costs, voicing is the plain per-frame rule
// (voiced iff the best d′ < unvoicedCost). With them, a voicing hole is
// bridged when the summed excess of d′ over the threshold inside it is below
// 2·switchCost, and a voiced blip is dropped when its summed margin below the
// threshold is under 2·switchCost. Through U there is no pitch memory, so an
// F0 step across a gap costs nothing extra. A wrong-octave stretch inside a
// voiced run costs ≈ 2·octaveJumpCost to enter and leave, so stretches with
// a better-fitting candidate at the neighbours' octave are replaced. F0
// movement up to freeOctavesPerFrame per frame (by default one semitone per
// 5 ms frame: a fast but genuine glide) costs nothing. The shorter-lag
// preference is a soft form of YIN's step 4 (prefer the first dip): a longer
// lag wins only if its d′ is lower by more than 0.1 per octave, which
// counters YIN's global-minimum fallback in noise (d′ at T, 2T, 3T nearly
// equal, the deepest often a subharmonic) and lets a clearly better period
// win over a half period that slipped under the threshold.
//
// A transition cost in |log2 ratio| and a voiced/unvoiced state pair are the
// usual way to tie pitch candidates together (e.g. the HMM over YIN
// candidates of Mauch & Dixon, "pYIN", ICASSP 2014); these costs and weights
// are Earmark's own, tuned on synthetic speech (common practice).
// Pure functions; thread-safe.
#pragma once

#include "earmark/pitch/yin_frame.hpp"

#include <array>
#include <cstdint>
#include <span>
#include <vector>

namespace earmark {

// The period candidates of one frame. dips[0] is YIN's own pick (steps 4–6);
// the others are the next-deepest local minima of d′, deepest first.
struct PitchCandidates {
    static constexpr int kMax = 4;
    std::array<YinDip, kMax> dips{};
    int count = 0;  // 0 … kMax; a frame with 0 candidates can only be unvoiced
};

struct ContinuityCosts {
    double unvoicedCost = 0.35;               // local cost of U, in d′ units (= the voicing threshold)
    double switchCost = 0.15;                 // per voiced↔unvoiced change
    double octaveJumpCost = 1.0;              // per octave of change between neighbouring voiced
                                              // frames, beyond the free allowance below
    double freeOctavesPerFrame = 1.0 / 12.0;  // F0 change per frame that costs nothing
    double shorterLagPreference = 0.1;        // per octave of lag above the frame's shortest candidate
    double noisyUnvoicedCostMax = 0.6;        // highest cost of U in a noisy frame (noise_floor.hpp)
};

// Marker in the result of trackCandidates for an unvoiced frame.
inline constexpr std::uint8_t kUnvoiced = 0xFF;

// The Viterbi path described above: per frame, the index into
// candidates[i].dips of the chosen candidate, or kUnvoiced.
// Throws ParamError if the spans differ in size.
std::vector<std::uint8_t> trackCandidates(std::span<const PitchCandidates> candidates,
                                          std::span<const std::uint8_t> allowed,
                                          const ContinuityCosts& costs = {});

// The same for frames with a noise share ρ each (noise_floor.hpp; 0 = clean):
// the cost of U becomes barInNoise(ρ, unvoicedCost, noisyUnvoicedCostMax).
// Throws ParamError if the three spans differ in size.
std::vector<std::uint8_t> trackCandidates(std::span<const PitchCandidates> candidates,
                                          std::span<const std::uint8_t> allowed,
                                          std::span<const float> noiseShare, const ContinuityCosts& costs);

// Sets to kUnvoiced every run of voiced entries (!= kUnvoiced) shorter than minRunFrames.
void dropShortVoicedRuns(std::span<std::uint8_t> choice, int minRunFrames);

}  // namespace earmark
