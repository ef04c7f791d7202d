// A model's predicted mel spectrogram next to the take's audio, ready for
// the window's two model lanes: the prediction in dB and its difference from
// Earmark's own mel of the audio (predicted − computed, dB), both computed by
// the engine (model/predicted_mel.hpp, model/mel_difference.hpp) off the UI
// thread. Frames are matched by time (by hop), as mel_difference.hpp says.
//
// Thread-safety: loadModelMel is reentrant (model_loader.hpp runs it in the
// background).
#pragma once

#include "earmark/widgets/take_data.hpp"

#include <QStringList>

#include <memory>

namespace earmark::widgets {

struct ModelMel {
    QString path;                // the .npy read
    SpectrogramView predicted;   // the prediction, dB (20·log10 magnitude / 10·log10 power)
    SpectrogramView difference;  // predicted − computed, dB, on the compared predicted frames
    // The highest level of the audio's own mel on the compared cells
    // (predicted − difference), dB: the predicted lane is drawn relative to
    // it, so both mels share one colour scale.
    double audioPeakDb = 0.0;
    double scaleDb = 10.0;       // the difference lane's colour scale runs −scaleDb … +scaleDb
    double meanAbsDb = 0.0, maxAbsDb = 0.0;
    double maxTimeS = 0.0, maxHz = 0.0;  // where |difference| is largest
    int regions = 0;             // regions at or beyond 6 dB (MelDifferenceParams)
    QStringList warnings;        // the engine's, to be read with the figures
};
using ModelMelPtr = std::shared_ptr<const ModelMel>;

// The colour scale for a largest |difference|: rounded up to a multiple of
// 5 dB (less than 0.05 dB over one stays on it), 5 … 40 dB.
double differenceScaleDb(double maxAbsDb);

// Reads `npyPath` (sidecar "<file>.npy.json" when present) and diffs it
// against `audio`. Throws what readPredictedMel and diffPredictedMel throw.
ModelMelPtr loadModelMel(const QString& npyPath, const TakeAudio& audio);

}  // namespace earmark::widgets

Q_DECLARE_METATYPE(earmark::widgets::ModelMelPtr)
