// Drop-outs: the sound falls abruptly to near silence for less than
// `maxSeconds` inside speech and comes back abruptly (a lost buffer, a
// zeroed stretch). Stop closures are silent too but the voice fades into
// them over several milliseconds, and the sound after them is a new one
// (a release burst) rather than the voice going on; a drop-out is cut at
// both ends and the voice continues across it. Common
// practice, with Earmark's thresholds (calibrated on clean espeak-ng and
// festival takes; see docs/scan.md).
//
// The signal is cut into blocks of `blockSeconds`; a gap is a run of blocks
// whose RMS is more than `minDepthDb` below the speech level, lasting
// [`minSeconds`, `maxSeconds`]; it is a drop-out when the `edgeSeconds`
// just before and just after it are within `edgeBelowSpeechDb` of the speech
// level and the voice goes on across it: the pitch track has a voiced frame
// within `voicedSeconds` before its start or after its end, with F0 on the
// two sides within `maxF0StepSt` semitones where both are voiced. A side
// without a voiced frame counts only when its edge is within
// `unvoicedEdgeBelowSpeechDb` of the speech level: YIN's frames next to the
// gap reach into it and lose the voice, while the sound after a stop closure
// (a release, a weak onset) lies further down — 16–19 dB below the speech
// level for espeak-ng's closures of 41–53 ms of digital silence.
// `minSeconds` is calibrated on the clean takes of tests/engine/artefacts:
// espeak-ng renders some stop closures as 9–12 ms of digital silence between
// voiced sounds, cut as abruptly as a drop-out (8.9 false events per 5 min
// with a 4 ms floor, none with 13 ms or more); a lost buffer is longer.
//
// Result: drop-outs in time order; value = the gap's depth below the
// speech level, dB (its RMS against the speech level; floor −150 dBFS);
// span = the gap.
//
// Errors: ParamError naming the field; ParamError("Signal.sampleRate");
// ParamError("PitchTrack.hopSeconds") for a track without a positive hop.
// Thread-safety: pure function. Cost: O(n).
#pragma once

#include "earmark/artefacts/artefact_event.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/pitch/pitch_track.hpp"

#include <vector>

namespace earmark {

struct DropoutParams {
    double blockSeconds = 0.001;      // RMS block. Valid: (0, 0.01]
    double minDepthDb = 50.0;         // gap RMS below the speech level, dB. Valid: > 0
    double minSeconds = 0.015;        // shortest gap (espeak-ng's closures: 9–12 ms). Valid: > 0
    double maxSeconds = 0.1;          // longest gap (longer is a pause). Valid: > minSeconds
    double edgeSeconds = 0.003;       // stretch measured on each side. Valid: [blockSeconds, 0.05]
    double edgeBelowSpeechDb = 20.0;  // both sides within this of the speech level, dB. Valid: > 0
    double voicedSeconds = 0.03;      // voicing looked for this far outside the gap, s. Valid: [0, 0.1]
    double maxF0StepSt = 3.0;         // F0 across the gap may differ this much, semitones. Valid: > 0
    double unvoicedEdgeBelowSpeechDb = 10.0;  // a side without voicing must be this near the speech level, dB.
                                              // Valid: (0, edgeBelowSpeechDb]
    void validate() const;            // throws ParamError("DropoutParams.<field>")
};

// `pitch`: the take's YIN track (earmark/pitch/yin.hpp).
std::vector<ArtefactEvent> findDropouts(const Signal& signal, const PitchTrack& pitch, double speechLevelDb, const DropoutParams& params = {},
                                        Progress progress = {});

}  // namespace earmark
