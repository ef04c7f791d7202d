// The overview strip: the whole take's waveform with the visible range drawn
// as a window. Drag inside the window to move it, drag its edges to resize it,
// click elsewhere to centre the view there, wheel to zoom about the pointer.
#pragma once

#include "earmark/widgets/lane.hpp"

namespace earmark::widgets {

class OverviewLane : public Lane {
    Q_OBJECT
public:
    explicit OverviewLane(ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 46); }
    TimeMapping mapping() const override;
    bool showsSelection() const override { return true; }
    bool followsVisibleRange() const override { return false; }

    // Which part of the window a point falls on.
    enum class Grip { None, Move, LeftEdge, RightEdge };
    Grip gripAt(double widgetX) const;

protected:
    void drawContent(QPainter& painter) override;
    void drawDecorations(QPainter& painter) override;
    void mousePressEvent(QMouseEvent* event) override;
    void mouseMoveEvent(QMouseEvent* event) override;
    void mouseReleaseEvent(QMouseEvent* event) override;
    void wheelEvent(QWheelEvent* event) override;

private:
    Grip grip_ = Grip::None;
    double grabTime_ = 0.0;
    TimeRange grabRange_;
};

}  // namespace earmark::widgets
