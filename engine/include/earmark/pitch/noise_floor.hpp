// How much of each frame's energy a take's steady noise floor explains, and
// the voicing bar on YIN's d′ (de Cheveigné & Kawahara, JASA 111(4), 2002)
// that follows from it.
//
// Why: a periodic part of power S in white noise of power N gives
//   d′(T) ≈ a·(1 − ρ) + ρ,   ρ = N / (S + N)  (the frame's noise share),
// at its period T, where a is the periodic part's own d′: d(T) gains 2W·N
// from the noise, and the mean of d over lags is ≈ 2W·(S + N) (the periodic
// part's autocorrelation averages to 0 over one period). A fixed bar on d′
// therefore calls quiet voiced frames unvoiced once noise fills their
// waveform, although their harmonics stand clearly above it. voicingBar asks
// the same of the periodic part as the fixed bar asks of a clean frame
// (a <= baseBar), capped at maxBar because white noise alone reads
// d′ ≈ 0.7–1 at its deepest dip (the least of a few hundred values with mean 1).
//
// The noise floor is a low percentile of the take's frame energies: in a take
// with pauses, the energy of its quietest stretches (common practice for
// offline noise-floor estimates). It counts as a steady floor only if a lower
// percentile lies close below it: frames of steady noise agree on their
// energy within a fraction of a dB (white noise over a 537-sample frame:
// s.d. ≈ 0.3 dB), while the quietest frames of speech without pauses, or a
// varying background, spread over several dB; without a steady floor nothing
// is raised. A frame less than minExcessDb above the floor gets a noise share
// of 0: its energy gives no evidence of anything above the noise, so it is
// judged as if clean. In clean takes the floor is far below every voiced
// frame (or digital silence) and every share is ≈ 0.
// Pure functions; thread-safe.
#pragma once

#include <algorithm>
#include <span>
#include <vector>

namespace earmark {

struct NoiseFloorRule {
    double floorPercentile = 0.05;  // percentile of frame energies taken as the noise floor, 0 … 1
    double checkPercentile = 0.01;  // a lower percentile that must lie within maxSpreadDb below it
    double maxSpreadDb = 2.0;       // dB
    double minExcessDb = 1.0;       // frames less than this above the floor get share 0, dB
};

// The steady noise floor of frames with energies energyDb (dB; digital
// silence may read any very low value), as described above, or −infinity
// if there is none (also for an empty span). Pass only frames that lie
// wholly inside the signal: zero-padded edge frames read low.
double steadyNoiseFloorDb(std::span<const float> energyDb, const NoiseFloorRule& rule = {});

// ρ per frame: 10^((floorDb − frameDb) / 10) in [0, 1), or 0 as described above
// (also everywhere if floorDb is −infinity). energyDb and floorDb in the same dB scale.
std::vector<float> noiseShares(std::span<const float> energyDb, double floorDb, const NoiseFloorRule& rule = {});

// The highest d′ at which a frame of noise share ρ still counts as voiced:
// min(maxBar, baseBar + (1 − baseBar)·ρ), never below baseBar.
inline double barInNoise(double noiseShare, double baseBar, double maxBar) {
    return std::max(baseBar, std::min(maxBar, baseBar + (1.0 - baseBar) * noiseShare));
}

}  // namespace earmark
