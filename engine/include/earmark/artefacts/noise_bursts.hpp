// Short high-frequency noise bursts: frames where the whole band at and
// above `bandHz` jumps far above the level on both sides — a spectral-flux
// spike confined to the high band (common practice in audio restoration; the
// flux idea as in J. P. Bello et al., "A tutorial on onset detection in music
// signals", IEEE Trans. Speech and Audio Processing 13(5), 2005, pp. 1035–1047).
//
// Per frame (Hann window of about `windowSeconds`, hop `hopSeconds`) the
// high band is cut into sub-bands `subBandHz` wide; each sub-band's level is
// compared with its context, the larger of its medians over [i −
// contextSeconds, i − gapSeconds] and [i + gapSeconds, i + contextSeconds]
// (inside a fricative at least one side is fricative too). The frame's
// excess is the MEDIAN over sub-bands of those rises: white noise lifts every
// sub-band, while the voice's own high-frequency energy sits in a few (a
// rise of the band's total alone hides a burst under the loudest sub-band).
// A frame is flagged when its excess is at least `minExcessDb` and its
// high band is within `belowSpeechDb` of the speech level (quieter bursts
// are not worth a listener's time). A run of flagged frames (holes of one
// frame bridged) at most `maxSeconds` long is one burst when
//   - the voice goes on through it: the pitch track is voiced `gapSeconds`
//     before and after the run;
//   - the band below `lowBandHz` has not dipped more than `maxLowDipDb`
//     under its context (median over the run's frames) — the vowel under a
//     burst goes on, a consonant (a stop's release, a fricative's onset)
//     takes the voice's low band down;
//   - the band from `lowBandHz` to `bandHz` has risen less than
//     `maxMidRiseDb` above its context (median over the run) — a burst is
//     confined to the high band, a consonant's release is not.
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
    double subBandHz = 1000.0;         // width of its sub-bands, Hz. Valid: [250, 4000]
    double lowBandHz = 1500.0;         // upper edge of the low band, Hz. Valid: [300, bandHz)
    double hopSeconds = 0.005;         // frame step. Valid: (0, 0.05]
    double windowSeconds = 0.01;       // frame length (next power of two of samples). Valid: [hop, 0.1]
    double gapSeconds = 0.025;         // context starts this far from the frame. Valid: (0, context)
    double contextSeconds = 0.08;      // and ends this far. Valid: (gap, 1]
    double minExcessDb = 16.0;         // median sub-band rise above the context, dB. Valid: > 0
    double maxSeconds = 0.06;          // longer runs are speech sounds, not bursts. Valid: > 0
    double belowSpeechDb = 20.0;       // high band quieter than speech level − this: ignored, dB. Valid: > 0
    double maxLowDipDb = 12.0;         // low band below its context by more: a consonant, dB. Valid: > 0
    double maxMidRiseDb = 15.0;        // mid band above its context by this or more: a consonant, dB. Valid: > 0
    void validate() const;             // throws ParamError("NoiseBurstParams.<field>")
};

// `pitch`: the take's YIN track (earmark/pitch/yin.hpp); frames beyond it are unvoiced.
std::vector<ArtefactEvent> findNoiseBursts(const Signal& signal, const PitchTrack& pitch, double speechLevelDb,
                                           const NoiseBurstParams& params = {}, Progress progress = {});

}  // namespace earmark
