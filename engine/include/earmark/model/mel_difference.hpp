// How far a model's predicted mel spectrogram is from Earmark's mel of the
// audio: predicted minus computed, cell by cell, in decibels, on the
// predicted frames — as a Spectrogram a lane can draw — plus summary figures
// and the regions where the two differ most.
//
// Units: both sides are converted to dB of the mel band's level:
// 20·log10 of a magnitude mel, 10·log10 of a power mel (ln values × 20/ln 10
// or × 10/ln 10). Both are floored at the higher of their two floors, so
// silence does not show as a difference of floors.
//
// Frames are matched by time: each predicted frame takes the computed frame
// whose time (spectrogram.hpp: i·hop, or its timesSeconds) is nearest;
// predicted frames farther than half a computed hop beyond the computed
// frames are not compared. With equal settings frame i meets frame i.
//
// Settings that cannot match are reported in `warnings`, never silently
// bridged: band frequencies (fmin, fmax, scale, normalisation), magnitude
// against power (the filterbank sums |X| or |X|², no conversion after the
// fact), hop and frame alignment (frames matched by nearest time), rate,
// FFT and window length, and lengths that differ by more than one frame.
// Different band counts cannot be compared band by band: an InputError.
//
// Pure functions; reentrant.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/model/predicted_mel.hpp"

#include <string>
#include <vector>

namespace earmark {

struct MelDifferenceParams {
    // Cells at least this far apart (either sign) make up the regions
    // reported; 6 dB (a factor of 2 in magnitude) is common practice for an
    // audible local change. > 0.
    double regionThresholdDb = 6.0;
    int minRegionCells = 4;  // smaller regions are not reported, >= 1
    int maxRegions = 10;     // the largest (by summed |difference|) kept, >= 0
    // Throws ParamError("MelDifferenceParams.<field>").
    void validate() const;
};

// A connected patch (frames and bands sharing an edge) of cells at or
// beyond the threshold, all of one sign.
struct MelDifferenceRegion {
    int firstFrame = 0, lastFrame = 0;  // predicted frames, inclusive
    int firstBand = 0, lastBand = 0;    // inclusive
    double startS = 0.0, endS = 0.0;    // first frame's time, last frame's time + hop
    double lowHz = 0.0, highHz = 0.0;   // centre frequencies of the first and last band
    int cells = 0;
    double meanDb = 0.0;  // mean difference over its cells (signed)
    double peakDb = 0.0;  // the largest in size (signed)
};

struct MelDifference {
    // predicted − computed in dB, frames × bands (log = Decibel), on the
    // predicted frames firstFrame … firstFrame + comparedFrames − 1, with
    // their times (timesSeconds filled unless they are i·hop from 0).
    Spectrogram difference;
    int predictedFrames = 0, computedFrames = 0;
    int firstFrame = 0, comparedFrames = 0;
    double meanDb = 0.0;     // mean (signed)
    double meanAbsDb = 0.0;  // mean of |difference|
    double rmsDb = 0.0;
    double maxAbsDb = 0.0;                     // largest |difference| …
    int maxFrame = 0, maxBand = 0;             // … and where (predicted frame index)
    std::vector<float> frameMeanAbsDb;         // per compared frame
    std::vector<float> bandMeanAbsDb;          // per band
    std::vector<MelDifferenceRegion> regions;  // largest first
    // Everything the figures should be read with: settings that were
    // assumed, options that overrode the sidecar, implausible values
    // (predicted.warnings), then the mismatches found here.
    std::vector<std::string> warnings;
};

// `computed` is a mel of the same audio with `computedSettings` (log as in
// its `log`/`kind`: Natural, Decibel or None). Throws InputError("mel
// difference", …) when the band counts differ or no frame can be matched,
// ParamError for invalid params.
MelDifference compareMels(const PredictedMel& predicted, const Spectrogram& computed,
                          const MelSettings& computedSettings, const MelDifferenceParams& params = {});

// Computes Earmark's mel of `audio` with the predicted's own settings
// (resampled to its rate when needed), then compareMels. Warns when the
// audio's rate is too low for the mel's top band. Throws as compareMels and
// computeMelSpectrogram; InputError("audio", …) for empty audio; Cancelled.
MelDifference diffPredictedMel(const PredictedMel& predicted, const Signal& audio,
                               const MelDifferenceParams& params = {}, Progress progress = {});

}  // namespace earmark
