// Short high-frequency noise bursts: frames whose energy at and above
// `bandHz` jumps far above the level on both sides — a spectral-flux spike
// confined to the high band (common practice in audio restoration; the
// flux idea as in J. P. Bello et al., "A tutorial on onset detection in music
// signals", IEEE Trans. Speech and Audio Processing 13(5), 2005, pp. 1035–1047).
//
// Per frame (Hann window of about `windowSeconds`, hop `hopSeconds`), the
// high-band level H[i] in dB. Its context is the larger of the medians of H
// over [i − contextSeconds, i − gapSeconds] and [i + gapSeconds, i + contextSeconds]:
// inside a fricative at least one side is fricative too, so a fricative
// (or its onset) is not a burst. A run of frames with H − context ≥
// `minExcessDb`, at most `maxSeconds` long, is one burst, unless its own
// high-band level stays below the speech level − `belowSpeechDb` (too quiet to matter).
// Speech makes its own short bursts where voicing stops (stop releases,
// fricative onsets), so a run counts only when the voice goes on through
// it: the pitch track is voiced `gapSeconds` before and after the run.
//
// Result: one event per burst in time order; value = the largest excess,
// dB; span = the run's frames (centre ± half a hop). Takes whose Nyquist
// frequency is at or below `bandHz` + 500 Hz have no high band: no events.
//
// Errors: ParamError naming the field; ParamError("Signal.sampleRate");
// ParamError("PitchTrack.hopSeconds") for a track without a positive hop.
// Thread-safety: pure function. Cost: one FFT of ~10 ms per hop.
#pragma once

#include "earmark/artefacts/artefact_event.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/pitch/pitch_track.hpp"

#include <vector>

namespace earmark {

struct NoiseBurstParams {
    double bandHz = 4000.0;            // lower edge of the high band, Hz. Valid: [1000, 20000]
    double hopSeconds = 0.005;         // frame step. Valid: (0, 0.05]
    double windowSeconds = 0.01;       // frame length (next power of two of samples). Valid: [hop, 0.1]
    double gapSeconds = 0.025;         // context starts this far from the frame. Valid: (0, context)
    double contextSeconds = 0.08;      // and ends this far. Valid: (gap, 1]
    double minExcessDb = 25.0;         // high band above its context, dB. Valid: > 0
    double maxSeconds = 0.06;          // longer runs are speech sounds, not bursts. Valid: > 0
    double belowSpeechDb = 40.0;       // bursts quieter than speech level − this are ignored, dB. Valid: > 0
    void validate() const;             // throws ParamError("NoiseBurstParams.<field>")
};

// `pitch`: the take's YIN track (earmark/pitch/yin.hpp); frames beyond it are unvoiced.
std::vector<ArtefactEvent> findNoiseBursts(const Signal& signal, const PitchTrack& pitch, double speechLevelDb,
                                           const NoiseBurstParams& params = {}, Progress progress = {});

}  // namespace earmark
