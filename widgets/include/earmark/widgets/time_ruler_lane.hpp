// The time axis of the stack: major ticks with labels in seconds (or m:ss for
// long takes) and minor ticks, over the visible range.
#pragma once

#include "earmark/widgets/lane.hpp"

namespace earmark::widgets {

class TimeRulerLane : public Lane {
    Q_OBJECT
public:
    explicit TimeRulerLane(ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override;

protected:
    void drawContent(QPainter& painter) override;
};

}  // namespace earmark::widgets
