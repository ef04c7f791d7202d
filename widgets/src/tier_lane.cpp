#include "earmark/widgets/tier_lane.hpp"

#include "earmark/widgets/axis_painting.hpp"
#include "earmark/widgets/word_score_look.hpp"

#include <QLineEdit>
#include <QMouseEvent>
#include <QPainter>

#include <cmath>

namespace earmark::widgets {

namespace {
constexpr double grabPixels = 4.0;  // how near a boundary the pointer grabs it
}

TierLane::TierLane(const QString& tierName, const QString& title, ViewState* view, QWidget* parent)
    : SpanLane("tier-" + tierName, title, view, parent), tierName_(tierName) {
    tier_.name = tierName.toStdString();
    setHint(defaultHint());
    setMinimumHeight(22);
}

QString TierLane::defaultHint() const { return tr("no %1 for this take").arg(tierName_); }

void TierLane::setTier(const Tier& tier) {
    setHint(defaultHint());  // a reason given for the previous take's empty tier no longer holds
    tier_ = tier;
    tier_.name = tierName_.toStdString();
    if (editor_) editor_->deleteLater();
    editor_ = nullptr;
    invalidateContent();
}

void TierLane::setScoreMarks(std::vector<WordScoreMark> marks) {
    scoreMarks_ = std::move(marks);
    invalidateContent();
}

void TierLane::drawContent(QPainter& p) {
    if (!drawFrame(p, !tier_.intervals.empty() || !scoreMarks_.empty())) return;
    const LaneColours c = colours();
    const QRect plot = plotRect();
    const TimeMapping m = mapping();
    p.setClipRect(plot);
    QColor box = c.text;
    box.setAlpha(14);
    QColor doubtful = c.pitch;
    doubtful.setAlpha(80);
    QColor edge = c.text;
    edge.setAlpha(110);
    const QFontMetrics fm = fontMetrics();
    for (const Interval& in : tier_.intervals) {
        if (in.endS < m.range.start || in.startS > m.range.end) continue;
        const double x0 = plot.left() + m.timeToX(in.startS), x1 = plot.left() + m.timeToX(in.endS);
        const QRectF r(x0, plot.top() + 2, x1 - x0, plot.height() - 4);
        const bool low = in.confidence && *in.confidence < kLowConfidence;
        p.fillRect(r, low ? doubtful : box);
        p.setPen(QPen(edge, 1));
        p.drawLine(QPointF(x0, r.top()), QPointF(x0, r.bottom()));
        p.drawLine(QPointF(x1, r.top()), QPointF(x1, r.bottom()));
        const int room = static_cast<int>(x1 - x0) - 4;
        if (room < fm.averageCharWidth()) continue;
        p.setPen(c.text);
        const QString label = fm.elidedText(QString::fromStdString(in.label), Qt::ElideRight, room);
        p.drawText(r.adjusted(2, 0, -2, 0), Qt::AlignCenter, label);
    }
    drawScoreMarks(p);
}

void TierLane::drawScoreMarks(QPainter& p) {
    const QRect plot = plotRect();
    const TimeMapping m = mapping();
    for (const WordScoreMark& w : scoreMarks_) {
        if (w.endS < m.range.start || w.startS > m.range.end) continue;
        const double x0 = plot.left() + m.timeToX(w.startS), x1 = plot.left() + m.timeToX(w.endS);
        const QColor colour = wordScoreColour(w.cls);
        const int strip = wordScoreStripPixels(w.cls);
        const QRectF whole(x0 + 1, plot.top() + 2, std::max(1.0, x1 - x0 - 2), plot.height() - 4);
        if (w.cls == WordScoreClass::Poor || w.cls == WordScoreClass::Unspoken) {
            QColor tint = colour;
            tint.setAlpha(w.cls == WordScoreClass::Poor ? 60 : 40);
            p.fillRect(whole, tint);
        }
        if (w.cls == WordScoreClass::Unspoken) {
            p.fillRect(whole, QBrush(colour, Qt::DiagCrossPattern));
            QFont f = p.font();
            f.setItalic(true);
            f.setStrikeOut(true);
            p.setFont(f);
            p.setPen(colours().text);
            p.drawText(whole, Qt::AlignCenter, w.label);
            p.setFont(font());
        }
        p.fillRect(QRectF(whole.left(), whole.bottom() - strip, whole.width(), strip), colour);
        if (w.guessed) {
            p.setPen(QPen(colour, 2, Qt::DotLine));
            p.drawLine(QPointF(whole.left(), whole.top() + 1), QPointF(whole.right(), whole.top() + 1));
        }
    }
}

QString TierLane::describePoint(QPoint pos) const {
    const double t = timeAtX(pos.x());
    QString score;
    for (const WordScoreMark& w : scoreMarks_)
        if (t >= w.startS && t < w.endS) score = w.detail;
    const int i = intervalAt(tier_, t);
    if (i < 0) return score;
    const Interval& in = tier_.intervals[static_cast<std::size_t>(i)];
    QString s = tr("%1 “%2” %3–%4 s")
                    .arg(tierName_, QString::fromStdString(in.label))
                    .arg(in.startS, 0, 'f', 3)
                    .arg(in.endS, 0, 'f', 3);
    if (in.confidence) s += tr(", confidence %1").arg(*in.confidence, 0, 'f', 2);
    if (!score.isEmpty()) s += " · " + score;
    return s;
}

std::optional<TierBoundary> TierLane::boundaryNear(double x) const {
    std::optional<TierBoundary> best;
    double bestDist = grabPixels + 1;
    for (const TierBoundary& b : tierBoundaries(tier_)) {
        const double d = std::abs(xOf(b.time) - x);
        if (d <= grabPixels && d < bestDist) {
            best = b;
            bestDist = d;
        }
    }
    return best;
}

void TierLane::selectInterval(int index) {
    if (index < 0 || !view()) return;
    const Interval& in = tier_.intervals[static_cast<std::size_t>(index)];
    view()->setSelection(TimeRange{in.startS, in.endS});
    view()->setCursor(in.startS);
}

void TierLane::mousePressEvent(QMouseEvent* e) {
    emit activated();
    pressed_ = false;
    if (e->button() == Qt::LeftButton && take() && view() && (e->modifiers() & Qt::ShiftModifier)) {
        const int i = intervalAt(tier_, timeAtX(e->position().x()));
        if (i >= 0) {
            const Interval& in = tier_.intervals[static_cast<std::size_t>(i)];
            const TimeRange sel = view()->selection().value_or(TimeRange{view()->cursor(), view()->cursor()});
            view()->setSelection(TimeRange{std::min(sel.start, in.startS), std::max(sel.end, in.endS)});
            return;
        }
    }
    if (e->button() == Qt::LeftButton && take() && !(e->modifiers() & Qt::ShiftModifier)) {
        if (const auto b = boundaryNear(e->position().x())) {
            dragging_ = b;
            dragTime_ = b->time;
            return;
        }
        pressed_ = true;
        pressPos_ = e->position().toPoint();
    }
    SpanLane::mousePressEvent(e);
}

void TierLane::mouseMoveEvent(QMouseEvent* e) {
    if (dragging_) {
        double t = timeAtX(e->position().x());
        if (snap_) t = snap_(t);
        dragTime_ = t;
        if (view()) {
            view()->setHoverTime(t);
            view()->setGuides({t});
        }
        return;
    }
    SpanLane::mouseMoveEvent(e);
    if (!view() || !plotRect().contains(e->position().toPoint())) return;
    if (const auto b = boundaryNear(e->position().x())) {
        setCursor(Qt::SizeHorCursor);
        view()->setGuides({b->time});
    } else {
        unsetCursor();
        const int i = intervalAt(tier_, timeAtX(e->position().x()));
        if (i >= 0) view()->setGuides({tier_.intervals[static_cast<std::size_t>(i)].startS,
                                       tier_.intervals[static_cast<std::size_t>(i)].endS});
        else view()->setGuides({});
    }
}

void TierLane::mouseReleaseEvent(QMouseEvent* e) {
    if (dragging_) {
        const TierBoundary b = *dragging_;
        dragging_.reset();
        if (std::abs(dragTime_ - b.time) > 1e-6)
            if (auto moved = moveBoundary(tier_, b, dragTime_, view() ? view()->duration() : 0.0))
                emit editRequested(tr("move %1 boundary").arg(tierName_ == "phones" ? tr("phone") : tr("word")), *moved);
        return;
    }
    const bool click = pressed_ && (e->position().toPoint() - pressPos_).manhattanLength() < 3;
    pressed_ = false;
    SpanLane::mouseReleaseEvent(e);
    if (click) selectInterval(intervalAt(tier_, timeAtX(e->position().x())));
}

void TierLane::mouseDoubleClickEvent(QMouseEvent* e) {
    const int i = intervalAt(tier_, timeAtX(e->position().x()));
    if (i < 0 || e->button() != Qt::LeftButton) return;
    if (e->modifiers() & Qt::ControlModifier) {
        editLabel(i);
        return;
    }
    selectInterval(i);
    emit playRequested();
}

void TierLane::leaveEvent(QEvent* e) {
    SpanLane::leaveEvent(e);
    if (view() && !dragging_) view()->setGuides({});
}

void TierLane::editLabel(int index) {
    if (index < 0 || index >= static_cast<int>(tier_.intervals.size())) return;
    if (editor_) editor_->deleteLater();
    const Interval& in = tier_.intervals[static_cast<std::size_t>(index)];
    editor_ = new QLineEdit(QString::fromStdString(in.label), this);
    editor_->setObjectName("tierLabelEditor");
    const double x0 = std::max<double>(xOf(in.startS), plotRect().left());
    const double x1 = std::min<double>(xOf(in.endS), plotRect().right());
    editor_->setGeometry(QRect(static_cast<int>(x0), 1, std::max(80, static_cast<int>(x1 - x0)), height() - 2));
    editor_->selectAll();
    editor_->show();
    editor_->setFocus();
    QLineEdit* ed = editor_;
    // Enter commits, Escape (focus loss without Enter) drops the change.
    connect(ed, &QLineEdit::returnPressed, this, [this, ed, index] {
        const std::string label = ed->text().trimmed().toStdString();
        editor_ = nullptr;
        ed->deleteLater();
        if (auto t = relabel(tier_, index, label)) emit editRequested(tr("edit %1 label").arg(tierName_), *t);
    });
    connect(ed, &QLineEdit::editingFinished, this, [this, ed] {
        if (editor_ != ed) return;
        editor_ = nullptr;
        ed->deleteLater();
    });
}

}  // namespace earmark::widgets
