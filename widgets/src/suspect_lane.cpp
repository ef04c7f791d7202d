#include "earmark/widgets/suspect_lane.hpp"

#include <QHelpEvent>
#include <QMouseEvent>
#include <QPainter>
#include <QToolTip>

#include <algorithm>
#include <cmath>
#include <vector>

namespace earmark::widgets {

namespace {
// Suspect spans shorter than this many pixels are widened so they can be seen and hovered.
constexpr double minPixels = 4.0;
}

SuspectLane::SuspectLane(ViewState* view, QWidget* parent) : SpanLane("suspects", tr("Suspects"), view, parent) {
    setHint(tr("no suspects from the scan"));
    setMinimumHeight(20);
}

void SuspectLane::setSuspects(std::vector<Suspect> suspects) {
    suspects_ = std::move(suspects);
    invalidateContent();
}

const Suspect* SuspectLane::suspectAt(double x) const {
    const Suspect* best = nullptr;  // the shortest one there, so one inside another stays reachable
    for (const Suspect& s : suspects_) {
        const double x0 = xOf(s.startSeconds);
        const double x1 = std::max(xOf(s.endSeconds), x0 + minPixels);
        if (x >= x0 - 1 && x <= x1 + 1 && (!best || s.endSeconds - s.startSeconds < best->endSeconds - best->startSeconds))
            best = &s;
    }
    return best;
}

const Suspect* SuspectLane::suspectFor(const std::optional<TimeRange>& selection, double cursor) const {
    constexpr double sameSeconds = 0.001;
    const Suspect* best = nullptr;
    for (const Suspect& s : suspects_) {
        if (selection && std::fabs(selection->start - s.startSeconds) <= sameSeconds &&
            std::fabs(selection->end - s.endSeconds) <= sameSeconds)
            return &s;
        if (cursor >= s.startSeconds && cursor <= s.endSeconds &&
            (!best || s.endSeconds - s.startSeconds < best->endSeconds - best->startSeconds))
            best = &s;
    }
    return best;
}

QString SuspectLane::describePoint(QPoint pos) const {
    const Suspect* s = suspectAt(pos.x());
    return s ? tr("suspect %1: %2").arg(QString::fromStdString(s->name), QString::fromStdString(s->reason)) : QString();
}

void SuspectLane::drawContent(QPainter& p) {
    if (!drawFrame(p, !suspects_.empty())) return;
    const LaneColours c = colours();
    const QRect plot = plotRect();
    const TimeMapping m = mapping();
    p.setClipRect(plot);
    const bool dark = palette().color(QPalette::Window).lightnessF() < 0.5;
    const QColor hint = dark ? QColor(220, 200, 110) : QColor(150, 120, 20);
    // Overlapping suspects go on separate rows (first free row, in time order).
    std::vector<const Suspect*> order;
    for (const Suspect& s : suspects_) order.push_back(&s);
    std::stable_sort(order.begin(), order.end(), [](const Suspect* a, const Suspect* b) { return a->startSeconds < b->startSeconds; });
    std::vector<double> rowEnds;  // x where each row is free again
    std::vector<std::pair<const Suspect*, int>> placed;
    for (const Suspect* s : order) {
        const double x0 = plot.left() + m.timeToX(s->startSeconds);
        const double x1 = std::max(plot.left() + m.timeToX(s->endSeconds), x0 + minPixels);
        std::size_t row = 0;
        while (row < rowEnds.size() && rowEnds[row] > x0 + 0.5) ++row;
        if (row == rowEnds.size()) rowEnds.push_back(x1);
        else rowEnds[row] = x1;
        placed.emplace_back(s, static_cast<int>(row));
    }
    const double rowHeight = (plot.height() - 4.0) / std::max<std::size_t>(1, rowEnds.size());
    QFont small = font();
    if (rowEnds.size() > 1) small.setPointSizeF(small.pointSizeF() * 0.85);
    p.setFont(small);
    const QFontMetrics fm(small);
    for (const auto& [s, row] : placed) {
        if (s->endSeconds < m.range.start || s->startSeconds > m.range.end) continue;
        const double x0 = plot.left() + m.timeToX(s->startSeconds);
        const double x1 = std::max(plot.left() + m.timeToX(s->endSeconds), x0 + minPixels);
        const QRectF r(x0, plot.top() + 2 + row * rowHeight + 1, x1 - x0, rowHeight - 2);
        p.setBrush(QBrush(hint, Qt::BDiagPattern));
        p.setPen(QPen(hint, 1, Qt::DashLine));
        p.drawRect(r);
        const int room = static_cast<int>(r.width()) - 6;
        if (room > fm.averageCharWidth() * 3 && r.height() >= fm.height() - 4) {
            p.setPen(c.text);
            p.drawText(r.adjusted(3, 0, -3, 0), Qt::AlignLeft | Qt::AlignVCenter,
                       fm.elidedText(QString::fromStdString(s->name), Qt::ElideRight, room));
        }
    }
}

bool SuspectLane::event(QEvent* e) {
    if (e->type() == QEvent::ToolTip) {
        auto* help = static_cast<QHelpEvent*>(e);
        if (const Suspect* s = suspectAt(help->pos().x()))
            QToolTip::showText(help->globalPos(),
                               QStringLiteral("<b>%1</b> = %2 (limit %3)<br>%4")
                                   .arg(QString::fromStdString(s->name).toHtmlEscaped())
                                   .arg(s->value, 0, 'g', 4)
                                   .arg(s->threshold, 0, 'g', 4)
                                   .arg(QString::fromStdString(s->reason).toHtmlEscaped()),
                               this);
        else
            QToolTip::hideText();
        return true;
    }
    return SpanLane::event(e);
}

void SuspectLane::mouseReleaseEvent(QMouseEvent* e) {
    SpanLane::mouseReleaseEvent(e);
    // A click on a suspect selects its span (the base class just set the cursor).
    if (e->button() != Qt::LeftButton || !view() || view()->selection()) return;
    if (const Suspect* s = suspectAt(e->position().x())) {
        if (s->endSeconds > s->startSeconds) view()->setSelection(TimeRange{s->startSeconds, s->endSeconds});
        view()->setCursor(s->startSeconds);
    }
}

}  // namespace earmark::widgets
