// Pitch (F0) estimation with YIN: A. de Cheveigné and H. Kawahara, "YIN, a
// fundamental frequency estimator for speech and music", JASA 111(4), 2002.
//
// Pipeline:
//  0. The signal is resampled to `analysisRateHz` (libsoxr), so cost does not
//     grow with the file's rate. Frame i is centred at t = i·hop, where hop is
//     `hopSeconds` rounded to whole samples of the ORIGINAL rate (the hop used
//     is reported in PitchTrack::hopSeconds); there are floor(n / hop) + 1
//     frames for n > 0 samples, exactly as many as the energy track with the
//     same hop; outside the signal is silence (zero padding).
//  1. Per frame, the paper's steps (see yin_frame.hpp): (2) difference
//     function d(τ) over an integration window W = one longest period, its
//     cross term by FFT correlation and its energy terms by running sums;
//     (3) cumulative-mean-normalised difference d′; (4) absolute threshold
//     (`threshold`, raised in noisy frames as the voicing bar in 3 is, and
//     for the same reason: in noise no dip of a quiet voice reaches the
//     clean threshold, and the global minimum is as often a multiple of the
//     period as the period itself); (5) parabolic interpolation. A frame
//     reads W + maxLag + 1 samples centred on its time (≈ 33.6 ms for the
//     60 Hz default floor).
//  2. Step 6, best local estimate, as in the paper: among the frames within
//     ±(longest period)/2 of frame t (at least ±1 frame), take the one whose
//     estimate has the lowest d′; if that is not t, search t's d′ again
//     within ±20 % of that estimate (steps 4–5 restricted to that range).
//  3. Voicing: a frame can be voiced only if its energy (RMS over the
//     frame's span) passes both gates: >= `absoluteFloorDb` dBFS and >= the
//     take's loud level + `silenceGateDb` (loud level = 95th percentile of
//     frame energies). Its voicing bar on d′ is `voicingMaxAperiodicity`,
//     raised where the take's noise floor (5th percentile of frame energies)
//     explains a share ρ of the frame's energy to bar + (1 − bar)·ρ, at most
//     `noiseVoicingMaxAperiodicity` (noise_floor.hpp; off with
//     `noiseAdaptiveVoicing` = false): a quiet voiced frame in steady noise
//     reads d′ ≈ ρ even if its periodic part is perfect. Without continuity,
//     a frame is then voiced when d′ at its estimate is at most its bar.
//  4. Continuity (pitch_continuity.hpp), on by default: one Viterbi search
//     over "unvoiced" and each frame's candidates (YIN's pick and the next 3
//     deepest dips of d′) with the frame's voicing bar as the cost of
//     "unvoiced", `voicingSwitchCost` per voicing change,
//     `octaveJumpCost`·|log2 ratio| between voiced neighbours (beyond
//     `freeGlideSemitonesPerSecond`, so fast glides stay voiced) and a soft
//     preference for shorter lags (`shorterLagPreference`). It removes
//     isolated octave jumps, bridges one-frame voicing holes (fast glides at
//     low F0 make d′ flicker) and drops voiced blips in noise; a step between
//     segments separated by a gap costs nothing extra, so it is kept. Then
//     voiced runs shorter than `minVoicedSeconds` become unvoiced.
//  5. Timing refinement: d(τ) at the lag finally chosen (and its neighbours)
//     is computed once more, directly, over a window centred on the frame's
//     time (walking downhill up to 20 % of the lag), and interpolated again.
//     (Step 2's window is fixed for all lags, so the pair region of lag τ is
//     centred (maxLag − τ)/2 samples before the frame time; without this the
//     F0 of fast glides would lag by up to ~7 ms.)
//     Voicing is decided on step 2's window: for high voices its boundaries
//     can lead the truth by up to (maxLag − minLag)/2 samples (≈ 7 ms).
//
// Outputs per frame: f0Hz (0 = unvoiced), aperiodicity = d′ at the chosen
// candidate (reported for unvoiced frames too; 1 in digital silence),
// confidence = clamp(1 − aperiodicity, 0, 1), and 0 where an energy gate
// failed. An empty signal gives a track with 0 frames (hopSeconds still set).
//
// Errors: ParamError naming the field for invalid params (see validate());
// ParamError("Signal.sampleRate") for a non-positive or non-finite rate;
// InputError("Signal.samples") if a sample is NaN or infinite; Cancelled when
// the progress callback asks to stop (checked every 2048 frames).
// Thread-safety: pure function; safe to call from several threads at once.
// Cost: three real FFTs of N >= 2·analysisRateHz/minF0Hz per frame (N = 640
// at the defaults); no allocation per frame. About 0.4 s of one core for 10
// minutes of 22.05 kHz audio at a 5 ms hop, a third of it resampling.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/pitch/pitch_track.hpp"

namespace earmark {

struct PitchParams {
    double minF0Hz = 60.0;          // lowest F0 searched, Hz; sets the longest lag and the
                                    // frame length. Valid: >= 20 and < maxF0Hz
    double maxF0Hz = 500.0;         // highest F0 searched, Hz; sets the shortest lag.
                                    // Valid: <= analysisRateHz / 4
    double hopSeconds = 0.005;      // frame step, s; rounded to whole samples of the input
                                    // rate (at least 1). Valid: (0, 1]
    double threshold = 0.15;        // YIN absolute threshold on d′ (step 4); the paper
                                    // suggests ≈ 0.1–0.15. Valid: (0, 1]
    double analysisRateHz = 16000;  // signal is resampled to this rate, Hz.
                                    // Valid: 4·maxF0Hz … 192000
    double voicingMaxAperiodicity = 0.35;  // frames whose d′ at the estimate is above this are
                                           // unvoiced (white noise reads ≈ 0.7–1). Valid: (0, 2]
    double silenceGateDb = -50.0;   // frames quieter than (the take's loud level + this), dB,
                                    // are unvoiced; the loud level is the 95th percentile of
                                    // frame energies. Valid: [-200, 0]
    double absoluteFloorDb = -70.0; // frames below this RMS, dBFS, are always unvoiced.
                                    // Valid: [-200, 0]
    bool noiseAdaptiveVoicing = true;  // raise the bars on d′ (threshold, voicingMaxAperiodicity)
                                       // where the take's noise floor explains part of a frame's
                                       // energy (1 and 3 above, noise_floor.hpp)
    double noiseVoicingMaxAperiodicity = 0.6;  // the highest those raised bars go (white noise
                                               // alone reads ≈ 0.7–1). Valid: [voicingMaxAperiodicity, 2]
    bool continuity = true;         // run the continuity step (4 above)
    double minVoicedSeconds = 0.03; // shorter voiced runs are removed by the continuity
                                    // step, s. Valid: [0, 10]
    double voicingSwitchCost = 0.15;  // continuity: cost per voiced↔unvoiced change, in d′
                                      // units. Valid: [0, 100]
    double octaveJumpCost = 1.0;    // continuity: cost per octave of F0 change between
                                    // neighbouring frames beyond the free glide rate below,
                                    // in d′ units. Valid: [0, 100]
    double freeGlideSemitonesPerSecond = 200.0;  // continuity: F0 movement up to this rate
                                                 // costs nothing (200 = 1 semitone per 5 ms,
                                                 // a fast but genuine glide). Valid: [0, 10000]
    double shorterLagPreference = 0.1;  // continuity: cost per octave of a candidate's lag above
                                        // the frame's shortest candidate lag, in d′ units (a soft
                                        // form of step 4); ranks candidates only. Valid: [0, 100]

    // Throws ParamError naming the field ("PitchParams.minF0Hz", …).
    void validate() const;
};

PitchTrack analysePitch(const Signal& signal, const PitchParams& params = {}, Progress progress = {});

}  // namespace earmark
