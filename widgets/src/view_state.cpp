#include "earmark/widgets/view_state.hpp"

namespace earmark::widgets {

ViewState::ViewState(QObject* parent) : QObject(parent) {}

void ViewState::resetForDuration(double seconds) {
    limits_.duration = std::max(seconds, 0.0);
    visible_ = {0.0, limits_.duration};
    cursor_ = 0.0;
    selection_.reset();
    hover_.reset();
    playhead_.reset();
    guides_.clear();
    emit durationChanged(limits_.duration);
    emit visibleRangeChanged(visible_);
    emit cursorChanged(cursor_);
    emit selectionChanged();
    emit hoverChanged();
    emit playheadChanged();
}

double ViewState::clampTime(double t) const { return std::clamp(t, 0.0, limits_.duration); }

void ViewState::setVisibleRange(TimeRange r) {
    const TimeRange c = clampRange(r, limits_);
    if (c == visible_) return;
    visible_ = c;
    emit visibleRangeChanged(visible_);
}

void ViewState::zoom(double factor, double anchorSeconds) {
    setVisibleRange(zoomAbout(visible_, factor, anchorSeconds, limits_));
}

void ViewState::zoomAtCentre(double factor) { zoom(factor, 0.5 * (visible_.start + visible_.end)); }

double ViewState::zoomAnchor() const {
    if (hover_) return *hover_;
    if (visible_.contains(cursor_)) return cursor_;
    return 0.5 * (visible_.start + visible_.end);
}

void ViewState::zoomAtPointer(double factor) { zoom(factor, zoomAnchor()); }

void ViewState::scroll(double seconds) { setVisibleRange(scrollBy(visible_, seconds, limits_)); }

void ViewState::scrollPages(double pages) { scroll(pages * visible_.span()); }

void ViewState::showAll() { setVisibleRange({0.0, limits_.duration}); }

void ViewState::zoomToSelection() {
    if (selection_) setVisibleRange(*selection_);
}

void ViewState::setCursor(double seconds) {
    const double c = clampTime(seconds);
    if (c == cursor_) return;
    cursor_ = c;
    emit cursorChanged(cursor_);
}

void ViewState::setSelection(std::optional<TimeRange> s) {
    if (s) {
        s = TimeRange{clampTime(s->start), clampTime(s->end)};
        if (!(s->span() > 0.0)) s.reset();
    }
    if (s == selection_) return;
    selection_ = s;
    emit selectionChanged();
}

void ViewState::setHoverTime(std::optional<double> t) {
    if (t) t = clampTime(*t);
    if (t == hover_) return;
    hover_ = t;
    emit hoverChanged();
}

void ViewState::setPlayhead(std::optional<double> t) {
    if (t == playhead_) return;
    playhead_ = t;
    emit playheadChanged();
}

void ViewState::setGuides(std::vector<double> times) {
    if (times == guides_) return;
    guides_ = std::move(times);
    emit guidesChanged();
}

}  // namespace earmark::widgets
