// The spectrogram lane: linear-frequency or mel spectrogram of the take in dB
// relative to the take's loudest bin, drawn with Earmark's "dusk" colour map
// (see colour_map.hpp). The colour scale runs from `floorDb` (darkest) to
// floorDb + rangeDb (brightest); changing it only rebuilds a 256-entry colour
// table. Optional F0 overlay drawn on the lane's frequency axis.
#pragma once

#include "earmark/widgets/lane.hpp"

#include <QVector>

namespace earmark::widgets {

enum class SpectrogramKind { Linear, Mel };

struct SpectrogramLook {
    SpectrogramKind kind = SpectrogramKind::Linear;
    double floorDb = -70.0;   // dB re the take's peak: at and below → darkest colour
    double rangeDb = 70.0;    // dB from darkest to brightest
    double topHz = 8000.0;    // linear kind: highest frequency shown (cut to Nyquist)
    bool f0Overlay = false;   // off by default: on a 0–8 kHz axis F0 hugs the bottom edge
    bool operator==(const SpectrogramLook&) const = default;
};

class SpectrogramLane : public Lane {
    Q_OBJECT
public:
    explicit SpectrogramLane(ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 300); }

    const SpectrogramLook& look() const { return look_; }
    void setLook(const SpectrogramLook& look);
    QString describePoint(QPoint pos) const override;

    // Colour table for an Indexed8 spectrogram image under a look.
    static QVector<QRgb> colourTable(const SpectrogramLook& look);

    // y (widget) of a frequency, and the frequency at a y; empty without data.
    std::optional<double> yOfHz(double hz) const;
    std::optional<double> hzAtY(double y) const;

signals:
    void lookChanged(const earmark::widgets::SpectrogramLook& look);

protected:
    void drawContent(QPainter& painter) override;

private:
    const SpectrogramView* current() const;
    // Fractional bin index (0 = lowest) ↔ frequency on the current data.
    double binOfHz(const SpectrogramView& v, double hz) const;
    double hzOfBin(const SpectrogramView& v, double bin) const;
    // Bins shown: [0, shownBins) — the linear kind stops at topHz.
    double shownBins(const SpectrogramView& v) const;
    void drawColourBar(QPainter& p, const QRect& plot) const;

    SpectrogramLook look_;
};

}  // namespace earmark::widgets
