// Pitch (F0) estimation with YIN: A. de Cheveigné and H. Kawahara, "YIN, a
// fundamental frequency estimator for speech and music", JASA 111(4), 2002.
//
// Steps (numbered as in the paper): (2) difference function, computed via FFT
// autocorrelation; (3) cumulative-mean-normalised difference; (4) absolute
// threshold; (5) parabolic interpolation; (6) best local estimate. Then
// Earmark's voicing decision (aperiodicity + energy gate) and a continuity
// step that removes isolated octave jumps and spurious short voiced runs.
//
// The signal is resampled to `analysisRateHz` first (libsoxr), so cost does
// not grow with the file's rate. Frames are centred: frame i at t = i·hop.
// Thread-safety: pure function; safe to call from several threads at once.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/pitch/pitch_track.hpp"

namespace earmark {

struct PitchParams {
    double minF0Hz = 60.0;          // lowest F0 searched; sets the longest lag
    double maxF0Hz = 500.0;         // highest F0 searched; sets the shortest lag
    double hopSeconds = 0.005;      // frame step
    double threshold = 0.15;        // YIN absolute threshold on the normalised difference
    double analysisRateHz = 16000;  // signal is resampled to this rate (>= 4·maxF0Hz)
    double voicingMaxAperiodicity = 0.35;  // frames above this are unvoiced
    double silenceGateDb = -50.0;   // frames quieter than (take's loud level + this) are unvoiced;
                                    // the loud level is the 95th percentile frame energy
    double absoluteFloorDb = -70.0; // frames below this RMS dBFS are always unvoiced
    bool continuity = true;         // remove isolated octave jumps and voiced blips
    double minVoicedSeconds = 0.03; // shorter voiced runs are removed by the continuity step

    // Throws ParamError naming the field ("PitchParams.minF0Hz", …).
    void validate() const;
};

PitchTrack analysePitch(const Signal& signal, const PitchParams& params = {}, Progress progress = {});

}  // namespace earmark
