// Temporal matching of mark spans: hand-made cases whose answer follows from
// the documented rule (overlap or gap ≤ tolerance, one-to-one, largest
// overlap first), and the greedy matching's size against an exhaustive
// search on small random sets without chains.
#include "earmark/agreement/span_matching.hpp"
#include "earmark/core/error.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <functional>
#include <random>

namespace earmark::agreement {
namespace {

using Pairs = std::vector<std::pair<std::size_t, std::size_t>>;

TEST(MatchSpans, OverlapMatchesAndGapNeedsTolerance) {
    const std::vector<Span> a{{1.0, 2.0}, {5.0, 6.0}};
    const std::vector<Span> b{{1.5, 2.5}, {6.3, 7.0}};
    EXPECT_EQ(matchSpans(a, b, 0.0).pairs, (Pairs{{0, 0}}));
    EXPECT_EQ(matchSpans(a, b, 0.2).pairs, (Pairs{{0, 0}}));  // gap 0.3 s
    EXPECT_EQ(matchSpans(a, b, 0.3 + 1e-9).pairs, (Pairs{{0, 0}, {1, 1}}));
}

TEST(MatchSpans, OneToOneByLargestOverlap) {
    // B's span overlaps A's first span by 0.2 s and its second by 0.8 s: it goes to the second.
    const std::vector<Span> a{{0.0, 1.0}, {1.2, 2.5}};
    const std::vector<Span> b{{0.8, 2.0}};
    const SpanMatching m = matchSpans(a, b, 0.5);
    EXPECT_EQ(m.pairs, (Pairs{{1, 0}}));
    SpanTally t;
    t.add(a, b, m);
    EXPECT_EQ(t.matched, 1);
    EXPECT_EQ(t.onlyA(), 1);
    EXPECT_EQ(t.onlyB(), 0);
    EXPECT_DOUBLE_EQ(t.recall(), 0.5);
    EXPECT_DOUBLE_EQ(t.precision(), 1.0);
    EXPECT_DOUBLE_EQ(t.f1(), 2.0 / 3.0);
    EXPECT_NEAR(t.meanAbsStartDiffSeconds(), 0.4, 1e-12);
    EXPECT_NEAR(t.meanAbsEndDiffSeconds(), 0.5, 1e-12);
}

TEST(MatchSpans, EmptySidesGiveUndefinedFigures) {
    SpanTally t;
    t.add({}, {}, matchSpans({}, {}, 0.1));
    EXPECT_TRUE(std::isnan(t.recall()));
    EXPECT_TRUE(std::isnan(t.f1()));
    const std::vector<Span> a{{0.0, 1.0}};
    t.add(a, {}, matchSpans(a, {}, 0.1));
    EXPECT_DOUBLE_EQ(t.recall(), 0.0);
    EXPECT_TRUE(std::isnan(t.precision()));
}

// Largest one-to-one matching by exhaustive search (small sets only).
std::size_t bestMatchingSize(const std::vector<Span>& a, const std::vector<Span>& b, double tol) {
    std::vector<bool> used(b.size(), false);
    std::function<std::size_t(std::size_t)> go = [&](std::size_t i) -> std::size_t {
        if (i == a.size()) return 0;
        std::size_t best = go(i + 1);
        for (std::size_t j = 0; j < b.size(); ++j) {
            if (used[j]) continue;
            const double ov = std::min(a[i].endSeconds, b[j].endSeconds) - std::max(a[i].startSeconds, b[j].startSeconds);
            if (ov < -tol) continue;
            used[j] = true;
            best = std::max(best, 1 + go(i + 1));
            used[j] = false;
        }
        return best;
    };
    return go(0);
}

TEST(MatchSpans, GreedyFindsTheLargestMatchingWhenSpansDoNotChain) {
    std::mt19937 rng(7);
    std::uniform_real_distribution<double> jitter(-0.3, 0.3);
    for (int round = 0; round < 200; ++round) {
        // Spans 2 s apart, each rater's copy jittered: every B span can reach only its own A span.
        std::vector<Span> a, b;
        for (int k = 0; k < 5; ++k) {
            const double s = 2.0 * k;
            if (rng() % 4) a.push_back({s + jitter(rng) + 0.3, s + 1.0 + jitter(rng)});
            if (rng() % 4) b.push_back({s + jitter(rng) + 0.3, s + 1.0 + jitter(rng)});
        }
        const double tol = 0.1 * (rng() % 4);
        EXPECT_EQ(matchSpans(a, b, tol).pairs.size(), bestMatchingSize(a, b, tol)) << "round " << round;
    }
}

TEST(MatchSpans, RefusesBadInput) {
    EXPECT_THROW(matchSpans({}, {}, -0.1), ParamError);
    EXPECT_THROW(matchSpans({{2.0, 1.0}}, {}, 0.1), ParamError);
    EXPECT_THROW(matchSpans({}, {{0.0, NAN}}, 0.1), ParamError);
}

}  // namespace
}  // namespace earmark::agreement
