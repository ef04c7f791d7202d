// Time ↔ pixel maths and the range operations behind zoom and scroll.
#include "earmark/widgets/time_mapping.hpp"

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

TEST(TimeMapping, MapsEndsOfTheRangeToEndsOfTheWidth) {
    const TimeMapping m{{2.0, 6.0}, 800.0};
    EXPECT_DOUBLE_EQ(m.timeToX(2.0), 0.0);
    EXPECT_DOUBLE_EQ(m.timeToX(6.0), 800.0);
    EXPECT_DOUBLE_EQ(m.timeToX(3.0), 200.0);
    EXPECT_DOUBLE_EQ(m.pixelsPerSecond(), 200.0);
    EXPECT_DOUBLE_EQ(m.secondsPerPixel(), 0.005);
}

TEST(TimeMapping, XToTimeInvertsTimeToX) {
    const TimeMapping m{{0.125, 1.375}, 1013.0};
    for (double t : {0.125, 0.2, 0.77, 1.0, 1.375}) EXPECT_NEAR(m.xToTime(m.timeToX(t)), t, 1e-12);
}

TEST(TimeMapping, EmptyRangeOrWidthDoesNotDivideByZero) {
    const TimeMapping a{{1.0, 1.0}, 500.0};
    EXPECT_DOUBLE_EQ(a.pixelsPerSecond(), 0.0);
    const TimeMapping b{{0.0, 1.0}, 0.0};
    EXPECT_DOUBLE_EQ(b.secondsPerPixel(), 0.0);
}

TEST(ZoomAbout, KeepsTheAnchorAtTheSamePlaceOnScreen) {
    const RangeLimits limits{10.0, 0.002};
    const TimeRange before{2.0, 6.0};
    const double anchor = 3.0;  // a quarter of the way across
    const TimeRange after = zoomAbout(before, 2.0, anchor, limits);
    EXPECT_NEAR(after.span(), 2.0, 1e-12);
    EXPECT_NEAR((anchor - after.start) / after.span(), 0.25, 1e-12);
    const TimeMapping m0{before, 1000}, m1{after, 1000};
    EXPECT_NEAR(m0.timeToX(anchor), m1.timeToX(anchor), 1e-9);
}

TEST(ZoomAbout, ZoomingInThenOutRestoresTheRange) {
    const RangeLimits limits{10.0, 0.002};
    const TimeRange r{1.0, 5.0};
    const TimeRange back = zoomAbout(zoomAbout(r, 4.0, 2.2, limits), 0.25, 2.2, limits);
    EXPECT_NEAR(back.start, r.start, 1e-12);
    EXPECT_NEAR(back.end, r.end, 1e-12);
}

TEST(ZoomAbout, StopsAtTheDeepestZoomAndAtTheWholeTake) {
    const RangeLimits limits{10.0, 0.01};
    const TimeRange deep = zoomAbout({4.0, 5.0}, 1e6, 4.5, limits);
    EXPECT_NEAR(deep.span(), 0.01, 1e-12);
    EXPECT_TRUE(deep.contains(4.5));
    const TimeRange wide = zoomAbout({4.0, 5.0}, 1e-6, 4.5, limits);
    EXPECT_DOUBLE_EQ(wide.start, 0.0);
    EXPECT_DOUBLE_EQ(wide.end, 10.0);
}

TEST(ZoomAbout, ZoomOutNearTheEndShiftsRatherThanOverhangs) {
    const RangeLimits limits{10.0, 0.002};
    const TimeRange r = zoomAbout({8.0, 10.0}, 0.5, 9.9, limits);
    EXPECT_NEAR(r.span(), 4.0, 1e-12);
    EXPECT_DOUBLE_EQ(r.end, 10.0);
}

TEST(ScrollBy, KeepsTheSpanAndStopsAtTheEnds) {
    const RangeLimits limits{10.0, 0.002};
    const TimeRange r = scrollBy({2.0, 4.0}, 1.5, limits);
    EXPECT_DOUBLE_EQ(r.start, 3.5);
    EXPECT_DOUBLE_EQ(r.end, 5.5);
    const TimeRange end = scrollBy({2.0, 4.0}, 100.0, limits);
    EXPECT_DOUBLE_EQ(end.start, 8.0);
    EXPECT_DOUBLE_EQ(end.end, 10.0);
    const TimeRange start = scrollBy({2.0, 4.0}, -100.0, limits);
    EXPECT_DOUBLE_EQ(start.start, 0.0);
    EXPECT_DOUBLE_EQ(start.end, 2.0);
}

TEST(ClampRange, CutsToTheTakeAndWidensTinySpans) {
    const RangeLimits limits{3.0, 0.01};
    const TimeRange big = clampRange({-1.0, 7.0}, limits);
    EXPECT_DOUBLE_EQ(big.start, 0.0);
    EXPECT_DOUBLE_EQ(big.end, 3.0);
    const TimeRange tiny = clampRange({1.0, 1.0001}, limits);
    EXPECT_NEAR(tiny.span(), 0.01, 1e-12);
    EXPECT_NEAR(0.5 * (tiny.start + tiny.end), 1.00005, 1e-12);
}

TEST(SpanOf, OrdersADragEitherWay) {
    EXPECT_EQ(spanOf(3.0, 1.0), (TimeRange{1.0, 3.0}));
    EXPECT_EQ(spanOf(1.0, 3.0), (TimeRange{1.0, 3.0}));
}

TEST(NiceStep, PicksOneTwoOrFiveTimesAPowerOfTen) {
    EXPECT_DOUBLE_EQ(niceStep(0.7), 1.0);
    EXPECT_DOUBLE_EQ(niceStep(1.3), 2.0);
    EXPECT_DOUBLE_EQ(niceStep(3.0), 5.0);
    EXPECT_NEAR(niceStep(0.0042), 0.005, 1e-15);
    EXPECT_DOUBLE_EQ(niceStep(60.0), 100.0);
}

}  // namespace
}  // namespace earmark::widgets
