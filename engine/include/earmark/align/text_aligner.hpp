// Automatic word and phone alignment of a take to its text, when no timings
// exist.
//
// Method (a reference-warping aligner):
// 1. Render the text with libespeak-ng (speech_render.hpp); its word and
//    phoneme events give reference word and phone tiers whose word labels
//    come from the text (reference_tiers.hpp). Silence is added around it.
// 2. MFCC frames of take and reference at one rate, the reference's level
//    and noise floor matched to the take's (mfcc.hpp computeMatchedMfcc).
// 3. DTW (dtw.hpp) in two passes: a coarse pass (frames averaged by
//    `coarseFactor`) inside a Sakoe–Chiba band around the line joining the
//    speech spans of both, then a full-rate pass inside a corridor around
//    the coarse path — so memory and time grow with the take's length, not
//    its square. Take frames may be left out at the ends and inside (a pause
//    the reading lacks), each at the cost of its distance from the take's
//    own background, so silence and noise are dropped while speech is not.
//    Memory: 4 bytes per band cell — about (take s / coarse hop)·(2·band
//    radius / coarse hop) cells for the coarse pass (≈ 16 MB for 2.5 minutes
//    with the defaults) and a few MB per minute for the corridor; the band
//    radius is capped, so memory grows linearly with the take's length.
// 4. Reference boundaries are carried through the path: a start goes to
//    the first take frame matched with the first reference frame after it,
//    an end to the last take frame matched with the last reference frame
//    before it. Next to silence (a pause, or a stop's closure, which looks
//    alike) the nearest sounding reference frame is carried instead, keeping
//    the reference's distance to it. Where the take pauses (minPauseSeconds
//    or longer) at a word boundary the reading has no pause, the words
//    around it get a gap.
// 5. Each word boundary is refined within ±refinement.windowSeconds onto the
//    take's matching energy landmark (boundary_refine.hpp).
// 6. Confidence per word: 1 where the word's mean local DTW distance is at
//    or below `goodDistanceRatio` × the chance distance (mean distance
//    between unrelated speech frames of take and reference), falling
//    linearly to 0 at `badDistanceRatio` × chance.
// Phones are the reference reading's (its voice's pronunciation), carried
// the same way and kept inside their words.
#pragma once

#include "earmark/align/boundary_refine.hpp"
#include "earmark/align/mfcc.hpp"
#include "earmark/align/speech_render.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/tiers/tier.hpp"

#include <cstddef>
#include <string>

namespace earmark {

struct AlignParams {
    SpeechParams speech;             // reference voice, rate and pitch
    MfccParams features;             // frame features (hop = time resolution of the path)
    int coarseFactor = 8;            // full-rate frames per coarse frame, >= 1
    double bandRadiusSeconds = 1.5;  // least half-width of the coarse band
    double bandRadiusFraction = 0.15;  // … or this share of the longer speech span, if wider,
    double maxBandRadiusSeconds = 20.0;  // … but never wider than this (memory stays linear in length)
    double corridorSeconds = 0.1;    // half-width of the full-rate corridor around the coarse path
    double referencePadSeconds = 0.15;  // silence added around the reference
    double minPauseSeconds = 0.1;    // a pause the take has where the reading has none is kept from this length
    double maxLengthRatio = 3.0;     // refuse text whose reading is this much longer/shorter than the speech
    bool refine = true;              // step 5
    RefineParams refinement;
    double goodDistanceRatio = 0.25;  // confidence 1 at or below this share of the chance distance
    double badDistanceRatio = 0.60;   // confidence 0 at or above it
    double minWordSeconds = 0.01;     // least length of a word after alignment
    double minPhoneSeconds = 0.002;   // least length of a phone
    // Throws ParamError("AlignParams.<field>", …), also for invalid speech/features params.
    void validate() const;
};

struct AlignResult {
    TierSet tiers;               // "words" (with confidence) and "phones"; durationS = the take's length
    double meanConfidence = 0.0;  // over words
    double referenceSeconds = 0.0;  // length of the rendered reading, without padding
    double speechStartS = 0.0, speechEndS = 0.0;  // speech span found in the take
    std::size_t dtwCells = 0;     // cost cells stored by the larger DTW pass (4 bytes each)
    std::string voiceName;        // as espeak-ng names the voice used
    std::string method = "reference";  // which aligner made the tiers: "reference" (this one) or "model"
};

// Aligns `text` (UTF-8) to `take`. Times are seconds from the start of the
// take, rounded to the millisecond.
// Throws:
// - InputError("text", …): empty or only punctuation (nothing to speak), not
//   valid UTF-8, letters of a script the voice cannot read (script_check.hpp),
//   or a reading more than maxLengthRatio times longer or shorter than the
//   take's speech;
// - InputError("audio", …): an empty take, or one with no speech (silence or
//   steady noise);
// - ParamError for invalid params or an unknown voice; Cancelled if `progress` asks.
// Thread-safe; the rendering step is serialised (libespeak-ng is global).
AlignResult alignText(const Signal& take, const std::string& text, const AlignParams& params = {},
                      Progress progress = {});

}  // namespace earmark
