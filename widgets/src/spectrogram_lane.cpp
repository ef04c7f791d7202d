#include "earmark/widgets/spectrogram_lane.hpp"

#include "earmark/widgets/axis_painting.hpp"
#include "earmark/widgets/colour_map.hpp"
#include "earmark/widgets/spectrogram_painting.hpp"

#include <QPainter>
#include <QPainterPath>

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

SpectrogramLane::SpectrogramLane(ViewState* view, QWidget* parent)
    : Lane("spectrogram", tr("Spectrogram"), view, parent) {}

void SpectrogramLane::setLook(const SpectrogramLook& look) {
    SpectrogramLook l = look;
    l.rangeDb = std::clamp(l.rangeDb, 10.0, 127.0);
    l.floorDb = std::clamp(l.floorDb, -127.0, -5.0);
    l.topHz = std::max(l.topHz, 500.0);
    if (l == look_) return;
    look_ = l;
    invalidateContent();
    emit lookChanged(look_);
}

QVector<QRgb> SpectrogramLane::colourTable(const SpectrogramLook& look) {
    const auto& map = duskColourMap();
    QVector<QRgb> table(256);
    for (int k = 0; k < 256; ++k) {
        const double rel = SpectrogramView::lowestRelativeDb + k * SpectrogramView::dbPerIndex;
        const double f = std::clamp((rel - look.floorDb) / look.rangeDb, 0.0, 1.0);
        table[k] = map[static_cast<std::size_t>(std::lround(f * 255.0))];
    }
    return table;
}

const SpectrogramView* SpectrogramLane::current() const {
    if (!tracks()) return nullptr;
    const auto& v = look_.kind == SpectrogramKind::Mel ? tracks()->mel : tracks()->linear;
    return v && !v->image.isNull() ? &*v : nullptr;
}

double SpectrogramLane::binOfHz(const SpectrogramView& v, double hz) const {
    const auto& c = v.data.binCentresHz;
    if (c.size() < 2) return 0.0;
    if (look_.kind == SpectrogramKind::Linear) return hz / (c[1] - c[0]);
    return bandOfHz(c, hz);  // mel bands are equally spaced on the mel scale
}

double SpectrogramLane::hzOfBin(const SpectrogramView& v, double bin) const {
    const auto& c = v.data.binCentresHz;
    if (c.size() < 2) return 0.0;
    if (look_.kind == SpectrogramKind::Linear) return bin * (c[1] - c[0]);
    return hzOfBand(c, bin);
}

double SpectrogramLane::shownBins(const SpectrogramView& v) const {
    if (look_.kind == SpectrogramKind::Mel) return v.data.bins;
    return std::min(static_cast<double>(v.data.bins), binOfHz(v, look_.topHz) + 0.5);
}

std::optional<double> SpectrogramLane::yOfHz(double hz) const {
    const SpectrogramView* v = current();
    if (!v) return std::nullopt;
    const QRect plot = plotRect();
    // Bin b occupies [b − 0.5, b + 0.5) in bin units; the plot spans [−0.5, shown − 0.5).
    const double shown = shownBins(*v);
    const double frac = (binOfHz(*v, hz) + 0.5) / shown;
    return plot.bottom() + 1 - frac * plot.height();
}

std::optional<double> SpectrogramLane::hzAtY(double y) const {
    const SpectrogramView* v = current();
    if (!v) return std::nullopt;
    const QRect plot = plotRect();
    const double frac = (plot.bottom() + 1 - y) / plot.height();
    return hzOfBin(*v, frac * shownBins(*v) - 0.5);
}

QString SpectrogramLane::describePoint(QPoint pos) const {
    const SpectrogramView* v = current();
    if (!v) return {};
    const auto hz = hzAtY(pos.y());
    if (!hz) return {};
    const double bin = std::round(binOfHz(*v, *hz));
    const auto level = v->relativeDbAt(timeAtX(pos.x()), static_cast<int>(bin));
    QString text = *hz >= 1000 ? tr("%1 kHz").arg(*hz / 1000.0, 0, 'f', 2) : tr("%1 Hz").arg(*hz, 0, 'f', 0);
    if (level) text += tr(", %1 dB re peak").arg(*level, 0, 'f', 1);
    return text;
}

void SpectrogramLane::drawContent(QPainter& p) {
    const LaneColours c = colours();
    const QRect plot = plotRect();
    const SpectrogramView* v = current();
    QString label = look_.kind == SpectrogramKind::Mel ? tr("Mel spectrogram") : tr("Spectrogram");
    if (v && look_.kind == SpectrogramKind::Mel) label += tr(" · %1 bands").arg(v->data.bins);
    if (v && look_.kind == SpectrogramKind::Linear) label += tr(" · %1-point FFT").arg(2 * (v->data.bins - 1));
    if (!v) {
        drawTitle(p, label);
        p.setPen(c.faintText);
        QString note;
        if (tracks() && look_.kind == SpectrogramKind::Mel && !tracks()->melProblem.isEmpty())
            note = tr("No mel spectrogram with these settings:\n%1").arg(tracks()->melProblem);
        else if (take() && !tracks())
            note = tr("analysing…");
        p.drawText(plot.adjusted(20, 0, -20, 0), Qt::AlignCenter | Qt::TextWordWrap, note);
        return;
    }
    const TimeMapping m = mapping();
    const double shown = shownBins(*v);
    paintSpectrogramImage(p, *v, m, plot, colourTable(look_), shown);

    if (look_.f0Overlay && tracks()->pitch) {
        const PitchTrack& pt = *tracks()->pitch;
        p.save();
        p.setClipRect(plot);
        p.setRenderHint(QPainter::Antialiasing);
        QPainterPath path;
        bool open = false;
        double lastX = -1e9;
        const auto first = static_cast<std::size_t>(std::max(0.0, std::floor(m.range.start / pt.hopSeconds) - 1));
        const auto last = std::min(pt.size(), static_cast<std::size_t>(m.range.end / pt.hopSeconds) + 2);
        for (std::size_t i = first; i < last; ++i) {
            if (!pt.voiced(i)) {
                open = false;
                continue;
            }
            const QPointF pos(plot.left() + m.timeToX(pt.timeSeconds(i)), *yOfHz(pt.f0Hz[i]));
            // Zoomed out, many frames share a pixel: one vertex per half pixel is enough.
            if (open && pos.x() - lastX < 0.5 && i + 1 < last && pt.voiced(i + 1)) continue;
            if (open) path.lineTo(pos);
            else path.moveTo(pos);
            open = true;
            lastX = pos.x();
        }
        p.setPen(QPen(QColor(0, 0, 0, 150), 4.0, Qt::SolidLine, Qt::RoundCap, Qt::RoundJoin));
        p.drawPath(path);
        p.setPen(QPen(QColor(120, 255, 240), 2.0, Qt::SolidLine, Qt::RoundCap, Qt::RoundJoin));
        p.drawPath(path);
        p.restore();
    }

    // Frequency axis: kHz ticks on a nice step (linear), chosen frequencies (mel).
    std::vector<AxisTick> ticks;
    const double topHz = hzOfBin(*v, shown - 0.5);
    if (look_.kind == SpectrogramKind::Linear) {
        const double step = niceStep(topHz * fontMetrics().height() * 2.2 / std::max(1, plot.height()));
        for (double hz = 0; hz <= topHz + 1e-6; hz += step) ticks.push_back({*yOfHz(hz), hzTickLabel(hz)});
    } else {
        ticks = bandAxisTicks(v->data.binCentresHz, topHz, [this](double hz) { return *yOfHz(hz); },
                              fontMetrics().height() * 1.6);
    }
    drawVerticalAxis(p, *this, ticks, tr("frequency (Hz)"), false);
    drawTitle(p, label);
    drawColourBar(p, plot);
}

void SpectrogramLane::drawColourBar(QPainter& p, const QRect& plot) const {
    // A small legend of the colour scale in the plot's top-right corner.
    const QRect bar = widgets::drawColourBar(p, plot, duskColourMap(), 90);
    QFont f = font();
    f.setPointSizeF(f.pointSizeF() * 0.85);
    p.setFont(f);
    const QString text = tr("%1 … %2 dB").arg(look_.floorDb, 0, 'f', 0).arg(look_.floorDb + look_.rangeDb, 0, 'f', 0);
    drawShadowedText(p, QRect(bar.left() - 120, bar.bottom() + 2, bar.width() + 120, QFontMetrics(f).height()),
                     Qt::AlignRight, text);
    p.setFont(font());
}

}  // namespace earmark::widgets
