#include "earmark/widgets/lane.hpp"

#include <QMouseEvent>
#include <QPainter>
#include <QWheelEvent>

#include <cmath>

namespace earmark::widgets {

LaneColours LaneColours::from(const QPalette& p) {
    LaneColours c;
    const bool dark = p.color(QPalette::Window).lightnessF() < 0.5;
    c.background = p.color(QPalette::Base);
    c.text = p.color(QPalette::Text);
    c.faintText = p.color(QPalette::PlaceholderText);
    c.grid = dark ? QColor(255, 255, 255, 28) : QColor(0, 0, 0, 24);
    c.waveform = dark ? QColor(118, 178, 236) : QColor(34, 92, 160);
    c.pitch = dark ? QColor(244, 160, 92) : QColor(196, 82, 16);
    c.energy = dark ? QColor(132, 204, 150) : QColor(36, 128, 72);
    // Opaque (pre-mixed with the background): overlapping strokes of the
    // confidence strip must not darken where they overlap.
    auto mix = [](const QColor& a, const QColor& b, double t) {
        return QColor::fromRgbF(a.redF() + t * (b.redF() - a.redF()), a.greenF() + t * (b.greenF() - a.greenF()),
                                a.blueF() + t * (b.blueF() - a.blueF()));
    };
    c.confidence = mix(c.background, c.pitch, dark ? 0.3 : 0.22);
    c.selection = p.color(QPalette::Highlight);
    c.selection.setAlpha(dark ? 70 : 56);
    c.cursor = p.color(QPalette::Highlight);
    c.playhead = dark ? QColor(255, 92, 92) : QColor(214, 30, 40);
    c.hover = c.text;
    c.hover.setAlpha(90);
    c.guide = dark ? QColor(236, 210, 120, 150) : QColor(150, 110, 0, 140);
    return c;
}

// Selection, cursor, hover line and playhead on top of a lane's content. It
// takes no mouse events, so the lane below receives them.
class LaneOverlay : public QWidget {
public:
    explicit LaneOverlay(Lane* lane) : QWidget(lane), lane_(lane) {
        setAttribute(Qt::WA_TransparentForMouseEvents);
        setAttribute(Qt::WA_NoSystemBackground);
    }

protected:
    void paintEvent(QPaintEvent*) override {
        ViewState* v = lane_->view();
        if (!v || v->duration() <= 0) return;
        QPainter p(this);
        const QRect area = lane_->plotRect();
        p.setClipRect(area);
        const TimeMapping m = lane_->mapping();
        const LaneColours c = lane_->colours();
        auto xOf = [&](double t) { return area.left() + m.timeToX(t); };
        if (lane_->showsSelection()) {
            if (const auto sel = v->selection()) {
                const double x0 = xOf(sel->start), x1 = xOf(sel->end);
                p.fillRect(QRectF(x0, area.top(), std::max(x1 - x0, 1.0), area.height()), c.selection);
            }
        }
        if (!v->guides().empty()) {
            p.setPen(QPen(c.guide, 1));
            for (double g : v->guides()) p.drawLine(QPointF(xOf(g), area.top()), QPointF(xOf(g), area.bottom()));
        }
        if (const auto h = v->hoverTime()) {
            p.setPen(QPen(c.hover, 1, Qt::DotLine));
            p.drawLine(QPointF(xOf(*h), area.top()), QPointF(xOf(*h), area.bottom()));
        }
        p.setPen(QPen(c.cursor, 1.5));
        p.drawLine(QPointF(xOf(v->cursor()), area.top()), QPointF(xOf(v->cursor()), area.bottom()));
        if (const auto ph = v->playhead()) {
            p.setPen(QPen(c.playhead, 2));
            p.drawLine(QPointF(xOf(*ph), area.top()), QPointF(xOf(*ph), area.bottom()));
        }
    }

private:
    Lane* lane_;
};

Lane::Lane(const QString& id, const QString& title, ViewState* view, QWidget* parent)
    : QWidget(parent), id_(id), title_(title), view_(view) {
    setObjectName(id);
    setMouseTracking(true);
    setAttribute(Qt::WA_OpaquePaintEvent);
    setMinimumHeight(24);
    overlay_ = new LaneOverlay(this);
    auto repaintOverlay = [this] { overlay_->update(); };
    connect(view, &ViewState::visibleRangeChanged, this, [this] {
        if (followsVisibleRange()) invalidateContent();
        overlay_->update();
    });
    connect(view, &ViewState::durationChanged, this, [this] { invalidateContent(); });
    connect(view, &ViewState::cursorChanged, overlay_, repaintOverlay);
    connect(view, &ViewState::selectionChanged, overlay_, repaintOverlay);
    connect(view, &ViewState::hoverChanged, overlay_, repaintOverlay);
    connect(view, &ViewState::playheadChanged, overlay_, repaintOverlay);
    connect(view, &ViewState::guidesChanged, overlay_, repaintOverlay);
}

Lane::~Lane() = default;

void Lane::setTake(TakeAudioPtr audio) {
    take_ = std::move(audio);
    tracks_.reset();
    invalidateContent();
}

void Lane::setTracks(TakeTracksPtr t) {
    tracks_ = std::move(t);
    invalidateContent();
}

QRect Lane::plotRect() const {
    return QRect(gutterWidth, 0, std::max(1, width() - gutterWidth - rightMargin), height());
}

TimeMapping Lane::mapping() const {
    TimeMapping m;
    if (view_) m.range = view_->visibleRange();
    m.width = plotRect().width();
    return m;
}

QString Lane::describePoint(QPoint) const { return {}; }

void Lane::invalidateContent() {
    cacheValid_ = false;
    update();
    overlay_->update();
}

void Lane::drawContent(QPainter&) {}

void Lane::setEmptyText(const QString& text) {
    emptyText_ = text;
    invalidateContent();
}

void Lane::raiseOverlay() {
    overlay_->setGeometry(rect());
    overlay_->raise();
}

void Lane::drawDecorations(QPainter&) {}

void Lane::paintEvent(QPaintEvent*) {
    if (hostsChild_) return;
    const qreal dpr = devicePixelRatioF();
    if (!cacheValid_ || cache_.size() != size() * dpr) {
        cache_ = QPixmap(size() * dpr);
        cache_.setDevicePixelRatio(dpr);
        cache_.fill(colours().background);
        QPainter cp(&cache_);
        drawContent(cp);
        if (!take_ && !emptyText_.isEmpty()) {
            cp.setPen(colours().faintText);
            cp.drawText(plotRect(), Qt::AlignCenter | Qt::TextWordWrap, emptyText_);
        }
        cacheValid_ = true;
    }
    QPainter p(this);
    p.drawPixmap(0, 0, cache_);
    drawDecorations(p);
}

void Lane::resizeEvent(QResizeEvent* e) {
    QWidget::resizeEvent(e);
    overlay_->setGeometry(rect());
    overlay_->raise();
    cacheValid_ = false;
}

void Lane::changeEvent(QEvent* e) {
    QWidget::changeEvent(e);
    if (e->type() == QEvent::PaletteChange || e->type() == QEvent::StyleChange) invalidateContent();
}

double Lane::timeAtX(double widgetX) const { return mapping().xToTime(widgetX - plotRect().left()); }

void Lane::drawTitle(QPainter& p, const QString& text) const {
    drawTitleChip(p, *this, text);
}

void drawTitleChip(QPainter& p, const QWidget& w, const QString& text) {
    // A small label in the plot area's top-left corner, on a translucent chip
    // so it reads over any content and never collides with the axis labels.
    QFont f = w.font();
    f.setBold(true);
    const QFontMetrics fm(f);
    const QRect box(Lane::gutterWidth + 4, 3, fm.horizontalAdvance(text) + 10, fm.height() + 2);
    const LaneColours c = LaneColours::from(w.palette());
    QColor back = c.background;
    back.setAlpha(200);
    p.save();
    p.setRenderHint(QPainter::Antialiasing);
    p.setPen(Qt::NoPen);
    p.setBrush(back);
    p.drawRoundedRect(box, 3, 3);
    p.setFont(f);
    p.setPen(c.text);
    p.drawText(box, Qt::AlignCenter, text);
    p.restore();
}

void Lane::mousePressEvent(QMouseEvent* e) {
    if (!view_ || view_->duration() <= 0 || e->button() != Qt::LeftButton) {
        QWidget::mousePressEvent(e);
        return;
    }
    const double t = timeAtX(e->position().x());
    if (e->modifiers() & Qt::ShiftModifier) {
        // Shift-click extends the selection from the cursor.
        view_->setSelection(spanOf(view_->cursor(), t));
        pressTime_.reset();
        return;
    }
    pressTime_ = t;
    pressX_ = static_cast<int>(e->position().x());
    dragging_ = false;
}

void Lane::mouseMoveEvent(QMouseEvent* e) {
    if (!view_) return;
    const double t = timeAtX(e->position().x());
    if (plotRect().contains(e->position().toPoint())) {
        view_->setHoverTime(t);
        emit pointDescribed(describePoint(e->position().toPoint()));
    } else {
        view_->setHoverTime(std::nullopt);
        emit pointDescribed({});
    }
    if (pressTime_ && (e->buttons() & Qt::LeftButton)) {
        if (std::abs(e->position().x() - pressX_) >= 3) dragging_ = true;
        if (dragging_) view_->setSelection(spanOf(*pressTime_, t));
    }
}

void Lane::mouseReleaseEvent(QMouseEvent* e) {
    if (!view_ || !pressTime_ || e->button() != Qt::LeftButton) return;
    if (!dragging_) {
        view_->setCursor(*pressTime_);
        view_->setSelection(std::nullopt);
    } else {
        view_->setCursor(view_->selection() ? view_->selection()->start : *pressTime_);
    }
    pressTime_.reset();
    dragging_ = false;
}

void Lane::wheelEvent(QWheelEvent* e) {
    if (!view_ || view_->duration() <= 0) return;
    const QPoint angle = e->angleDelta();
    const double notches = (angle.y() != 0 ? angle.y() : angle.x()) / 120.0;
    if (e->modifiers() & Qt::ControlModifier) {
        view_->zoom(std::pow(1.25, notches), timeAtX(e->position().x()));
    } else {
        // Wheel up / left moves earlier, as in most horizontally scrolled views.
        view_->scrollPages(-0.1 * notches);
    }
    e->accept();
}

void Lane::leaveEvent(QEvent* e) {
    QWidget::leaveEvent(e);
    if (view_) view_->setHoverTime(std::nullopt);
    emit pointDescribed({});
}

}  // namespace earmark::widgets
