#include "earmark/widgets/drift_lane.hpp"

#include "earmark/longform/long_take_review.hpp"

#include <QMouseEvent>
#include <QPainter>
#include <QPainterPath>

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

namespace {
constexpr double minPixels = 3.0;  // narrower findings (a seam) are widened to be seen and clicked

QString traceTitle(const std::string& measure) {
    if (measure == "speech_level_dbfs") return DriftLane::tr("level");
    if (measure == "f0_median_hz") return DriftLane::tr("F0 median");
    if (measure == "f0_range_st") return DriftLane::tr("F0 range");
    if (measure == "articulation_rate") return DriftLane::tr("rate");
    if (measure == "timbre_distance") return DriftLane::tr("timbre");
    return QString::fromStdString(measure);
}
}  // namespace

DriftLane::DriftLane(ViewState* view, QWidget* parent) : Lane("drift", tr("Drift"), view, parent) {
    setMinimumHeight(60);
}

void DriftLane::setReview(std::shared_ptr<const LongTakeReview> review, const QString& why) {
    review_ = std::move(review);
    traces_ = review_ ? driftTraces(review_->series) : std::vector<DriftTrace>{};
    why_ = why;
    invalidateContent();
}

QRectF DriftLane::rowRect(std::size_t row) const {
    const QRect plot = plotRect();
    const double h = (plot.height() - 2.0) / static_cast<double>(std::max<std::size_t>(1, traces_.size()));
    return QRectF(plot.left(), plot.top() + 1 + row * h, plot.width(), h);
}

int DriftLane::rowAt(double y) const {
    for (std::size_t r = 0; r < traces_.size(); ++r)
        if (rowRect(r).contains(QPointF(rowRect(r).left(), y))) return static_cast<int>(r);
    return -1;
}

int DriftLane::rowOf(const Finding& f) const {
    const std::string on = driftTraceOf(f.kind);
    for (std::size_t r = 0; r < traces_.size() && !on.empty(); ++r)
        if (traces_[r].measure == on) return static_cast<int>(r);
    return -1;
}

int DriftLane::findingAt(QPointF pos) const {
    if (!review_) return -1;
    const double x = pos.x();
    const int row = rowAt(pos.y());
    const TimeMapping m = mapping();
    const double left = plotRect().left();
    int best = -1;  // the shortest one there, so a seam inside a drift stays reachable
    for (std::size_t i = 0; i < review_->findings.size(); ++i) {
        const Finding& f = review_->findings[i];
        const double x0 = left + m.timeToX(f.startS);
        const double x1 = std::max(left + m.timeToX(f.endS), x0 + minPixels);
        const auto& b = best >= 0 ? review_->findings[static_cast<std::size_t>(best)] : f;
        const int on = rowOf(f);
        if (on >= 0 && on != row) continue;
        if (x >= x0 - 1 && x <= x1 + 1 && (best < 0 || f.endS - f.startS < b.endS - b.startS)) best = static_cast<int>(i);
    }
    return best;
}

QString DriftLane::describePoint(QPoint pos) const {
    if (const int i = findingAt(pos); i >= 0)
        return QString::fromStdString(review_->findings[static_cast<std::size_t>(i)].reason);
    const int row = rowAt(pos.y());
    if (row < 0) return {};
    const DriftTrace& t = traces_[static_cast<std::size_t>(row)];
    const double time = timeAtX(pos.x());
    // The window whose centre is nearest.
    std::size_t k = 0;
    for (std::size_t j = 1; j < t.timesS.size(); ++j)
        if (std::fabs(t.timesS[j] - time) < std::fabs(t.timesS[k] - time)) k = j;
    if (t.timesS.empty()) return {};
    const double halfWindow = review_ ? 0.5 * review_->series.windowSeconds : 0.0;
    const QString value = std::isfinite(t.values[k]) ? QString::number(t.values[k], 'f', 2) + " " + QString::fromStdString(t.unit)
                                                     : tr("not measured");
    return tr("%1 %2 (window %3–%4 s)")
        .arg(traceTitle(t.measure), value)
        .arg(t.timesS[k] - halfWindow, 0, 'f', 0)
        .arg(t.timesS[k] + halfWindow, 0, 'f', 0);
}

void DriftLane::drawContent(QPainter& p) {
    const LaneColours c = colours();
    const QRect plot = plotRect();
    p.setPen(c.faintText);
    if (!take()) return;
    if (traces_.empty() || traces_.front().timesS.empty()) {
        p.drawText(QRect(4, 0, gutterWidth - 10, height()), Qt::AlignRight | Qt::AlignVCenter, title());
        p.drawText(plot.adjusted(8, 0, 0, 0), Qt::AlignLeft | Qt::AlignVCenter,
                   why_.isEmpty() ? tr("no long-form measures") : why_);
        return;
    }
    const TimeMapping m = mapping();
    const bool dark = palette().color(QPalette::Window).lightnessF() < 0.5;
    const QColor hint = dark ? QColor(220, 200, 110) : QColor(150, 120, 20);
    QFont small = font();
    small.setPointSizeF(small.pointSizeF() * 0.8);
    p.setFont(small);
    const QFontMetrics fm(small);

    // Findings first, under the traces: a seam across every trace, the
    // others on the trace they were read on (a drift spans minutes).
    p.save();
    p.setClipRect(plot);
    for (const Finding& f : review_->findings) {
        if (f.endS < m.range.start || f.startS > m.range.end) continue;
        const double x0 = plot.left() + m.timeToX(f.startS);
        const double x1 = std::max(plot.left() + m.timeToX(f.endS), x0 + minPixels);
        const int on = rowOf(f);
        const QRectF rr = rowRect(static_cast<std::size_t>(std::max(0, on)));
        const QRectF band = on < 0 ? QRectF(x0, plot.top() + 1, x1 - x0, plot.height() - 2)
                                       : QRectF(x0, rr.top() + 1, x1 - x0, rr.height() - 2);
        p.setPen(QPen(hint, 1, Qt::DashLine));
        p.setBrush(QBrush(hint, Qt::BDiagPattern));
        p.drawRect(band);
        const QString name = QString::fromLatin1(findingName(f.kind));
        const double w = fm.horizontalAdvance(name) + 6;
        QRectF chip(x0 + 2, rr.top() + 1, w, fm.height());
        if (chip.right() > plot.right()) chip.moveRight(x0 - 2);
        p.setPen(Qt::NoPen);
        p.setBrush(c.background);
        p.drawRect(chip);
        p.setPen(c.text);
        p.drawText(chip, Qt::AlignCenter, name);
    }
    p.restore();

    for (std::size_t r = 0; r < traces_.size(); ++r) {
        const DriftTrace& t = traces_[r];
        const QRectF rr = rowRect(r);
        p.setPen(c.grid);
        if (r > 0) p.drawLine(QPointF(0, rr.top()), QPointF(plot.right(), rr.top()));
        // Gutter: the name; right end of the row: the range over the take.
        p.setPen(c.faintText);
        p.drawText(QRectF(2, rr.top(), gutterWidth - 6, rr.height()), Qt::AlignRight | Qt::AlignVCenter, traceTitle(t.measure));
        // Trace: broken where a window is not measured.
        const double span = t.high > t.low ? t.high - t.low : 1.0;
        auto yOf = [&](double v) { return rr.bottom() - 3 - (v - t.low) / span * (rr.height() - 6); };
        QPainterPath path;
        bool open = false;
        for (std::size_t k = 0; k < t.timesS.size(); ++k) {
            if (!std::isfinite(t.values[k])) {
                open = false;
                continue;
            }
            const QPointF pt(plot.left() + m.timeToX(t.timesS[k]), yOf(t.values[k]));
            if (open) path.lineTo(pt);
            else path.moveTo(pt);
            open = true;
        }
        p.save();
        p.setClipRect(QRectF(plot.left(), rr.top(), plot.width(), rr.height()));
        p.setPen(QPen(r % 2 ? c.energy : c.pitch, 1.4));
        p.setBrush(Qt::NoBrush);
        p.drawPath(path);
        p.restore();
        const QString range = t.high > t.low ? QStringLiteral("%1 … %2 %3")
                                                   .arg(t.low, 0, 'f', t.high - t.low < 10 ? 1 : 0)
                                                   .arg(t.high, 0, 'f', t.high - t.low < 10 ? 1 : 0)
                                                   .arg(QString::fromStdString(t.unit))
                                             : QString::fromStdString(t.unit);
        const double rw = fm.horizontalAdvance(range) + 6;
        const QRectF rangeBox(plot.right() - rw, rr.top() + 1, rw, fm.height());
        p.setPen(Qt::NoPen);
        p.setBrush(c.background);
        p.drawRect(rangeBox);
        p.setPen(c.faintText);
        p.drawText(rangeBox, Qt::AlignCenter, range);
    }
}

void DriftLane::mouseReleaseEvent(QMouseEvent* e) {
    Lane::mouseReleaseEvent(e);
    // A click on a finding selects its span (the base class just set the cursor).
    if (e->button() != Qt::LeftButton || !view() || view()->selection() || !review_) return;
    const int i = findingAt(e->position());
    if (i < 0) return;
    const Finding& f = review_->findings[static_cast<std::size_t>(i)];
    view()->setSelection(TimeRange{f.startS, f.endS});
    view()->setCursor(f.startS);
    emit findingClicked(i);
}

}  // namespace earmark::widgets
