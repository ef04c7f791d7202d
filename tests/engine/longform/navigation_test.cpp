// Stepping through spans, revealing a span, and the drift traces; the
// expected values are worked out by hand from the rules in navigation.hpp.
#include "earmark/longform/navigation.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

namespace earmark {
namespace {

std::vector<NavSpan> sentences() {
    // Deliberately out of order: stepping sorts by start.
    return {{10.0, 14.0, "c"}, {0.5, 4.0, "a"}, {4.5, 9.0, "b"}, {15.0, 20.0, "d"}};
}

std::string labelAt(const std::vector<NavSpan>& s, std::optional<std::size_t> i) {
    return i ? s[*i].label : std::string("-");
}

TEST(StepSpan, NextGoesForwardInTimeOrder) {
    const auto s = sentences();
    std::string seen;
    double cursor = 0.0;
    while (auto i = stepSpan(s, cursor, 1)) {
        seen += s[*i].label;
        cursor = s[*i].startS;
    }
    EXPECT_EQ(seen, "abcd");
}

TEST(StepSpan, PreviousFromInsideASpanGoesToItsStartThenTheOneBefore) {
    const auto s = sentences();
    EXPECT_EQ(labelAt(s, stepSpan(s, 12.0, -1)), "c");   // inside c
    EXPECT_EQ(labelAt(s, stepSpan(s, 10.0, -1)), "b");   // at c's start
    EXPECT_EQ(labelAt(s, stepSpan(s, 10.0005, -1)), "b");  // within the slack of c's start
    EXPECT_EQ(labelAt(s, stepSpan(s, 0.5, -1)), "-");    // nothing before the first
    EXPECT_EQ(labelAt(s, stepSpan(s, 15.0, 1)), "-");    // nothing after the last
    EXPECT_EQ(labelAt(s, stepSpan(s, 12.0, 1)), "d");
}

TEST(StepSpan, SameStartTakesTheShorterFirst) {
    const std::vector<NavSpan> s{{5.0, 9.0, "long"}, {5.0, 5.01, "click"}, {1.0, 2.0, "early"}};
    EXPECT_EQ(labelAt(s, stepSpan(s, 3.0, 1)), "click");
    EXPECT_EQ(labelAt(s, stepSpan(s, 7.0, -1)), "long");  // the last of the tied pair in time order
}

TEST(StepSpan, EmptyListAndZeroDirection) {
    EXPECT_FALSE(stepSpan({}, 1.0, 1));
    EXPECT_FALSE(stepSpan(sentences(), 1.0, 0));
}

TEST(StepSpan, SpansOfTierAndFindings) {
    Tier t{"sentences", {{1.0, 2.0, "one", {}}, {2.5, 3.0, "two", {}}}};
    const auto st = spansOf(t);
    ASSERT_EQ(st.size(), 2u);
    EXPECT_EQ(st[1].label, "two");
    EXPECT_DOUBLE_EQ(st[1].startS, 2.5);
    Finding f;
    f.startS = 4.0;
    f.endS = 4.5;
    f.reason = "seam here";
    const auto sf = spansOf(std::vector<Finding>{f});
    ASSERT_EQ(sf.size(), 1u);
    EXPECT_EQ(sf[0].label, "seam here");
    EXPECT_DOUBLE_EQ(sf[0].endS, 4.5);
}

TEST(StepSpan, SentencesFallInTheParagraphHoldingTheirMiddle) {
    const std::vector<NavSpan> paragraphs{{0.5, 9.0, "p1"}, {10.0, 20.0, "p2"}};
    const std::vector<NavSpan> s{{0.5, 4.0, "a"}, {4.5, 9.0, "b"}, {9.5, 14.0, "c"}, {30.0, 31.0, "lost"}};
    EXPECT_EQ(containerOf(paragraphs, s), (std::vector<int>{0, 0, 1, -1}));
}

TEST(RevealSpan, KeepsTheViewWhenTheSpanIsInIt) {
    const ViewSpan v = revealSpan({10, 20}, {12, 13}, 100);
    EXPECT_DOUBLE_EQ(v.startS, 10);
    EXPECT_DOUBLE_EQ(v.endS, 20);
}

TEST(RevealSpan, CentresAShortSpanAtTheSameWidth) {
    const ViewSpan v = revealSpan({10, 20}, {50, 52}, 100);
    EXPECT_DOUBLE_EQ(v.startS, 46);
    EXPECT_DOUBLE_EQ(v.endS, 56);
}

TEST(RevealSpan, ZoomsOutToALongSpanWithATenthEachSide) {
    const ViewSpan v = revealSpan({10, 20}, {40, 60}, 100);
    EXPECT_DOUBLE_EQ(v.startS, 38);
    EXPECT_DOUBLE_EQ(v.endS, 62);
}

TEST(RevealSpan, ClampsToTheTakeKeepingTheWidth) {
    const ViewSpan a = revealSpan({50, 60}, {0.5, 1.0}, 100);
    EXPECT_DOUBLE_EQ(a.startS, 0);
    EXPECT_DOUBLE_EQ(a.endS, 10);
    const ViewSpan b = revealSpan({0, 10}, {99, 99.5}, 100);
    EXPECT_DOUBLE_EQ(b.startS, 90);
    EXPECT_DOUBLE_EQ(b.endS, 100);
    const ViewSpan c = revealSpan({0, 10}, {1, 99.9}, 100);
    EXPECT_DOUBLE_EQ(c.startS, 0);
    EXPECT_DOUBLE_EQ(c.endS, 100);
}

TEST(DriftTraces, OnePointPerWindowAtItsCentreNaNWhereNotMeasured) {
    LongTakeSeries s;
    WindowMeasures a;
    a.startS = 0;
    a.endS = 20;
    a.measured = true;
    a.speechLevelDb = -20;
    a.f0MedianHz = 110;
    a.f0RangeSt = 6;
    a.articulationRate = 4;
    a.timbreDistance = 0.5;
    WindowMeasures b = a;
    b.startS = 5;
    b.endS = 25;
    b.measured = false;
    WindowMeasures c = a;
    c.startS = 10;
    c.endS = 30;
    c.speechLevelDb = -26;
    s.windows = {a, b, c};
    const auto traces = driftTraces(s);
    ASSERT_EQ(traces.size(), 5u);
    EXPECT_EQ(traces[0].measure, "speech_level_dbfs");
    EXPECT_EQ(traces[4].measure, "timbre_distance");
    ASSERT_EQ(traces[0].values.size(), 3u);
    EXPECT_DOUBLE_EQ(traces[0].timesS[1], 15.0);
    EXPECT_TRUE(std::isnan(traces[0].values[1]));
    EXPECT_DOUBLE_EQ(traces[0].low, -26);
    EXPECT_DOUBLE_EQ(traces[0].high, -20);
    EXPECT_DOUBLE_EQ(traces[1].values[2], 110);
    const auto none = driftTraces(LongTakeSeries{});
    EXPECT_TRUE(none[0].values.empty());
    EXPECT_DOUBLE_EQ(none[0].low, 0);
}

TEST(DriftTraces, EveryFindingKindButSeamsHasItsTrace) {
    const auto traces = driftTraces(LongTakeSeries{});
    for (FindingKind k : {FindingKind::LevelDrift, FindingKind::PitchDrift, FindingKind::RateDrift, FindingKind::TimbreShift,
                          FindingKind::MonotoneStretch}) {
        const std::string m = driftTraceOf(k);
        EXPECT_TRUE(std::any_of(traces.begin(), traces.end(), [&](const DriftTrace& t) { return t.measure == m; }))
            << findingName(k);
    }
    EXPECT_EQ(driftTraceOf(FindingKind::Seam), "");
}

}  // namespace
}  // namespace earmark
