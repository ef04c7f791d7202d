// The one view state every lane observes: visible range, cursor, selection,
// hover time and playhead. No lane keeps its own copy; lanes read from here in
// paintEvent and ask here for changes. Setters ignore values equal to the
// current one, so observers that write back what they were told (a scrollbar,
// an axis) cannot start a feedback loop.
//
// Thread-safety: GUI thread only (a QObject).
#pragma once

#include "earmark/widgets/time_mapping.hpp"

#include <QObject>
#include <QString>

#include <optional>
#include <vector>

namespace earmark::widgets {

class ViewState : public QObject {
    Q_OBJECT
public:
    explicit ViewState(QObject* parent = nullptr);

    // A new take: shows all of it, clears cursor, selection and playhead.
    void resetForDuration(double seconds);

    double duration() const { return limits_.duration; }
    const RangeLimits& limits() const { return limits_; }
    TimeRange visibleRange() const { return visible_; }
    double cursor() const { return cursor_; }
    std::optional<TimeRange> selection() const { return selection_; }
    std::optional<double> hoverTime() const { return hover_; }
    std::optional<double> playhead() const { return playhead_; }
    // Thin vertical guides drawn through every lane (s), e.g. the boundaries
    // of the tier interval under the pointer; empty when none.
    const std::vector<double>& guides() const { return guides_; }

    void setVisibleRange(TimeRange r);  // clamped to the take
    void zoom(double factor, double anchorSeconds);
    void zoomAtCentre(double factor);
    // Keyboard zoom: anchored at the pointer when it is over a lane, else at
    // the cursor when the cursor is in view, else at the centre.
    void zoomAtPointer(double factor);
    double zoomAnchor() const;
    void scroll(double seconds);
    void scrollPages(double pages);  // by a fraction of the visible span
    void showAll();
    void zoomToSelection();          // no-op without a selection

    void setCursor(double seconds);  // clamped to [0, duration]
    void setSelection(std::optional<TimeRange> s);  // clamped; empty spans clear it
    void setHoverTime(std::optional<double> t);
    void setPlayhead(std::optional<double> t);
    void setGuides(std::vector<double> times);

signals:
    void visibleRangeChanged(earmark::widgets::TimeRange range);
    void cursorChanged(double seconds);
    void selectionChanged();
    void hoverChanged();
    void playheadChanged();
    void guidesChanged();
    void durationChanged(double seconds);

private:
    double clampTime(double t) const;

    RangeLimits limits_;
    TimeRange visible_;
    double cursor_ = 0.0;
    std::optional<TimeRange> selection_;
    std::optional<double> hover_;
    std::optional<double> playhead_;
    std::vector<double> guides_;
};

}  // namespace earmark::widgets
