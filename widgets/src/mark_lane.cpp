#include "earmark/widgets/mark_lane.hpp"

#include <QMouseEvent>
#include <QPainter>

#include <cmath>

namespace earmark::widgets {

namespace {
constexpr double grabPixels = 4.0;
constexpr double minMarkSeconds = 0.01;

QString qs(std::string_view s) { return QString::fromUtf8(s.data(), static_cast<qsizetype>(s.size())); }
}  // namespace

QColor categoryColour(MarkCategory c) {
    switch (c) {
    case MarkCategory::Emphasis: return QColor(150, 80, 200);
    case MarkCategory::Intonation: return QColor(226, 120, 30);
    case MarkCategory::Timing: return QColor(20, 150, 150);
    case MarkCategory::Pronunciation: return QColor(50, 110, 210);
    case MarkCategory::Artifact: return QColor(210, 50, 60);
    case MarkCategory::Other: break;
    }
    return QColor(120, 120, 120);
}

QString categoryLabel(MarkCategory c) { return qs(categoryName(c)); }
QString severityLabel(Severity s) { return qs(severityName(s)); }

MarkLane::MarkLane(ViewState* view, QWidget* parent) : SpanLane("marks", tr("Marks"), view, parent) {
    setHint(tr("no marks: select a span or a word, then press N"));
    setMinimumHeight(24);
}

void MarkLane::setMarks(std::vector<Mark> marks) {
    marks_ = std::move(marks);
    if (selected_ && std::none_of(marks_.begin(), marks_.end(), [&](const Mark& m) { return m.id == *selected_; }))
        selected_.reset();
    invalidateContent();
}

void MarkLane::setSelectedMark(std::optional<MarkId> id) {
    if (id == selected_) return;
    selected_ = id;
    invalidateContent();
}

void MarkLane::drawContent(QPainter& p) {
    if (!drawFrame(p, !marks_.empty() || drag_)) return;
    const LaneColours c = colours();
    const QRect plot = plotRect();
    const TimeMapping m = mapping();
    p.setClipRect(plot);
    p.setRenderHint(QPainter::Antialiasing);
    const QFontMetrics fm = fontMetrics();
    for (const Mark& mk : marks_) {
        double s = mk.startSeconds, e = mk.endSeconds;
        if (drag_ && drag_->id == mk.id) {
            s = drag_->start;
            e = drag_->end;
        }
        if (e < m.range.start || s > m.range.end) continue;
        const double x0 = plot.left() + m.timeToX(s), x1 = plot.left() + m.timeToX(e);
        const QRectF r(x0, plot.top() + 3, std::max(x1 - x0, 2.0), plot.height() - 6);
        QColor fill = categoryColour(mk.category);
        // Severity as strength of fill: a blocker is solid, a minor mark light.
        fill.setAlpha(mk.severity == Severity::Blocker ? 230 : mk.severity == Severity::Major ? 170 : 110);
        const bool chosen = selected_ && *selected_ == mk.id;
        p.setBrush(fill);
        p.setPen(QPen(chosen ? c.text : categoryColour(mk.category).darker(130), chosen ? 2.0 : 1.0));
        p.drawRoundedRect(r, 3, 3);
        const QString label = mk.subtype.empty() ? categoryLabel(mk.category)
                                                 : categoryLabel(mk.category) + " · " + QString::fromStdString(mk.subtype);
        const int room = static_cast<int>(r.width()) - 6;
        if (room > fm.averageCharWidth() * 2) {
            p.setPen(mk.severity == Severity::Minor ? c.text : QColor(Qt::white));
            p.drawText(r.adjusted(3, 0, -3, 0), Qt::AlignLeft | Qt::AlignVCenter, fm.elidedText(label, Qt::ElideRight, room));
        }
    }
}

QString MarkLane::describePoint(QPoint pos) const {
    const Mark* mk = markAt(pos.x());
    if (!mk) return {};
    return tr("%1 %2 mark %3–%4 s%5")
        .arg(severityLabel(mk->severity), categoryLabel(mk->category))
        .arg(mk->startSeconds, 0, 'f', 3)
        .arg(mk->endSeconds, 0, 'f', 3)
        .arg(mk->note.empty() ? QString() : ": " + QString::fromStdString(mk->note));
}

const Mark* MarkLane::markAt(double x) const {
    const Mark* best = nullptr;
    for (const Mark& mk : marks_)
        if (x >= xOf(mk.startSeconds) - 1 && x <= xOf(mk.endSeconds) + 1)
            if (!best || mk.endSeconds - mk.startSeconds < best->endSeconds - best->startSeconds) best = &mk;
    return best;  // the shortest one, so a mark inside another stays reachable
}

std::optional<MarkLane::EdgeDrag> MarkLane::edgeNear(double x) const {
    // The selected mark's edges first, then any mark's.
    std::optional<EdgeDrag> found;
    double bestDist = grabPixels + 1;
    for (const Mark& mk : marks_) {
        for (bool startEdge : {true, false}) {
            const double d = std::abs(xOf(startEdge ? mk.startSeconds : mk.endSeconds) - x) -
                             (selected_ && *selected_ == mk.id ? 0.5 : 0.0);
            if (d <= grabPixels && d < bestDist) {
                bestDist = d;
                found = EdgeDrag{mk.id, startEdge, mk.startSeconds, mk.endSeconds};
            }
        }
    }
    return found;
}

void MarkLane::mousePressEvent(QMouseEvent* e) {
    if (e->button() != Qt::LeftButton || !take() || (e->modifiers() & Qt::ShiftModifier)) {
        SpanLane::mousePressEvent(e);
        return;
    }
    const double x = e->position().x();
    if (auto edge = edgeNear(x)) {
        drag_ = edge;
        selected_ = edge->id;
        emit markSelected(edge->id);
        invalidateContent();
        return;
    }
    if (const Mark* mk = markAt(x)) {
        const MarkId id = mk->id;
        const TimeRange span{mk->startSeconds, mk->endSeconds};
        selected_ = id;
        if (view()) {
            view()->setSelection(span);
            view()->setCursor(span.start);
        }
        emit markSelected(id);
        invalidateContent();
        return;
    }
    if (selected_) {
        selected_.reset();
        emit markSelected(0);
        invalidateContent();
    }
    SpanLane::mousePressEvent(e);
}

void MarkLane::mouseMoveEvent(QMouseEvent* e) {
    if (drag_ && (e->buttons() & Qt::LeftButton)) {
        const double t = std::clamp(timeAtX(e->position().x()), 0.0, view() ? view()->duration() : 1e300);
        if (drag_->startEdge) drag_->start = std::min(t, drag_->end - minMarkSeconds);
        else drag_->end = std::max(t, drag_->start + minMarkSeconds);
        if (view()) view()->setGuides({drag_->startEdge ? drag_->start : drag_->end});
        invalidateContent();
        return;
    }
    SpanLane::mouseMoveEvent(e);
    if (edgeNear(e->position().x())) setCursor(Qt::SizeHorCursor);
    else unsetCursor();
}

void MarkLane::mouseReleaseEvent(QMouseEvent* e) {
    if (drag_) {
        const EdgeDrag d = *drag_;
        drag_.reset();
        if (view()) {
            view()->setGuides({});
            view()->setSelection(TimeRange{d.start, d.end});
        }
        invalidateContent();
        const auto it = std::find_if(marks_.begin(), marks_.end(), [&](const Mark& m) { return m.id == d.id; });
        if (it != marks_.end() && (std::abs(it->startSeconds - d.start) > 1e-6 || std::abs(it->endSeconds - d.end) > 1e-6))
            emit spanEdited(d.id, d.start, d.end);
        return;
    }
    SpanLane::mouseReleaseEvent(e);
}

void MarkLane::mouseDoubleClickEvent(QMouseEvent* e) {
    if (e->button() == Qt::LeftButton && markAt(e->position().x())) emit playRequested();
}

}  // namespace earmark::widgets
