// Progress and cancellation (earmark/core/progress.hpp): nested ranges add up
// to one bar, a stop from the callback surfaces as Cancelled, a default
// Progress reports to nobody. Also the error type's parts and the seconds
// format that every message uses.
#include "earmark/core/error.hpp"
#include "earmark/core/format.hpp"
#include "earmark/core/progress.hpp"

#include <gtest/gtest.h>

#include <vector>

namespace earmark {
namespace {

TEST(Progress, NestedRangesMapOntoTheCallersBar) {
    std::vector<double> seen;
    const Progress top([&](double f) {
        seen.push_back(f);
        return true;
    });
    const Progress second = top.sub(0.5, 1.0);     // the second half
    const Progress quarter = second.sub(0.5, 1.0);  // its second half: [0.75, 1]
    top.report(0.2);
    second.report(0.0);
    second.report(0.5);
    quarter.report(0.5);
    quarter.report(1.0);
    ASSERT_EQ(seen.size(), 5u);
    EXPECT_DOUBLE_EQ(seen[0], 0.2);
    EXPECT_DOUBLE_EQ(seen[1], 0.5);
    EXPECT_DOUBLE_EQ(seen[2], 0.75);
    EXPECT_DOUBLE_EQ(seen[3], 0.875);
    EXPECT_DOUBLE_EQ(seen[4], 1.0);
}

TEST(Progress, FractionsOutsideTheRangeAreHeldToIt) {
    std::vector<double> seen;
    const Progress part = Progress([&](double f) {
                              seen.push_back(f);
                              return true;
                          }).sub(0.2, 0.4);
    part.report(-1.0);
    part.report(7.0);
    part.sub(-3.0, 9.0).report(0.5);  // a child range is held inside its parent's
    ASSERT_EQ(seen.size(), 3u);
    EXPECT_DOUBLE_EQ(seen[0], 0.2);
    EXPECT_DOUBLE_EQ(seen[1], 0.4);
    EXPECT_DOUBLE_EQ(seen[2], 0.3);
}

TEST(Progress, AStopFromTheCallbackIsCancelledInEveryChild) {
    int calls = 0;
    const Progress stopAtThird([&](double) { return ++calls < 3; });
    EXPECT_NO_THROW(stopAtThird.report(0.1));
    EXPECT_NO_THROW(stopAtThird.sub(0.5, 1.0).report(0.1));
    EXPECT_THROW(stopAtThird.sub(0.5, 1.0).sub(0.0, 0.5).report(0.2), Cancelled);
    EXPECT_EQ(calls, 3);
    EXPECT_TRUE(stopAtThird.active());
}

TEST(Progress, DefaultReportsToNobodyAndNeverStops) {
    const Progress none;
    EXPECT_FALSE(none.active());
    EXPECT_NO_THROW(none.report(0.5));
    EXPECT_NO_THROW(none.sub(0.1, 0.2).report(1.0));
    EXPECT_FALSE(none.sub(0.1, 0.2).active());
}

TEST(Errors, SubjectAndProblemMakeTheMessage) {
    const InputError withFile("take.wav", "is not a WAV file");
    EXPECT_EQ(withFile.subject(), "take.wav");
    EXPECT_EQ(withFile.problem(), "is not a WAV file");
    EXPECT_STREQ(withFile.what(), "take.wav: is not a WAV file");
    const ParamError bare("", "must be positive");
    EXPECT_STREQ(bare.what(), "must be positive");
}

TEST(Format, SecondsHaveMillisecondPrecision) {
    EXPECT_EQ(formatSeconds(1.25), "1.250 s");
    EXPECT_EQ(formatSeconds(0.0004), "0.000 s");
    EXPECT_EQ(formatSeconds(3600.0), "3600.000 s");
}

}  // namespace
}  // namespace earmark
