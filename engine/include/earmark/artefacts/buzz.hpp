// Buzzy or metallic stretches: speech-level sound whose periodicity has
// collapsed — the harmonics smeared into noise while the spectral envelope
// (and so the loudness) of a vowel remains. Measured with YIN's aperiodicity
// (de Cheveigné & Kawahara, JASA 111(4), 2002, pp. 1917–1930: the
// cumulative-mean-normalised difference at the chosen lag, ≈ 0 periodic,
// ≈ 1 noise; the inverse of a harmonics-to-noise ratio).
//
// A frame is buzzy when (1) its energy is within `maxBelowSpeechDb` of the
// speech level, (2) its aperiodicity is at least `minAperiodicity` — or at
// least `unvoicedMinAperiodicity` where the track calls the frame unvoiced
// (noise under a vowel's narrow formants looks periodic for a frame now and
// then; the track's voicing decision, made over the whole take, follows the
// frames around it) — and (3)
// its spectrum is shaped like a vowel rather than a fricative: at least
// `minLowShare` of its energy below `lowHz` (fricatives put theirs above
// 2–4 kHz; phonetics textbooks, common practice). A run of buzzy frames
// lasting at least `minSeconds` (holes of one frame bridged) is one stretch.
//
// `pitch` is the take's YIN track (earmark/pitch/yin.hpp) on the same hop
// as `hopSeconds` would give; frames beyond it count as periodic.
// Result: stretches in time order; value = the stretch's length, s; span =
// the run's frames (centre ± half a hop).
//
// Errors: ParamError naming the field; ParamError("Signal.sampleRate");
// ParamError("PitchTrack.hopSeconds") for a track without a positive hop.
// Thread-safety: pure function.
#pragma once

#include "earmark/artefacts/artefact_event.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/pitch/pitch_track.hpp"

#include <vector>

namespace earmark {

struct BuzzParams {
    double minAperiodicity = 0.35;   // YIN d′ at or above this: no periodicity. Valid: (0, 2]
    double unvoicedMinAperiodicity = 0.25;  // the same for frames the track calls unvoiced.
                                            // Valid: (0, minAperiodicity]
    double maxBelowSpeechDb = 14.0;  // frame energy within this of the speech level, dB. Valid: > 0
    double lowHz = 1500.0;           // upper edge of the "vowel" band, Hz. Valid: [200, 8000]
    double minLowShare = 0.6;        // share of the frame's energy below lowHz. Valid: (0, 1]
    double minSeconds = 0.07;        // shortest stretch. Valid: > 0
    void validate() const;           // throws ParamError("BuzzParams.<field>")
};

std::vector<ArtefactEvent> findBuzz(const Signal& signal, const PitchTrack& pitch, double speechLevelDb,
                                    const BuzzParams& params = {}, Progress progress = {});

}  // namespace earmark
