// The two model lanes of a predicted mel spectrogram (model_mel.hpp):
//  - Predicted: the model's mel in the spectrogram lane's colours ("dusk")
//    and floor/range, in dB relative to the audio's own mel at its loudest
//    compared cell (ModelMel::audioPeakDb), so equal levels look alike;
//  - Difference: predicted − computed in dB, in the diverging "ember" map
//    (colour_map.hpp) on a symmetric scale ±ModelMel::scaleDb with a legend;
//    the brighter, the larger the difference of either sign.
// Both on the shared time axis (frame i at its time, by hop) and a band axis
// labelled at round frequencies. The engine's warnings are in the caption
// (the first, and how many more) and in the lane's tooltip.
#pragma once

#include "earmark/widgets/lane.hpp"
#include "earmark/widgets/model_mel.hpp"
#include "earmark/widgets/spectrogram_lane.hpp"

#include <QVector>

#include <optional>

namespace earmark::widgets {

enum class ModelMelPart { Predicted, Difference };

class ModelMelLane : public Lane {
    Q_OBJECT
public:
    // ids "predicted-mel" and "mel-difference".
    explicit ModelMelLane(ModelMelPart part, ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 200); }

    ModelMelPart part() const { return part_; }
    void setModelMel(ModelMelPtr mel);  // null: empty
    const ModelMelPtr& modelMel() const { return mel_; }
    // The predicted lane follows the spectrogram lane's floor and range.
    void setLook(const SpectrogramLook& look);

    // The value under a point: dB of the prediction (Predicted) or
    // predicted − computed in dB (Difference); empty outside the data.
    std::optional<double> valueAt(QPoint pos) const;
    QString describePoint(QPoint pos) const override;

    // Colour table of the difference image (indices relative to its peakDb).
    static QVector<QRgb> differenceColourTable(const SpectrogramView& view, double scaleDb);

protected:
    void drawContent(QPainter& painter) override;

private:
    const SpectrogramView* current() const;
    SpectrogramLook audioLook() const;  // look_ shifted to the prediction's image indices
    double yOfHz(const SpectrogramView& v, double hz) const;
    void drawLegend(QPainter& p, const QRect& plot) const;

    ModelMelPart part_;
    ModelMelPtr mel_;
    SpectrogramLook look_;
};

}  // namespace earmark::widgets
