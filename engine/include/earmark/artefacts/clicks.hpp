// Clicks and pops: single-sample (or few-sample) discontinuities that no
// speech sound explains, found as outliers of an autoregressive (AR)
// prediction error — the detector of S. J. Godsill and P. J. W. Rayner,
// "Digital Audio Restoration: A Statistical Model Based Approach", Springer,
// London, 1998, ch. 5 (after S. V. Vaseghi and P. J. W. Rayner, "Detection
// and suppression of impulsive noise in speech communication systems", IEE
// Proceedings I 137(1), 1990, pp. 38–46).
//
// Per block of `blockSeconds`, AR coefficients of order p (2 + rate/1 kHz,
// at most 40) come from the autocorrelation of a Hann-windowed stretch of
// `windowSeconds` centred on the block (Levinson–Durbin). The block is then
// inverse-filtered (prediction error e) and e is filtered once more with
// the detector's matched filter: d[n] = |Σ_k a_k e[n+k]| / Σ_k a_k², the
// difference between a sample and its interpolation from both sides (an
// added impulse of A reads A; a glottal pulse — an impulse the vocal tract
// has filtered, what pulse-excited voices make every period — is spread over
// p samples and reads far less).
// Earmark's two additions: d is divided by a robust scale (1.4826 × the median of d
// over the block's window, floored at the speech level − `floorBelowSpeechDb`
// so digital silence does not make every dither sample an outlier), and a click
// must stand `minIsolation` times above every other d within
// ±`isolationSeconds` (outside ±p samples), so periodic pulses do not count.
//
// Result: one event per click, in time order; value = d / scale at the
// click ("×", unitless); the span is the click's samples ± 0.5 ms.
// `speechLevelDb` is the take's speech level, dBFS (SpeechActivity).
//
// Errors: ParamError naming the field for invalid params; ParamError
// ("Signal.sampleRate") for a non-positive rate. Cancelled via `progress`.
// Thread-safety: pure function. Cost: O(n·p).
#pragma once

#include "earmark/artefacts/artefact_event.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <vector>

namespace earmark {

struct ClickParams {
    double blockSeconds = 0.01;        // AR coefficients are refreshed every block. Valid: (0, 0.1]
    double windowSeconds = 0.03;       // stretch the coefficients are fitted on. Valid: [blockSeconds, 0.2]
    double minRatio = 15.0;            // d / robust scale at a click. Valid: > 0
    double minIsolation = 3.0;         // d at a click / the largest other d nearby. Valid: >= 1
    double isolationSeconds = 0.015;   // "nearby", s. Valid: (0, 0.1]
    double floorBelowSpeechDb = 30.0;  // scale floor below the speech level, dB. Valid: > 0
    void validate() const;             // throws ParamError("ClickParams.<field>")
};

std::vector<ArtefactEvent> findClicks(const Signal& signal, double speechLevelDb, const ClickParams& params = {},
                                      Progress progress = {});

}  // namespace earmark
