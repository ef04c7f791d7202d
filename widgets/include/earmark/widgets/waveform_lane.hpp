// The waveform lane: the min/max envelope per pixel column when zoomed out
// (read from the take's precomputed multi-resolution summary, so the cost of a
// repaint depends on the lane's width, not on the take's length), the samples
// themselves as a line when zoomed in, and dots on each sample when zoomed in
// further. Amplitude axis in full scale (FS = 1.0).
#pragma once

#include "earmark/widgets/lane.hpp"

namespace earmark::widgets {

class WaveformLane : public Lane {
    Q_OBJECT
public:
    explicit WaveformLane(ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 140); }
    QString describePoint(QPoint pos) const override;

protected:
    void drawContent(QPainter& painter) override;
};

}  // namespace earmark::widgets
