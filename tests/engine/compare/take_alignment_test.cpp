// Frame alignment of two takes on synthetic feature sequences whose true
// warping is known: B is A played back along a known time map.
#include "earmark/compare/take_alignment.hpp"
#include "earmark/core/error.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace earmark {
namespace {

// A smooth 4-dimensional trajectory (distinct at every time), 5 ms frames.
std::vector<float> trajectory(double t) {
    return {static_cast<float>(std::sin(2.1 * t)), static_cast<float>(std::cos(3.3 * t)),
            static_cast<float>(std::sin(5.7 * t + 1.0)), static_cast<float>(t)};
}

FeatureMatrix sample(int frames, double (*sourceTime)(double)) {
    FeatureMatrix m;
    m.frames = frames;
    m.dims = 4;
    m.hopSeconds = 0.005;
    for (int i = 0; i < frames; ++i)
        for (float v : trajectory(sourceTime(i * 0.005))) m.values.push_back(v);
    return m;
}

double same(double t) { return t; }
// B runs 25 % slower in its first half, then faster to end with A: t_A = map(t_B).
double slowFirstHalf(double tb) { return tb < 1.25 ? tb * 0.8 : 1.0 + (tb - 1.25) * 4.0 / 3.0; }

TEST(TakeAlignment, FrameWisePathFollowsAKnownWarp) {
    const FeatureMatrix a = sample(400, same);           // 2.0 s
    const FeatureMatrix b = sample(400, slowFirstHalf);  // also 2.0 s, warped
    const TakeAlignment al = alignFrameWise(a, b, 0.0, 1.995, 0.0, 1.995);
    EXPECT_EQ(al.method, AlignmentMethod::FrameWise);
    ASSERT_FALSE(al.pairs.empty());
    double worst = 0.0;
    for (const FramePair& p : al.pairs) worst = std::max(worst, std::abs(slowFirstHalf(p.b * 0.005) - p.a * 0.005));
    EXPECT_LT(worst, 0.011);  // within two frames of the true map
    // mapTime follows the map too.
    EXPECT_NEAR(mapTime(al, 0.8), 1.0, 0.01);
    EXPECT_NEAR(mapTime(al, 1.0, /*fromB=*/true), 0.8, 0.01);
}

TEST(TakeAlignment, WordByWordKeepsEveryWordBoundary) {
    const FeatureMatrix a = sample(400, same);
    const FeatureMatrix b = sample(400, slowFirstHalf);
    // The same three "words" in both, at matching times of the map.
    const Tier wa{"words", {{0.1, 0.5, "one", {}}, {0.6, 1.0, "two", {}}, {1.2, 1.9, "three", {}}}};
    const Tier wb{"words", {{0.125, 0.625, "one", {}}, {0.75, 1.25, "two", {}}, {1.4, 1.925, "three", {}}}};
    const TakeAlignment al = alignWordByWord(a, b, wa, wb);
    EXPECT_EQ(al.method, AlignmentMethod::WordByWord);
    for (std::size_t w = 0; w < 3; ++w) {
        // First and last pair inside each word sit on its boundary frames.
        const int a0 = static_cast<int>(std::ceil(wa.intervals[w].startS / 0.005 - 1e-9));
        const int b0 = static_cast<int>(std::ceil(wb.intervals[w].startS / 0.005 - 1e-9));
        bool found = false;
        for (const FramePair& p : al.pairs) found = found || (p.a == a0 && p.b == b0);
        EXPECT_TRUE(found) << w;
    }
    for (std::size_t k = 1; k < al.pairs.size(); ++k) {
        EXPECT_GE(al.pairs[k].a, al.pairs[k - 1].a);
        EXPECT_GE(al.pairs[k].b, al.pairs[k - 1].b);
    }
    // The pause between "two" and "three" (0.2 s in A, 0.15 s in B) is aligned too.
    bool pause = false;
    for (const FramePair& p : al.pairs) pause = pause || (p.a * 0.005 > 1.05 && p.a * 0.005 < 1.15);
    EXPECT_TRUE(pause);
}

TEST(TakeAlignment, CarriedTierFollowsThePath) {
    const FeatureMatrix a = sample(400, same);
    const FeatureMatrix b = sample(400, slowFirstHalf);
    const TakeAlignment al = alignFrameWise(a, b, 0.0, 1.995, 0.0, 1.995);
    const Tier wa{"words", {{0.2, 0.6, "one", 0.9}, {0.6, 1.4, "two", {}}}};
    const Tier carried = carryTier(wa, al, 2.0);
    ASSERT_EQ(carried.intervals.size(), 2u);
    EXPECT_NEAR(carried.intervals[0].startS, 0.25, 0.01);
    EXPECT_NEAR(carried.intervals[0].endS, 0.75, 0.01);
    EXPECT_NEAR(carried.intervals[1].endS, 1.55, 0.01);  // 1.25 + 0.4·0.75
    EXPECT_EQ(carried.intervals[0].label, "one");
    EXPECT_EQ(carried.intervals[0].confidence, 0.9);
}

TEST(TakeAlignment, MismatchedWordCountsAndBadParamsAreRefused) {
    const FeatureMatrix a = sample(100, same);
    const Tier one{"words", {{0.1, 0.2, "x", {}}}};
    const Tier two{"words", {{0.1, 0.2, "x", {}}, {0.2, 0.3, "y", {}}}};
    EXPECT_THROW(alignWordByWord(a, a, one, two), InputError);
    TakeAlignParams p;
    p.maxBandRadiusSeconds = 0.1;
    EXPECT_THROW(alignFrameWise(a, a, 0, 0.4, 0, 0.4, p), ParamError);
    FeatureMatrix other = a;
    other.hopSeconds = 0.01;
    EXPECT_THROW(alignFrameWise(a, other, 0, 0.4, 0, 0.4), ParamError);
}

}  // namespace
}  // namespace earmark
