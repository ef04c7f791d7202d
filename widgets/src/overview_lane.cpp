#include "earmark/widgets/overview_lane.hpp"

#include "earmark/widgets/axis_painting.hpp"

#include <QMouseEvent>
#include <QPainter>
#include <QWheelEvent>

#include <cmath>

namespace earmark::widgets {

namespace {
constexpr double edgeGripPx = 6.0;
}

OverviewLane::OverviewLane(ViewState* view, QWidget* parent) : Lane("overview", tr("Overview"), view, parent) {
    setFixedHeight(sizeHint().height());
    connect(view, &ViewState::visibleRangeChanged, this, qOverload<>(&QWidget::update));
}

TimeMapping OverviewLane::mapping() const {
    TimeMapping m;
    m.range = {0.0, view() ? view()->duration() : 0.0};
    m.width = plotRect().width();
    return m;
}

OverviewLane::Grip OverviewLane::gripAt(double widgetX) const {
    if (!view() || view()->duration() <= 0) return Grip::None;
    const TimeMapping m = mapping();
    const TimeRange r = view()->visibleRange();
    const double x0 = plotRect().left() + m.timeToX(r.start);
    const double x1 = plotRect().left() + m.timeToX(r.end);
    if (std::abs(widgetX - x0) <= edgeGripPx && x1 - x0 > 2 * edgeGripPx) return Grip::LeftEdge;
    if (std::abs(widgetX - x1) <= edgeGripPx) return Grip::RightEdge;
    if (std::abs(widgetX - x0) <= edgeGripPx) return Grip::LeftEdge;
    if (widgetX > x0 && widgetX < x1) return Grip::Move;
    return Grip::None;
}

void OverviewLane::drawContent(QPainter& p) {
    const LaneColours c = colours();
    const QRect plot = plotRect();
    p.fillRect(rect(), palette().color(QPalette::Window));
    p.setPen(c.faintText);
    p.drawText(QRect(6, 0, gutterWidth - 10, height()), Qt::AlignVCenter | Qt::AlignLeft, tr("whole take"));
    const auto& audio = take();
    p.fillRect(plot, c.background);
    if (!audio || audio->signal.empty()) return;
    const double spp = audio->signal.size() / static_cast<double>(plot.width());
    const auto env = audio->summary.envelope(audio->signal.samples, 0.0, std::max(spp, 1e-3), plot.width());
    const double mid = plot.center().y() + 0.5, half = plot.height() / 2.0 - 3.0;
    QColor wave = c.waveform;
    wave.setAlpha(170);
    p.setPen(Qt::NoPen);
    p.setBrush(wave);
    QPolygonF band;
    for (int i = 0; i < plot.width(); ++i)
        if (!env[i].empty()) band << QPointF(plot.left() + i, std::min(mid - env[i].max * half, mid - 0.5));
    for (int i = plot.width() - 1; i >= 0; --i)
        if (!env[i].empty()) band << QPointF(plot.left() + i + 1, std::max(mid - env[i].min * half, mid + 0.5));
    p.drawPolygon(band);
}

void OverviewLane::drawDecorations(QPainter& p) {
    if (!view() || view()->duration() <= 0) return;
    const LaneColours c = colours();
    const QRect plot = plotRect();
    const TimeMapping m = mapping();
    const TimeRange r = view()->visibleRange();
    const double x0 = plot.left() + m.timeToX(r.start);
    const double x1 = std::max(x0 + 2.0, plot.left() + m.timeToX(r.end));
    // Dim what is outside the window, frame the window.
    QColor dim = c.background;
    dim.setAlpha(150);
    p.fillRect(QRectF(plot.left(), plot.top(), x0 - plot.left(), plot.height()), dim);
    p.fillRect(QRectF(x1, plot.top(), plot.right() + 1 - x1, plot.height()), dim);
    QColor frame = c.cursor;
    p.setPen(QPen(frame, 2));
    p.setBrush(Qt::NoBrush);
    p.drawRect(QRectF(x0, plot.top() + 1, x1 - x0, plot.height() - 2));
}

void OverviewLane::mousePressEvent(QMouseEvent* e) {
    if (!view() || view()->duration() <= 0 || e->button() != Qt::LeftButton) return;
    const double x = e->position().x();
    grip_ = gripAt(x);
    grabTime_ = timeAtX(x);
    grabRange_ = view()->visibleRange();
    if (grip_ == Grip::None) {
        // Centre the window on the click, then let a drag carry it on.
        const double span = grabRange_.span();
        view()->setVisibleRange({grabTime_ - span / 2, grabTime_ + span / 2});
        grabRange_ = view()->visibleRange();
        grip_ = Grip::Move;
    }
}

void OverviewLane::mouseMoveEvent(QMouseEvent* e) {
    if (!view()) return;
    const double x = e->position().x();
    const double t = timeAtX(x);
    if (grip_ == Grip::None) {
        const Grip g = gripAt(x);
        setCursor(g == Grip::LeftEdge || g == Grip::RightEdge ? Qt::SizeHorCursor
                  : g == Grip::Move                          ? Qt::OpenHandCursor
                                                             : Qt::ArrowCursor);
        if (plotRect().contains(e->position().toPoint())) view()->setHoverTime(t);
        return;
    }
    const double minSpan = view()->limits().minSpanSeconds;
    switch (grip_) {
    case Grip::Move:
        view()->setVisibleRange({grabRange_.start + t - grabTime_, grabRange_.end + t - grabTime_});
        break;
    case Grip::LeftEdge:
        view()->setVisibleRange({std::min(t, grabRange_.end - minSpan), grabRange_.end});
        break;
    case Grip::RightEdge:
        view()->setVisibleRange({grabRange_.start, std::max(t, grabRange_.start + minSpan)});
        break;
    case Grip::None:
        break;
    }
}

void OverviewLane::mouseReleaseEvent(QMouseEvent*) { grip_ = Grip::None; }

void OverviewLane::wheelEvent(QWheelEvent* e) {
    if (!view() || view()->duration() <= 0) return;
    const double notches = e->angleDelta().y() / 120.0;
    view()->zoom(std::pow(1.25, notches), timeAtX(e->position().x()));
    e->accept();
}

}  // namespace earmark::widgets
