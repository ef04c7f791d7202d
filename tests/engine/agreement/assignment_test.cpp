// Dividing takes among raters: disjoint splits, overlaps for agreement,
// balanced loads, and the same draw for the same seed.
#include "earmark/agreement/assignment.hpp"
#include "earmark/core/error.hpp"

#include <gtest/gtest.h>

#include <map>
#include <numeric>
#include <set>

namespace earmark::agreement {
namespace {

std::vector<TakeId> takesUpTo(int n) {
    std::vector<TakeId> t(static_cast<std::size_t>(n));
    std::iota(t.begin(), t.end(), 1);
    return t;
}

std::map<TakeId, std::set<std::string>> byTake(const std::vector<Assignment>& a) {
    std::map<TakeId, std::set<std::string>> out;
    for (const Assignment& x : a) EXPECT_TRUE(out[x.takeId].insert(x.rater).second) << "rater twice on a take";
    return out;
}

std::map<std::string, int> loads(const std::vector<Assignment>& a) {
    std::map<std::string, int> out;
    for (const Assignment& x : a) ++out[x.rater];
    return out;
}

void expectBalanced(const std::vector<Assignment>& a) {
    const auto l = loads(a);
    int lo = 1 << 30, hi = 0;
    for (const auto& [r, n] : l) lo = std::min(lo, n), hi = std::max(hi, n);
    EXPECT_LE(hi - lo, 1);
}

TEST(AssignTakes, ASplitGivesEveryTakeToOneRater) {
    const auto a = assignTakes(takesUpTo(100), {.raters = {"ann", "bo", "cy"}, .seed = 5});
    ASSERT_EQ(a.size(), 100u);
    const auto t = byTake(a);
    EXPECT_EQ(t.size(), 100u);
    for (const auto& [take, who] : t) EXPECT_EQ(who.size(), 1u);
    expectBalanced(a);
    EXPECT_EQ(loads(a).size(), 3u);
}

TEST(AssignTakes, AnOverlapSharesTheGivenShareOfTakes) {
    const AssignmentParams p{.raters = {"ann", "bo", "cy", "di"}, .overlapFraction = 0.25, .ratersPerSharedTake = 2,
                             .seed = 9};
    const auto a = assignTakes(takesUpTo(40), p);
    const auto t = byTake(a);
    ASSERT_EQ(t.size(), 40u);
    int shared = 0;
    for (const auto& [take, who] : t) {
        EXPECT_TRUE(who.size() == 1 || who.size() == 2);
        shared += who.size() == 2;
    }
    EXPECT_EQ(shared, 10);
    EXPECT_EQ(a.size(), 50u);
    expectBalanced(a);
    // Everyone on every take when the share is 1 and the count is "all".
    const auto all = assignTakes(takesUpTo(7), {.raters = {"ann", "bo", "cy"}, .overlapFraction = 1.0});
    for (const auto& [take, who] : byTake(all)) EXPECT_EQ(who.size(), 3u);
}

TEST(AssignTakes, TheSameSeedGivesTheSameDraw) {
    const AssignmentParams p{.raters = {"ann", "bo", "cy"}, .overlapFraction = 0.3, .seed = 42};
    EXPECT_EQ(assignTakes(takesUpTo(30), p), assignTakes(takesUpTo(30), p));
    AssignmentParams reordered = p;
    reordered.raters = {"cy", "ann", "bo"};
    EXPECT_EQ(assignTakes(takesUpTo(30), p), assignTakes(takesUpTo(30), reordered));
    AssignmentParams other = p;
    other.seed = 43;
    EXPECT_NE(assignTakes(takesUpTo(30), p), assignTakes(takesUpTo(30), other));
}

TEST(AssignTakes, OutputFollowsTheTakesOrder) {
    const std::vector<TakeId> takes{7, 3, 9, 3};
    const auto a = assignTakes(takes, {.raters = {"ann", "bo"}});
    ASSERT_EQ(a.size(), 3u);
    EXPECT_EQ(a[0].takeId, 7);
    EXPECT_EQ(a[1].takeId, 3);
    EXPECT_EQ(a[2].takeId, 9);
}

TEST(AssignTakes, RefusesBadParameters) {
    EXPECT_THROW(assignTakes(takesUpTo(3), {}), ParamError);
    EXPECT_THROW(assignTakes(takesUpTo(3), {.raters = {"ann", "ann"}}), ParamError);
    EXPECT_THROW(assignTakes(takesUpTo(3), {.raters = {"ann", " "}}), ParamError);
    EXPECT_THROW(assignTakes(takesUpTo(3), {.raters = {"ann", "bo"}, .overlapFraction = 1.5}), ParamError);
    EXPECT_THROW(assignTakes(takesUpTo(3), {.raters = {"ann"}, .overlapFraction = 0.5}), ParamError);
    EXPECT_THROW(assignTakes(takesUpTo(3), {.raters = {"ann", "bo"}, .overlapFraction = 0.5, .ratersPerSharedTake = 3}),
                 ParamError);
}

}  // namespace
}  // namespace earmark::agreement
