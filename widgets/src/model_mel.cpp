#include "earmark/widgets/model_mel.hpp"

#include "earmark/core/error.hpp"
#include "earmark/model/mel_difference.hpp"
#include "earmark/model/predicted_mel.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace earmark::widgets {

namespace {

// The prediction's values in dB: a change of unit only (the engine converts
// the same way before it diffs).
Spectrogram inDecibels(Spectrogram s) {
    const double factor = s.kind == SpectrumKind::Magnitude ? 20.0 : 10.0;
    for (float& v : s.values) {
        switch (s.log) {
        case LogScale::Natural: v = static_cast<float>(v * factor / std::numbers::ln10); break;
        case LogScale::None: v = static_cast<float>(factor * std::log10(std::max(static_cast<double>(v), 1e-10))); break;
        case LogScale::Decibel: break;
        }
    }
    s.log = LogScale::Decibel;
    return s;
}

}  // namespace

double differenceScaleDb(double maxAbsDb) {
    if (!std::isfinite(maxAbsDb)) return 40.0;
    // A hair over a step (10.02 dB) stays on it: those cells just saturate.
    return std::clamp(5.0 * std::ceil(maxAbsDb / 5.0 - 0.01), 5.0, 40.0);
}

ModelMelPtr loadModelMel(const QString& npyPath, const TakeAudio& audio) {
    const PredictedMel predicted = readPredictedMel(npyPath.toStdString());
    const MelDifference d = diffPredictedMel(predicted, audio.signal);
    auto out = std::make_shared<ModelMel>();
    out->path = npyPath;
    out->predicted = SpectrogramView::make(inDecibels(predicted.mel));
    const Spectrogram& db = out->predicted.data;
    out->audioPeakDb = out->predicted.peakDb;
    double audioPeak = -1e300;
    for (int i = 0; i < d.comparedFrames; ++i)
        for (int b = 0; b < db.bins && b < d.difference.bins; ++b)
            audioPeak = std::max(audioPeak, static_cast<double>(db.at(d.firstFrame + i, b) - d.difference.at(i, b)));
    if (audioPeak > -1e299) out->audioPeakDb = audioPeak;
    out->scaleDb = differenceScaleDb(d.maxAbsDb);
    out->meanAbsDb = d.meanAbsDb;
    out->maxAbsDb = d.maxAbsDb;
    out->maxTimeS = predicted.mel.frameTime(std::clamp(d.maxFrame, 0, std::max(0, predicted.mel.frames - 1)));
    if (d.maxBand >= 0 && d.maxBand < static_cast<int>(predicted.mel.binCentresHz.size()))
        out->maxHz = predicted.mel.binCentresHz[static_cast<std::size_t>(d.maxBand)];
    out->regions = static_cast<int>(d.regions.size());
    for (const auto& w : d.warnings) out->warnings << QString::fromStdString(w);
    out->difference = SpectrogramView::make(d.difference);
    return out;
}

}  // namespace earmark::widgets
