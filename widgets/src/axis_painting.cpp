#include "earmark/widgets/axis_painting.hpp"

#include <QPainter>

#include <cmath>

namespace earmark::widgets {

QString formatTime(double seconds, double step) {
    const int decimals = step >= 1.0 ? 0 : std::min(6, static_cast<int>(std::ceil(-std::log10(step) - 1e-9)));
    if (std::abs(seconds) < 60.0 && step < 60.0)
        return QString::number(seconds, 'f', decimals) + QStringLiteral(" s");
    const double a = std::abs(seconds);
    const int minutes = static_cast<int>(a / 60.0);
    const double rest = a - minutes * 60.0;
    QString sec = QString::number(rest, 'f', decimals);
    if (rest < 10.0) sec.prepend('0');
    return QStringLiteral("%1%2:%3").arg(seconds < 0 ? "-" : "").arg(minutes).arg(sec);
}

double majorTimeStep(const TimeMapping& m, double minPixels) {
    return niceStep(minPixels * m.secondsPerPixel());
}

void drawVerticalAxis(QPainter& p, const Lane& lane, const std::vector<AxisTick>& ticks,
                      const QString& unit, bool gridLines) {
    const QRect plot = lane.plotRect();
    const LaneColours c = lane.colours();
    const QFontMetrics fm(lane.font());
    p.save();
    for (const AxisTick& t : ticks) {
        if (t.y < plot.top() - 1.5 || t.y > plot.bottom() + 1.5) continue;
        if (gridLines) {
            p.setPen(QPen(c.grid, 1));
            p.drawLine(QPointF(plot.left(), t.y), QPointF(plot.right(), t.y));
        }
        p.setPen(c.faintText);
        p.drawLine(QPointF(plot.left() - 4, t.y), QPointF(plot.left(), t.y));
        const double half = fm.height() / 2.0;
        double y = std::clamp(t.y - half, static_cast<double>(plot.top()), plot.bottom() - 2 * half);
        p.setPen(c.text);
        p.drawText(QRectF(18, y, plot.left() - 24, 2 * half), Qt::AlignRight | Qt::AlignVCenter, t.label);
    }
    if (!unit.isEmpty()) {
        p.setPen(c.faintText);
        p.translate(3, plot.center().y());
        p.rotate(-90);
        p.drawText(QRectF(-plot.height() / 2.0, 0, plot.height(), fm.height()), Qt::AlignCenter, unit);
    }
    p.restore();
}

void drawTimeGrid(QPainter& p, const Lane& lane) {
    const TimeMapping m = lane.mapping();
    if (!(m.range.span() > 0)) return;
    const QRect plot = lane.plotRect();
    const double step = majorTimeStep(m);
    p.save();
    p.setPen(QPen(lane.colours().grid, 1));
    for (double t = std::ceil(m.range.start / step) * step; t <= m.range.end; t += step) {
        const double x = plot.left() + m.timeToX(t);
        p.drawLine(QPointF(x, plot.top()), QPointF(x, plot.bottom()));
    }
    p.restore();
}

}  // namespace earmark::widgets
