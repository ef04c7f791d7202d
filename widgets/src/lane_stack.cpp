#include "earmark/widgets/lane_stack.hpp"

#include <QScrollBar>
#include <QSettings>
#include <QSplitter>
#include <QVBoxLayout>

#include <cmath>

namespace earmark::widgets {

namespace {
// Scrollbar units: milliseconds (an int holds ~24 days).
constexpr double unitsPerSecond = 1000.0;
}

LaneStack::LaneStack(ViewState* view, QWidget* parent) : QWidget(parent), view_(view) {
    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(0);
    fixedLayout_ = new QVBoxLayout;
    fixedLayout_->setSpacing(1);
    layout->addLayout(fixedLayout_);
    splitter_ = new QSplitter(Qt::Vertical, this);
    splitter_->setChildrenCollapsible(false);
    splitter_->setHandleWidth(5);
    layout->addWidget(splitter_, 1);
    scrollBar_ = new QScrollBar(Qt::Horizontal, this);
    layout->addWidget(scrollBar_);
    connect(scrollBar_, &QScrollBar::valueChanged, this, &LaneStack::onScrollBar);
    connect(view_, &ViewState::visibleRangeChanged, this, &LaneStack::syncScrollBar);
    connect(view_, &ViewState::durationChanged, this, &LaneStack::syncScrollBar);
    syncScrollBar();
}

void LaneStack::addLane(Lane* lane, Placement placement, int stretch) {
    lanes_.push_back(lane);
    if (placement == Placement::Fixed) {
        lane->setParent(this);
        fixedLayout_->addWidget(lane);
    } else {
        splitter_->addWidget(lane);
        splitter_->setStretchFactor(splitter_->indexOf(lane), stretch);
    }
    connect(lane, &Lane::pointDescribed, this, &LaneStack::pointDescribed);
}

Lane* LaneStack::lane(const QString& id) const {
    for (Lane* l : lanes_)
        if (l->id() == id) return l;
    return nullptr;
}

void LaneStack::setLaneVisible(const QString& id, bool visible) {
    Lane* l = lane(id);
    if (!l || l->isVisibleTo(this) == visible) return;
    l->setVisible(visible);
    emit laneVisibilityChanged(id, visible);
}

bool LaneStack::isLaneVisible(const QString& id) const {
    const Lane* l = lane(id);
    return l && !l->isHidden();
}

void LaneStack::setTake(TakeAudioPtr audio) {
    for (Lane* l : lanes_) l->setTake(audio);
}

void LaneStack::setTracks(TakeTracksPtr tracks) {
    for (Lane* l : lanes_) l->setTracks(tracks);
}

void LaneStack::syncScrollBar() {
    // Guard: setting the scrollbar emits valueChanged, which must not write
    // a rounded range back into the view.
    syncing_ = true;
    const TimeRange r = view_->visibleRange();
    const int span = static_cast<int>(std::lround(r.span() * unitsPerSecond));
    const int total = static_cast<int>(std::lround(view_->duration() * unitsPerSecond));
    scrollBar_->setRange(0, std::max(0, total - span));
    scrollBar_->setPageStep(std::max(1, span));
    scrollBar_->setSingleStep(std::max(1, span / 10));
    scrollBar_->setValue(static_cast<int>(std::lround(r.start * unitsPerSecond)));
    scrollBar_->setEnabled(total > span);
    syncing_ = false;
}

void LaneStack::onScrollBar(int value) {
    if (syncing_) return;
    const TimeRange r = view_->visibleRange();
    const double start = value / unitsPerSecond;
    view_->setVisibleRange({start, start + r.span()});
}

void LaneStack::saveLayout(QSettings& q) const {
    q.beginGroup("lanes");
    const QList<int> sizes = splitter_->sizes();
    for (Lane* l : lanes_) {
        q.setValue(l->id() + "/visible", !l->isHidden());
        const int i = splitter_->indexOf(l);
        if (i >= 0 && sizes.value(i) > 0) q.setValue(l->id() + "/height", sizes.value(i));
    }
    q.endGroup();
}

void LaneStack::restoreLayout(QSettings& q) {
    q.beginGroup("lanes");
    QList<int> sizes = splitter_->sizes();
    bool haveSizes = false;
    for (Lane* l : lanes_) {
        setLaneVisible(l->id(), q.value(l->id() + "/visible", true).toBool());
        const int i = splitter_->indexOf(l);
        if (i >= 0 && q.contains(l->id() + "/height")) {
            sizes[i] = q.value(l->id() + "/height").toInt();
            haveSizes = true;
        }
    }
    if (!haveSizes) {
        // First run: share the height in proportion to what each lane asks for.
        for (Lane* l : lanes_) {
            const int i = splitter_->indexOf(l);
            if (i >= 0) sizes[i] = l->sizeHint().height();
        }
    }
    splitter_->setSizes(sizes);
    q.endGroup();
}

}  // namespace earmark::widgets
