// Tier, mark and suspect lanes: tier edits as pure functions, clicking a word
// selects it, dragging a boundary or a mark edge reports the edit, and each
// lane draws something for a take.
#include "earmark/widgets/mark_lane.hpp"
#include "earmark/widgets/suspect_lane.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "image_checks.hpp"
#include "mouse_drag.hpp"
#include "sample_take.hpp"

#include <QApplication>
#include <QLineEdit>
#include <QSet>
#include <QSignalSpy>
#include <QTest>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

Tier words() {
    Tier t{"words", {}};
    t.intervals = {{0.2, 0.5, "ferry", 0.9}, {0.5, 0.8, "leaves", 0.3}, {1.0, 1.4, "soon", std::nullopt}};
    return t;
}

TEST(TierEditing, BoundariesAreSharedWhereIntervalsTouch) {
    const auto b = tierBoundaries(words());
    ASSERT_EQ(b.size(), 5u);  // 0.2 | 0.5 shared | 0.8 | 1.0 | 1.4
    EXPECT_DOUBLE_EQ(b[1].time, 0.5);
    EXPECT_EQ(b[1].endOf, 0);
    EXPECT_EQ(b[1].startOf, 1);
    EXPECT_EQ(intervalAt(words(), 0.5), 1);
    EXPECT_EQ(intervalAt(words(), 0.9), -1);
}

TEST(TierEditing, MovingABoundaryMovesBothSidesAndStopsAtNeighbours) {
    const auto b = tierBoundaries(words());
    auto moved = moveBoundary(words(), b[1], 0.6, 2.0);
    ASSERT_TRUE(moved);
    EXPECT_DOUBLE_EQ(moved->intervals[0].endS, 0.6);
    EXPECT_DOUBLE_EQ(moved->intervals[1].startS, 0.6);
    // Past the next interval's end: stops the minimum length before it.
    moved = moveBoundary(words(), b[1], 5.0, 2.0);
    EXPECT_NEAR(moved->intervals[1].startS, 0.8 - kMinIntervalSeconds, 1e-12);
    // An end facing a gap cannot cross into the next interval.
    moved = moveBoundary(words(), b[2], 1.2, 2.0);
    EXPECT_DOUBLE_EQ(moved->intervals[1].endS, 1.0);
}

TEST(TierEditing, SplitMergeInsertRelabelAndRemove) {
    auto split = splitAt(words(), 1.2);
    ASSERT_TRUE(split);
    ASSERT_EQ(split->intervals.size(), 4u);
    EXPECT_EQ(split->intervals[2].label, "soon");
    EXPECT_DOUBLE_EQ(split->intervals[2].endS, 1.2);
    EXPECT_EQ(split->intervals[3].label, "");
    EXPECT_FALSE(splitAt(words(), 0.9));  // in a gap
    EXPECT_FALSE(splitAt(words(), 0.501));  // would leave a 1 ms sliver

    auto merged = mergeWithNext(words(), 0, " ");
    ASSERT_TRUE(merged);
    ASSERT_EQ(merged->intervals.size(), 2u);
    EXPECT_EQ(merged->intervals[0].label, "ferry leaves");
    EXPECT_DOUBLE_EQ(merged->intervals[0].endS, 0.8);
    EXPECT_DOUBLE_EQ(*merged->intervals[0].confidence, 0.3);  // the weaker of the two
    EXPECT_FALSE(mergeWithNext(words(), 2, " "));

    auto inserted = insertInterval(words(), 0.85, 0.95);
    ASSERT_TRUE(inserted);
    EXPECT_EQ(inserted->intervals.size(), 4u);
    EXPECT_DOUBLE_EQ(inserted->intervals[2].startS, 0.85);
    EXPECT_FALSE(insertInterval(words(), 0.7, 0.9));  // overlaps "leaves"

    EXPECT_EQ(relabel(words(), 2, "later")->intervals[2].label, "later");
    EXPECT_FALSE(relabel(words(), 2, "soon"));  // no change
    EXPECT_EQ(removeInterval(words(), 1)->intervals.size(), 2u);
}

struct TierLaneFixture : ::testing::Test {
    ViewState view;
    TierLane lane{"words", "Words", &view};
    void SetUp() override {
        const auto& sample = test::sampleTake();
        view.resetForDuration(2.0);
        lane.resize(Lane::gutterWidth + Lane::rightMargin + 1000, 30);  // 500 px per second
        lane.setTake(sample.audio);
        lane.setTier(words());
        lane.show();
    }
    QPoint at(double t) const { return QPoint(static_cast<int>(std::lround(lane.xOf(t))), 15); }
};

TEST_F(TierLaneFixture, ClickingAWordSelectsItsSpan) {
    QTest::mouseClick(&lane, Qt::LeftButton, {}, at(0.65));
    ASSERT_TRUE(view.selection());
    EXPECT_DOUBLE_EQ(view.selection()->start, 0.5);
    EXPECT_DOUBLE_EQ(view.selection()->end, 0.8);
    EXPECT_DOUBLE_EQ(view.cursor(), 0.5);
    // Shift-click on a later word widens the selection over both.
    QTest::mouseClick(&lane, Qt::LeftButton, Qt::ShiftModifier, at(1.2));
    ASSERT_TRUE(view.selection());
    EXPECT_DOUBLE_EQ(view.selection()->start, 0.5);
    EXPECT_DOUBLE_EQ(view.selection()->end, 1.4);
}

TEST_F(TierLaneFixture, DoubleClickAsksToPlayTheWord) {
    QSignalSpy play(&lane, &TierLane::playRequested);
    QTest::mouseDClick(&lane, Qt::LeftButton, {}, at(1.1));
    EXPECT_EQ(play.count(), 1);
    ASSERT_TRUE(view.selection());
    EXPECT_DOUBLE_EQ(view.selection()->start, 1.0);
}

TEST_F(TierLaneFixture, HoveringAWordShowsItsBoundariesAsGuides) {
    QMouseEvent move(QEvent::MouseMove, at(0.3), lane.mapToGlobal(at(0.3)), Qt::NoButton, Qt::NoButton, Qt::NoModifier);
    QApplication::sendEvent(&lane, &move);
    ASSERT_EQ(view.guides().size(), 2u);
    EXPECT_DOUBLE_EQ(view.guides()[0], 0.2);
    EXPECT_DOUBLE_EQ(view.guides()[1], 0.5);
}

TEST_F(TierLaneFixture, DraggingABoundaryReportsTheMovedTier) {
    QSignalSpy edits(&lane, &TierLane::editRequested);
    test::dragMouse(&lane, at(0.5), at(0.6));
    ASSERT_EQ(edits.count(), 1);
    const auto tier = edits.at(0).at(1).value<Tier>();
    EXPECT_NEAR(tier.intervals[0].endS, 0.6, 0.002);
    EXPECT_NEAR(tier.intervals[1].startS, 0.6, 0.002);
    EXPECT_DOUBLE_EQ(lane.tier().intervals[0].endS, 0.5);  // the lane waits for the window
}

TEST_F(TierLaneFixture, ALabelIsEditedInPlace) {
    QSignalSpy edits(&lane, &TierLane::editRequested);
    lane.editLabel(2);
    ASSERT_NE(lane.labelEditor(), nullptr);
    lane.labelEditor()->setText("later");
    QTest::keyClick(lane.labelEditor(), Qt::Key_Return);
    ASSERT_EQ(edits.count(), 1);
    EXPECT_EQ(edits.at(0).at(1).value<Tier>().intervals[2].label, "later");
}

Mark mark(MarkId id, double s, double e, MarkCategory c) {
    Mark m;
    m.id = id;
    m.startSeconds = s;
    m.endSeconds = e;
    m.category = c;
    return m;
}

struct MarkLaneFixture : ::testing::Test {
    ViewState view;
    MarkLane lane{&view};
    void SetUp() override {
        view.resetForDuration(2.0);
        lane.resize(Lane::gutterWidth + Lane::rightMargin + 1000, 34);
        lane.setTake(test::sampleTake().audio);
        lane.setMarks({mark(7, 0.4, 0.9, MarkCategory::Intonation), mark(9, 1.2, 1.5, MarkCategory::Artifact)});
        lane.show();
    }
    QPoint at(double t) const { return QPoint(static_cast<int>(std::lround(lane.xOf(t))), 17); }
};

TEST_F(MarkLaneFixture, ClickSelectsAMarkAndItsSpan) {
    QSignalSpy selected(&lane, &MarkLane::markSelected);
    QTest::mouseClick(&lane, Qt::LeftButton, {}, at(1.3));
    ASSERT_EQ(selected.count(), 1);
    EXPECT_EQ(selected.at(0).at(0).value<qint64>(), 9);
    EXPECT_EQ(lane.selectedMark(), 9);
    ASSERT_TRUE(view.selection());
    EXPECT_DOUBLE_EQ(view.selection()->start, 1.2);
    EXPECT_DOUBLE_EQ(view.selection()->end, 1.5);
}

TEST_F(MarkLaneFixture, DraggingAnEdgeReportsTheNewSpan) {
    QSignalSpy edited(&lane, &MarkLane::spanEdited);
    test::dragMouse(&lane, at(0.9), at(1.05));
    ASSERT_EQ(edited.count(), 1);
    EXPECT_EQ(edited.at(0).at(0).value<qint64>(), 7);
    EXPECT_NEAR(edited.at(0).at(1).toDouble(), 0.4, 1e-9);
    EXPECT_NEAR(edited.at(0).at(2).toDouble(), 1.05, 0.002);
}

TEST(SuspectLane, NamesTheSuspectUnderThePointer) {
    ViewState view;
    view.resetForDuration(2.0);
    SuspectLane lane(&view);
    lane.resize(Lane::gutterWidth + Lane::rightMargin + 1000, 26);
    Suspect s;
    s.name = "f0_range_st";
    s.reason = "F0 range 1.2 st is below 3 st: flat.";
    s.startSeconds = 0.3;
    s.endSeconds = 0.9;
    lane.setSuspects({s});
    const double x = Lane::gutterWidth + 0.6 * 500;
    ASSERT_NE(lane.suspectAt(x), nullptr);
    EXPECT_EQ(lane.suspectAt(Lane::gutterWidth + 1.5 * 500), nullptr);
    EXPECT_TRUE(lane.describePoint(QPoint(static_cast<int>(x), 10)).contains("flat"));
}

using test::differingPixels;
using test::distinctColours;

// Renders a lane with and without its spans; the spans must change many pixels in many colours.
void expectDrawsSpans(Lane& lane, const std::function<void()>& addSpans) {
    lane.resize(900, 40);
    lane.setTake(test::sampleTake().audio);
    lane.show();
    QApplication::processEvents();
    const QImage bare = lane.grab().toImage();
    addSpans();
    QApplication::processEvents();
    const QImage drawn = lane.grab().toImage();
    EXPECT_GE(distinctColours(drawn, lane.plotRect()), 6) << lane.id().toStdString();
    EXPECT_GT(differingPixels(drawn, bare), lane.plotRect().width()) << lane.id().toStdString();
}

TEST(SpanLanes, RenderNonBlankImages) {
    ViewState view;
    view.resetForDuration(test::sampleTake().audio->duration());
    TierLane tier("words", "Words", &view);
    expectDrawsSpans(tier, [&] { tier.setTier(words()); });
    MarkLane marks(&view);
    expectDrawsSpans(marks, [&] {
        marks.setMarks({mark(1, 0.2, 0.7, MarkCategory::Timing), mark(2, 1.0, 1.5, MarkCategory::Pronunciation)});
    });
    SuspectLane suspects(&view);
    expectDrawsSpans(suspects, [&] {
        Suspect s;
        s.name = "pause-too-long";
        s.startSeconds = 0.8;
        s.endSeconds = 1.3;
        suspects.setSuspects({s});
    });
}

}  // namespace
}  // namespace earmark::widgets
