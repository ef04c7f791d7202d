#include "earmark/widgets/waveform_lane.hpp"

#include "earmark/widgets/axis_painting.hpp"

#include <QPainter>
#include <QPainterPath>

#include <cmath>

namespace earmark::widgets {

WaveformLane::WaveformLane(ViewState* view, QWidget* parent) : Lane("waveform", tr("Waveform"), view, parent) {}

QString WaveformLane::describePoint(QPoint pos) const {
    const QRect plot = plotRect();
    const double amp = 1.0 - 2.0 * (pos.y() - plot.top()) / std::max(1, plot.height());
    if (std::abs(amp) < 1e-6) return tr("amplitude 0");
    return tr("amplitude %1 (%2 dBFS)").arg(amp, 0, 'f', 3).arg(20.0 * std::log10(std::abs(amp)), 0, 'f', 1);
}

void WaveformLane::drawContent(QPainter& p) {
    const LaneColours c = colours();
    const QRect plot = plotRect();
    const double mid = plot.top() + plot.height() / 2.0;
    const double half = plot.height() / 2.0 - 2.0;
    auto yOf = [&](double v) { return mid - v * half; };

    std::vector<AxisTick> ticks;
    // Half-scale ticks only when there is room for five labels.
    const bool roomy = plot.height() >= 6 * fontMetrics().height();
    for (double v : {1.0, 0.5, 0.0, -0.5, -1.0})
        if (roomy || std::abs(v) != 0.5) ticks.push_back({yOf(v), QString::number(v, 'g', 2)});
    drawTimeGrid(p, *this);
    drawVerticalAxis(p, *this, ticks, tr("amplitude (FS)"));
    drawTitle(p, title());

    const auto& audio = take();
    if (!audio || audio->signal.empty()) return;
    const TimeMapping m = mapping();
    const double rate = audio->signal.sampleRate;
    const double samplesPerPixel = m.secondsPerPixel() * rate;
    const double startSample = m.range.start * rate;
    const auto& x = audio->signal.samples;

    p.setClipRect(plot);
    p.setRenderHint(QPainter::Antialiasing, samplesPerPixel < 2.0);
    p.setPen(QPen(c.grid, 1));
    p.drawLine(QPointF(plot.left(), mid), QPointF(plot.right(), mid));
    if (samplesPerPixel >= 2.0) {
        const int columns = plot.width();
        const auto env = audio->summary.envelope(x, startSample, samplesPerPixel, columns);
        // One vertical stroke per pixel column from its minimum to its maximum
        // (at least 1 px): much cheaper to rasterise than one spiky polygon.
        QVector<QLineF> strokes;
        strokes.reserve(columns);
        for (int i = 0; i < columns; ++i) {
            if (env[i].empty()) continue;
            const double x = plot.left() + i + 0.5;
            strokes.append(QLineF(x, std::min(yOf(env[i].max), mid - 0.5), x, std::max(yOf(env[i].min), mid + 0.5)));
        }
        p.setPen(QPen(c.waveform, 1.0, Qt::SolidLine, Qt::FlatCap));
        p.drawLines(strokes);
    } else {
        const auto first = static_cast<std::int64_t>(std::max(0.0, std::floor(startSample) - 1));
        const auto last = std::min<std::int64_t>(static_cast<std::int64_t>(x.size()) - 1,
                                                 static_cast<std::int64_t>(std::ceil(m.range.end * rate)) + 1);
        QPolygonF line;
        for (std::int64_t i = first; i <= last; ++i)
            line << QPointF(plot.left() + m.timeToX(i / rate), yOf(x[static_cast<std::size_t>(i)]));
        p.setPen(QPen(c.waveform, 1.5));
        p.drawPolyline(line);
        if (samplesPerPixel < 0.15) {
            p.setBrush(c.waveform);
            for (const QPointF& pt : line) p.drawEllipse(pt, 2.5, 2.5);
        }
    }
}

}  // namespace earmark::widgets
