// Per-token durations (frames + hop size + sample rate): times follow from
// cumulative frame counts; pauses are tokens with empty text.
#include "earmark/tiers/token_durations.hpp"
#include "tier_matchers.hpp"

namespace earmark {
namespace {

using test::expectRowError;

TEST(TokenDurations, FramesBecomeSecondsCumulatively) {
    const char* text = R"({"hop_size": 256, "sample_rate": 22050, "tier": "phones",
        "tokens": [{"text": "", "frames": 10}, {"text": "h", "frames": 12}, {"text": "ə", "frames": 5},
                   {"text": "", "frames": 30}, {"text": "ʊ", "frames": 8}]})";
    const LoadedTimings t = parseTokenDurations(text, "d.json");
    ASSERT_EQ(t.tiers.tiers.size(), 1u);
    EXPECT_EQ(t.tiers.tiers[0].name, "phones");
    const auto& iv = t.tiers.tiers[0].intervals;
    ASSERT_EQ(iv.size(), 3u);
    const double f = 256.0 / 22050.0;
    EXPECT_DOUBLE_EQ(iv[0].startS, 10 * f);
    EXPECT_DOUBLE_EQ(iv[0].endS, 22 * f);
    EXPECT_EQ(iv[1].label, "ə");
    EXPECT_DOUBLE_EQ(iv[2].startS, 57 * f);
    EXPECT_DOUBLE_EQ(iv[2].endS, 65 * f);
}

TEST(TokenDurations, RoundTripOnTheFrameGrid) {
    const double f = 256.0 / 22050.0;
    Tier tier{"tokens", {{3 * f, 15 * f, "東", {}}, {15 * f, 20 * f, "京", {}}, {40 * f, 41 * f, "é", {}}}};
    const std::string text = tierToTokenDurations(tier, TokenDurationsParams{256, 22050}, 50 * f);
    const LoadedTimings back = parseTokenDurations(text, "mem.json");
    TierSet expected;
    expected.tiers.push_back(tier);
    ASSERT_EQ(back.tiers.tiers.size(), 1u);
    const auto& iv = back.tiers.tiers[0].intervals;
    ASSERT_EQ(iv.size(), 3u);
    for (std::size_t i = 0; i < 3; ++i) {
        EXPECT_NEAR(iv[i].startS, tier.intervals[i].startS, 1e-12);
        EXPECT_NEAR(iv[i].endS, tier.intervals[i].endS, 1e-12);
        EXPECT_EQ(iv[i].label, tier.intervals[i].label);
    }
    EXPECT_THAT(text, ::testing::HasSubstr(R"({"text":"","frames":3})"));
    EXPECT_THAT(text, ::testing::HasSubstr(R"({"text":"","frames":9})"));  // 41 → 50
}

TEST(TokenDurations, RoundingDoesNotBuildUp) {
    // 100 intervals of 0.0101 s at 100 frames/s: each alone would round to 1
    // frame (0.01 s) and drift by 10 ms in total; cumulative rounding keeps
    // the last boundary on its nearest frame.
    Tier tier{"tokens", {}};
    for (int i = 0; i < 100; ++i) tier.intervals.push_back({i * 0.0101, (i + 1) * 0.0101, "x", {}});
    const LoadedTimings back = parseTokenDurations(tierToTokenDurations(tier, TokenDurationsParams{160, 16000}), "m");
    EXPECT_NEAR(back.tiers.tiers[0].intervals.back().endS, 1.01, 1e-9);
}

TEST(TokenDurations, ZeroFrameTokensAreLeftOutWithAWarning) {
    const LoadedTimings t = parseTokenDurations(
        R"({"hop_size":160,"sample_rate":16000,"tokens":[{"text":"a","frames":2},{"text":"b","frames":0}]})", "z.json");
    EXPECT_EQ(t.tiers.tiers[0].intervals.size(), 1u);
    ASSERT_EQ(t.warnings.size(), 1u);
    EXPECT_THAT(t.warnings[0], ::testing::StartsWith("tokens[1]"));
}

TEST(TokenDurations, ErrorsNameTheTokenOrTheField) {
    expectRowError([] { parseTokenDurations(R"({"sample_rate":16000,"tokens":[]})", "e.json"); }, "e.json", "'hop_size'",
                   "whole number");
    expectRowError([] { parseTokenDurations(R"({"hop_size":160,"sample_rate":0,"tokens":[]})", "e.json"); }, "e.json",
                   "'sample_rate'", "positive");
    expectRowError(
        [] { parseTokenDurations(R"({"hop_size":160,"sample_rate":16000,"tokens":[{"text":"a","frames":1.5}]})", "e.json"); },
        "e.json", "tokens[0]", "'frames'");
    TimingsReadOptions opt;
    opt.takeDurationS = 0.1;
    expectRowError(
        [&] {
            parseTokenDurations(R"({"hop_size":160,"sample_rate":16000,"tokens":[{"text":"a","frames":5},{"text":"b","frames":20}]})",
                                "e.json", opt);
        },
        "e.json", "tokens[1]", "past the end of the audio");
    EXPECT_THROW(tierToTokenDurations(Tier{}, TokenDurationsParams{0, 16000}), ParamError);
}

}  // namespace
}  // namespace earmark
