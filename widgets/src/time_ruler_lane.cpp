#include "earmark/widgets/time_ruler_lane.hpp"

#include "earmark/widgets/axis_painting.hpp"

#include <QPainter>

#include <cmath>

namespace earmark::widgets {

TimeRulerLane::TimeRulerLane(ViewState* view, QWidget* parent) : Lane("ruler", tr("Time"), view, parent) {
    setFixedHeight(sizeHint().height());
}

QSize TimeRulerLane::sizeHint() const { return QSize(400, fontMetrics().height() + 14); }

void TimeRulerLane::drawContent(QPainter& p) {
    const LaneColours c = colours();
    const QRect plot = plotRect();
    p.fillRect(rect(), palette().color(QPalette::Window));
    p.setPen(c.faintText);
    p.drawText(QRect(6, 0, gutterWidth - 12, height()), Qt::AlignVCenter | Qt::AlignLeft, tr("time"));
    const TimeMapping m = mapping();
    if (!(m.range.span() > 0)) return;
    const double step = majorTimeStep(m);
    const double minor = step / 5.0;
    p.setClipRect(plot.adjusted(-40, 0, rightMargin, 0));
    p.setPen(c.faintText);
    for (double t = std::ceil(m.range.start / minor) * minor; t <= m.range.end; t += minor) {
        const double x = plot.left() + m.timeToX(t);
        p.drawLine(QPointF(x, height() - 4), QPointF(x, height()));
    }
    const QFontMetrics fm(font());
    for (double t = std::ceil(m.range.start / step) * step; t <= m.range.end + 1e-12; t += step) {
        const double x = plot.left() + m.timeToX(t);
        p.setPen(c.faintText);
        p.drawLine(QPointF(x, height() - 9), QPointF(x, height()));
        const QString label = formatTime(std::abs(t) < 1e-9 ? 0.0 : t, step);
        const double w = fm.horizontalAdvance(label);
        double left = std::clamp(x - w / 2, static_cast<double>(plot.left() - 30), plot.right() + rightMargin - w);
        p.setPen(c.text);
        p.drawText(QPointF(left, fm.ascent() + 2), label);
    }
    p.setClipping(false);
    p.setPen(c.grid);
    p.drawLine(0, height() - 1, width(), height() - 1);
}

}  // namespace earmark::widgets
