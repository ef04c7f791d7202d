// Shared pieces of the timings tests: a tier set with UTF-8 labels, exact
// comparison, and a check that an InputError names the file and the row.
#pragma once

#include "earmark/core/error.hpp"
#include "earmark/tiers/tier.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <string>

namespace earmark::test {

// Words and phones with accented Latin, CJK, emoji and characters that need
// quoting in CSV (comma, quote) or escaping in WebVTT (&, <).
inline TierSet sampleTierSet(bool withConfidence) {
    TierSet set;
    set.durationS = 4.0;
    auto conf = [&](double c) { return withConfidence ? std::optional<double>(c) : std::nullopt; };
    set.tiers.push_back(Tier{"words",
                             {{0.25, 0.61, "Café", conf(0.93)},
                              {0.61, 1.087, "naïve,", conf(0.5)},
                              {1.5, 2.0, "東京", conf(0.125)},
                              {2.0, 2.25, "say \"hi\"", conf(1.0)},
                              {2.5, 3.125, "R&D <now>", conf(0.0)},
                              {3.125, 3.5, "🙂", conf(0.75)}}});
    set.tiers.push_back(Tier{"phones", {{0.25, 0.3, "k", {}}, {0.3, 0.45, "æ", {}}, {0.45, 0.61, "feɪ", {}}}});
    return set;
}

inline void expectSameTiers(const TierSet& a, const TierSet& b) {
    ASSERT_EQ(a.tiers.size(), b.tiers.size());
    for (std::size_t t = 0; t < a.tiers.size(); ++t) {
        EXPECT_EQ(a.tiers[t].name, b.tiers[t].name);
        ASSERT_EQ(a.tiers[t].intervals.size(), b.tiers[t].intervals.size()) << a.tiers[t].name;
        for (std::size_t i = 0; i < a.tiers[t].intervals.size(); ++i) {
            const Interval& x = a.tiers[t].intervals[i];
            const Interval& y = b.tiers[t].intervals[i];
            EXPECT_EQ(x.startS, y.startS) << a.tiers[t].name << "[" << i << "]";
            EXPECT_EQ(x.endS, y.endS) << a.tiers[t].name << "[" << i << "]";
            EXPECT_EQ(x.label, y.label) << a.tiers[t].name << "[" << i << "]";
            EXPECT_EQ(x.confidence, y.confidence) << a.tiers[t].name << "[" << i << "]";
        }
    }
}

// Runs fn, which must throw InputError with subject `source` and a problem containing `where` and `what`.
template <typename Fn>
void expectRowError(Fn fn, const std::string& source, const std::string& where, const std::string& what) {
    try {
        fn();
        ADD_FAILURE() << "expected InputError at " << where;
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), source);
        EXPECT_THAT(e.problem(), ::testing::StartsWith(where));
        EXPECT_THAT(e.problem(), ::testing::HasSubstr(what));
    }
}

}  // namespace earmark::test
