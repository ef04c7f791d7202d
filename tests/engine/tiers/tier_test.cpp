// The tier model's checks: every kind of bad row the issue names (past the end
// of the audio, end before start, duplicate boundaries, overlap, order) is an
// error naming the first bad interval; empty labels are warnings.
#include "earmark/core/error.hpp"
#include "earmark/tiers/tier.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <limits>

namespace earmark {
namespace {

using ::testing::HasSubstr;

Tier words(std::vector<Interval> intervals) { return Tier{"words", std::move(intervals)}; }

TEST(TierCheck, AcceptsSortedTouchingAndGappedIntervals) {
    const Tier t = words({{0.10, 0.40, "good", 0.9}, {0.40, 0.80, "morning", std::nullopt}, {1.2, 1.5, "all", 1.0}});
    const TierCheck c = checkTier(t, 2.0);
    EXPECT_FALSE(c.error);
    EXPECT_TRUE(c.warnings.empty());
}

struct BadCase {
    const char* name;
    std::vector<Interval> intervals;
    std::size_t badIndex;
    const char* problem;
};

class TierCheckBad : public ::testing::TestWithParam<BadCase> {};

TEST_P(TierCheckBad, NamesTheFirstBadInterval) {
    const auto& c = GetParam();
    const TierCheck check = checkTier(words(c.intervals), 3.0);
    ASSERT_TRUE(check.error) << c.name;
    EXPECT_EQ(check.error->index, c.badIndex) << c.name;
    EXPECT_THAT(check.error->problem, HasSubstr(c.problem)) << c.name;
}

const double kNaN = std::numeric_limits<double>::quiet_NaN();

INSTANTIATE_TEST_SUITE_P(
    Cases, TierCheckBad,
    ::testing::Values(
        BadCase{"past the end", {{0.1, 0.5, "a", {}}, {2.9, 3.4, "b", {}}}, 1, "past the end of the audio (3.000 s)"},
        BadCase{"end before start", {{0.1, 0.5, "a", {}}, {1.4, 1.2, "b", {}}}, 1, "ends (1.200 s) before it starts (1.400 s)"},
        BadCase{"zero length", {{0.5, 0.5, "a", {}}}, 0, "same boundary"},
        BadCase{"duplicate start", {{0.1, 0.5, "a", {}}, {0.1, 0.7, "b", {}}}, 1, "same boundary as the previous"},
        BadCase{"overlap", {{0.1, 0.5, "a", {}}, {0.4, 0.7, "b", {}}}, 1, "before the previous interval ends (0.500 s)"},
        BadCase{"out of order", {{1.0, 1.5, "a", {}}, {0.2, 0.4, "b", {}}}, 1, "out of time order"},
        BadCase{"negative start", {{-0.2, 0.4, "a", {}}}, 0, "before the start of the audio"},
        BadCase{"not a number", {{0.1, kNaN, "a", {}}}, 0, "not a finite number"},
        BadCase{"confidence", {{0.1, 0.2, "a", 1.5}}, 0, "confidence outside"}),
    [](const auto& info) {
        std::string n = info.param.name;
        for (char& ch : n)
            if (ch == ' ') ch = '_';
        return n;
    });

TEST(TierCheck, EmptyLabelsAreWarningsNotErrors) {
    const TierCheck c = checkTier(words({{0.1, 0.2, "", {}}, {0.2, 0.3, "b", {}}, {0.3, 0.4, "", {}}}), std::nullopt);
    EXPECT_FALSE(c.error);
    ASSERT_EQ(c.warnings.size(), 2u);
    EXPECT_EQ(c.warnings[0].index, 0u);
    EXPECT_EQ(c.warnings[1].index, 2u);
}

TEST(TierCheck, WithoutADurationNothingIsPastTheEnd) {
    EXPECT_FALSE(checkTier(words({{100.0, 200.0, "x", {}}}), std::nullopt).error);
}

TEST(TierCheck, SlackOfHalfAMillisecondIsClampedOntoTheTake) {
    TierSet set;
    set.durationS = 2.0;
    set.tiers.push_back(words({{-0.0002, 0.5, "a", {}}, {0.4998, 1.0, "b", {}}, {1.5, 2.0004, "c", {}}}));
    EXPECT_TRUE(validateTierSet(set, "t.json").empty());
    const auto& iv = set.tiers[0].intervals;
    EXPECT_EQ(iv[0].startS, 0.0);
    EXPECT_EQ(iv[1].startS, 0.5);
    EXPECT_EQ(iv[2].endS, 2.0);
}

TEST(ValidateTierSet, ErrorNamesSubjectTierIntervalAndLabel) {
    TierSet set;
    set.tiers.push_back(words({{0.1, 0.3, "ok", {}}}));
    set.tiers.push_back(Tier{"phones", {{0.1, 0.2, "k", {}}, {0.3, 0.25, "ay", {}}}});
    try {
        validateTierSet(set, "take.json", 1.0);
        FAIL() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "take.json");
        EXPECT_THAT(e.problem(), HasSubstr("tier 'phones', interval 2 ('ay') ends (0.250 s)"));
    }
}

TEST(ValidateTierSet, RejectsTwoTiersOfTheSameName) {
    TierSet set;
    set.tiers.push_back(words({}));
    set.tiers.push_back(words({}));
    EXPECT_THROW(validateTierSet(set, "x"), InputError);
}

TEST(ValidateTierSet, UsesTheSetsOwnDurationWhenNoneIsGiven) {
    TierSet set;
    set.durationS = 1.0;
    set.tiers.push_back(words({{0.5, 1.5, "long", {}}}));
    EXPECT_THROW(validateTierSet(set, "x"), InputError);
    EXPECT_NO_THROW(validateTierSet(set, "x", 2.0));
}

TEST(TierSet, FindAndGetOrAdd) {
    TierSet set;
    EXPECT_EQ(set.find("words"), nullptr);
    set.getOrAdd("words").intervals.push_back({0, 1, "a", {}});
    set.getOrAdd("phones");
    EXPECT_EQ(set.getOrAdd("words").intervals.size(), 1u);
    ASSERT_EQ(set.tiers.size(), 2u);
    EXPECT_EQ(set.tiers[1].name, "phones");
    EXPECT_NE(set.find("phones"), nullptr);
}

}  // namespace
}  // namespace earmark
