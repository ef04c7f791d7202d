#include "earmark/widgets/spectrogram_painting.hpp"

#include <QPainter>

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

double bandOfHz(const std::vector<double>& c, double hz) {
    if (c.size() < 2) return 0.0;
    const auto it = std::lower_bound(c.begin(), c.end(), hz);
    if (it == c.begin()) return (hz - c[0]) / (c[1] - c[0]);
    if (it == c.end()) return c.size() - 1 + (hz - c.back()) / (c.back() - c[c.size() - 2]);
    const std::size_t i = static_cast<std::size_t>(it - c.begin());
    return i - 1 + (hz - c[i - 1]) / (c[i] - c[i - 1]);
}

double hzOfBand(const std::vector<double>& c, double band) {
    if (c.size() < 2) return 0.0;
    const double b = std::clamp(band, 0.0, static_cast<double>(c.size() - 1));
    const auto i = std::min(static_cast<std::size_t>(b), c.size() - 2);
    return c[i] + (b - i) * (c[i + 1] - c[i]);
}

void paintSpectrogramImage(QPainter& p, const SpectrogramView& v, const TimeMapping& m, const QRect& plot,
                           const QVector<QRgb>& table, double shown) {
    if (v.levels.empty() || !(v.data.hopSeconds > 0)) return;
    const double hop = v.data.hopSeconds;
    // Frame i covers [(i − ½)·hop, (i + ½)·hop) after the first frame's time:
    // image x = (t − t₀)/hop + ½.
    const double offset = v.data.frameTime(0);
    const double x0 = (m.range.start - offset) / hop + 0.5;
    const double x1 = (m.range.end - offset) / hop + 0.5;
    const double framesPerPixel = (x1 - x0) / std::max(1, plot.width());
    const int level = std::clamp(static_cast<int>(std::floor(std::log2(std::max(framesPerPixel, 1.0)))), 0,
                                 static_cast<int>(v.levels.size()) - 1);
    const QImage& source = v.levels[static_cast<std::size_t>(level)];
    const double scale = std::ldexp(1.0, -level);
    const double lx0 = x0 * scale, lx1 = x1 * scale;
    const int ix0 = std::clamp(static_cast<int>(std::floor(lx0)), 0, source.width());
    const int ix1 = std::clamp(static_cast<int>(std::ceil(lx1)), 0, source.width());
    const int rowTop = v.data.bins - static_cast<int>(std::ceil(shown));
    if (ix1 <= ix0) return;
    QImage part = source.copy(ix0, rowTop, ix1 - ix0, v.data.bins - rowTop);
    part.setColorTable(table);
    part = part.convertToFormat(QImage::Format_ARGB32_Premultiplied);  // the fast scaling path
    const double topFrac = std::ceil(shown) - shown;                    // partial top row
    const QRectF sourceRect(lx0 - ix0, topFrac, lx1 - lx0, shown);
    // Frames before the first or after the last leave the plot's background.
    p.save();
    p.setClipRect(plot);
    p.setRenderHint(QPainter::SmoothPixmapTransform, (lx1 - lx0) > plot.width());
    p.drawImage(QRectF(plot.left(), plot.top(), plot.width(), plot.height()), part, sourceRect);
    p.restore();
}

QString hzTickLabel(double hz) {
    return hz >= 1000 ? QString::number(hz / 1000.0, 'g', 3) + "k" : QString::number(hz, 'f', 0);
}

std::vector<AxisTick> bandAxisTicks(const std::vector<double>& centresHz, double topHz,
                                    const std::function<double(double)>& yOfHz, double minSpacingPx) {
    std::vector<AxisTick> ticks;
    if (centresHz.empty()) return ticks;
    double lastY = 1e9;
    for (double hz : {0.0, 100.0, 200.0, 300.0, 500.0, 700.0, 1000.0, 1500.0, 2000.0, 3000.0, 4000.0, 5000.0, 6000.0,
                      8000.0, 11000.0, 16000.0, 22000.0}) {
        if (hz < centresHz.front() * 0.999 || hz > topHz) continue;
        const double y = yOfHz(hz);
        if (lastY - y < minSpacingPx) continue;
        ticks.push_back({y, hzTickLabel(hz)});
        lastY = y;
    }
    return ticks;
}

QRect drawColourBar(QPainter& p, const QRect& plot, const std::array<std::uint32_t, 256>& map, int w) {
    const QRect bar(plot.right() - w - 8, plot.top() + 6, w, 8);
    for (int i = 0; i < w; ++i) {
        p.setPen(QColor::fromRgb(map[static_cast<std::size_t>(i * 255 / (w - 1))]));
        p.drawLine(bar.left() + i, bar.top(), bar.left() + i, bar.bottom());
    }
    p.setPen(QColor(255, 255, 255, 200));
    p.drawRect(bar.adjusted(0, 0, -1, -1));
    return bar;
}

void drawShadowedText(QPainter& p, const QRect& r, int align, const QString& text) {
    p.setPen(QColor(0, 0, 0, 160));
    p.drawText(r.translated(1, 1), align, text);
    p.setPen(Qt::white);
    p.drawText(r, align, text);
}

}  // namespace earmark::widgets
