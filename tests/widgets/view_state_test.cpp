// The one view state: clamping, zoom anchoring, selection, change signals,
// and the scrollbar guard of the lane stack.
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/view_state.hpp"

#include <QScrollBar>
#include <QSignalSpy>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

TEST(ViewState, ResetShowsTheWholeTakeAndClearsMarks) {
    ViewState v;
    v.resetForDuration(4.0);
    v.setCursor(1.0);
    v.setSelection(TimeRange{1.0, 2.0});
    v.resetForDuration(8.0);
    EXPECT_EQ(v.visibleRange(), (TimeRange{0.0, 8.0}));
    EXPECT_DOUBLE_EQ(v.cursor(), 0.0);
    EXPECT_FALSE(v.selection().has_value());
}

TEST(ViewState, ZoomKeepsThePointerTimeInPlace) {
    ViewState v;
    v.resetForDuration(10.0);
    v.setVisibleRange({2.0, 6.0});
    v.setHoverTime(5.0);  // three quarters across
    v.zoomAtPointer(4.0);
    EXPECT_NEAR(v.visibleRange().span(), 1.0, 1e-12);
    EXPECT_NEAR((5.0 - v.visibleRange().start) / v.visibleRange().span(), 0.75, 1e-12);
}

TEST(ViewState, KeyboardZoomFallsBackToCursorThenCentre) {
    ViewState v;
    v.resetForDuration(10.0);
    v.setVisibleRange({2.0, 6.0});
    v.setCursor(3.0);
    EXPECT_DOUBLE_EQ(v.zoomAnchor(), 3.0);
    v.setCursor(9.0);  // off screen
    EXPECT_DOUBLE_EQ(v.zoomAnchor(), 4.0);
    v.setHoverTime(5.5);
    EXPECT_DOUBLE_EQ(v.zoomAnchor(), 5.5);
}

TEST(ViewState, ZoomToSelectionAndShowAll) {
    ViewState v;
    v.resetForDuration(10.0);
    v.zoomToSelection();  // nothing selected: nothing happens
    EXPECT_EQ(v.visibleRange(), (TimeRange{0.0, 10.0}));
    v.setSelection(TimeRange{3.25, 4.5});
    v.zoomToSelection();
    EXPECT_EQ(v.visibleRange(), (TimeRange{3.25, 4.5}));
    v.showAll();
    EXPECT_EQ(v.visibleRange(), (TimeRange{0.0, 10.0}));
}

TEST(ViewState, SelectionIsClampedAndEmptySpansClearIt) {
    ViewState v;
    v.resetForDuration(2.0);
    v.setSelection(TimeRange{-1.0, 0.5});
    ASSERT_TRUE(v.selection());
    EXPECT_EQ(*v.selection(), (TimeRange{0.0, 0.5}));
    v.setSelection(TimeRange{1.0, 1.0});
    EXPECT_FALSE(v.selection());
    v.setCursor(5.0);
    EXPECT_DOUBLE_EQ(v.cursor(), 2.0);
}

TEST(ViewState, EqualValuesEmitNothing) {
    ViewState v;
    v.resetForDuration(5.0);
    QSignalSpy range(&v, &ViewState::visibleRangeChanged);
    QSignalSpy cursor(&v, &ViewState::cursorChanged);
    QSignalSpy selection(&v, &ViewState::selectionChanged);
    v.setVisibleRange({0.0, 5.0});
    v.setCursor(0.0);
    v.setSelection(std::nullopt);
    v.scroll(-1.0);  // already at the start
    EXPECT_EQ(range.count(), 0);
    EXPECT_EQ(cursor.count(), 0);
    EXPECT_EQ(selection.count(), 0);
    v.setVisibleRange({1.0, 2.0});
    EXPECT_EQ(range.count(), 1);
}

TEST(LaneStack, ScrollbarFollowsTheViewWithoutEchoingBack) {
    ViewState v;
    LaneStack stack(&v);
    v.resetForDuration(10.0);
    v.setVisibleRange({2.0, 4.0});
    auto* bar = stack.findChild<QScrollBar*>();
    ASSERT_NE(bar, nullptr);
    EXPECT_EQ(bar->value(), 2000);
    EXPECT_EQ(bar->pageStep(), 2000);
    EXPECT_EQ(bar->maximum(), 8000);

    // A view change must reach the bar without the bar writing back a rounded range.
    QSignalSpy range(&v, &ViewState::visibleRangeChanged);
    v.setVisibleRange({1.23456, 3.23456});
    EXPECT_EQ(range.count(), 1);
    EXPECT_DOUBLE_EQ(v.visibleRange().start, 1.23456);

    // Moving the bar moves the view, keeping its span.
    bar->setValue(5000);
    EXPECT_NEAR(v.visibleRange().start, 5.0, 1e-9);
    EXPECT_NEAR(v.visibleRange().span(), 2.0, 1e-9);
}

}  // namespace
}  // namespace earmark::widgets

#include "earmark/widgets/waveform_lane.hpp"
#include "earmark/widgets/energy_lane.hpp"

#include <QSettings>

namespace earmark::widgets {
namespace {

TEST(LaneStack, LaneVisibilityPersistsAcrossWindows) {
    QSettings q;
    q.clear();
    {
        ViewState v;
        LaneStack stack(&v);
        stack.addLane(new WaveformLane(&v), LaneStack::Placement::Resizable);
        stack.addLane(new EnergyLane(&v), LaneStack::Placement::Resizable);
        stack.setLaneVisible("energy", false);
        stack.saveLayout(q);
    }
    ViewState v;
    LaneStack stack(&v);
    stack.addLane(new WaveformLane(&v), LaneStack::Placement::Resizable);
    stack.addLane(new EnergyLane(&v), LaneStack::Placement::Resizable);
    EXPECT_TRUE(stack.isLaneVisible("energy"));
    stack.restoreLayout(q);
    EXPECT_FALSE(stack.isLaneVisible("energy"));
    EXPECT_TRUE(stack.isLaneVisible("waveform"));
    q.clear();
}

TEST(Lane, FollowsADarkPalette) {
    ViewState v;
    WaveformLane lane(&v);
    QPalette dark;
    dark.setColor(QPalette::Window, QColor(30, 30, 34));
    dark.setColor(QPalette::Base, QColor(20, 20, 24));
    dark.setColor(QPalette::Text, QColor(230, 230, 230));
    lane.setPalette(dark);
    lane.resize(400, 120);
    const QImage image = lane.grab().toImage();
    const QColor background = image.pixelColor(lane.plotRect().center().x(), 5);
    EXPECT_LT(background.lightnessF(), 0.2);
    EXPECT_GT(lane.colours().waveform.lightnessF(), 0.5);  // light trace on a dark ground
}

}  // namespace
}  // namespace earmark::widgets
