// Small drawing helpers shared by lanes: time labels, vertical axes in the
// gutter, time grid lines.
#pragma once

#include "earmark/widgets/lane.hpp"

#include <QString>

#include <functional>
#include <vector>

class QPainter;

namespace earmark::widgets {

// "1.25 s", "12 s", "1:05", "1:05.250": as many decimals as the tick step needs.
QString formatTime(double seconds, double step);

struct AxisTick {
    double y = 0.0;  // widget coordinate
    QString label;
};

// Draws tick labels right-aligned against the plot's left edge, short tick
// marks, faint horizontal grid lines across the plot, and the unit rotated
// along the gutter's left edge.
void drawVerticalAxis(QPainter& painter, const Lane& lane, const std::vector<AxisTick>& ticks,
                      const QString& unit, bool gridLines = true);

// Faint vertical grid lines at the ruler's major ticks, so all lanes line up.
void drawTimeGrid(QPainter& painter, const Lane& lane);

// Major tick step for a mapping, with labels at least `minPixels` apart.
double majorTimeStep(const TimeMapping& mapping, double minPixels = 90.0);

}  // namespace earmark::widgets
