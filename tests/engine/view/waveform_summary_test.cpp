// The summary must give exactly what a scan of every sample gives (the naive
// oracle below), for any range, at every zoom.
#include "earmark/view/waveform_summary.hpp"

#include "earmark/core/error.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <random>

namespace earmark {
namespace {

MinMax scan(const std::vector<float>& x, std::int64_t a, std::int64_t b) {
    MinMax m;
    for (std::int64_t i = std::max<std::int64_t>(a, 0); i < std::min<std::int64_t>(b, x.size()); ++i)
        m.add(x[static_cast<std::size_t>(i)]);
    return m;
}

std::vector<float> randomSignal(std::size_t n, std::uint32_t seed) {
    std::mt19937 rng(seed);
    std::uniform_real_distribution<float> u(-1.0f, 1.0f);
    std::vector<float> x(n);
    for (auto& v : x) v = u(rng);
    return x;
}

TEST(WaveformSummary, EmptySignalHasNoLevelsAndEmptyRanges) {
    std::vector<float> x;
    const auto s = WaveformSummary::build(x);
    EXPECT_EQ(s.sampleCount(), 0);
    EXPECT_TRUE(s.levels().empty());
    EXPECT_TRUE(s.range(x, 0, 100).empty());
}

TEST(WaveformSummary, LevelsGrowByFactorUntilOneBlock) {
    const auto x = randomSignal(100000, 1);
    const auto s = WaveformSummary::build(x, {.firstBlockSamples = 64, .factor = 4});
    ASSERT_FALSE(s.levels().empty());
    EXPECT_EQ(s.levels().front().blockSamples, 64);
    EXPECT_EQ(s.levels().front().blocks.size(), (100000u + 63) / 64);
    for (std::size_t k = 1; k < s.levels().size(); ++k)
        EXPECT_EQ(s.levels()[k].blockSamples, s.levels()[k - 1].blockSamples * 4);
    EXPECT_EQ(s.levels().back().blocks.size(), 1u);
    const MinMax all = s.levels().back().blocks.front();
    const MinMax truth = scan(x, 0, 100000);
    EXPECT_EQ(all.min, truth.min);
    EXPECT_EQ(all.max, truth.max);
}

TEST(WaveformSummary, RangeMatchesScanForRandomSpans) {
    // Odd length so the last block of every level is partial.
    const auto x = randomSignal(123457, 2);
    const auto s = WaveformSummary::build(x, {.firstBlockSamples = 16, .factor = 3});
    std::mt19937 rng(5);
    std::uniform_int_distribution<std::int64_t> pos(-50, 123457 + 50);
    for (int trial = 0; trial < 3000; ++trial) {
        std::int64_t a = pos(rng), b = pos(rng);
        if (a > b) std::swap(a, b);
        const MinMax got = s.range(x, a, b);
        const MinMax want = scan(x, a, b);
        ASSERT_EQ(got.empty(), want.empty()) << a << ".." << b;
        if (!want.empty()) {
            ASSERT_EQ(got.min, want.min) << a << ".." << b;
            ASSERT_EQ(got.max, want.max) << a << ".." << b;
        }
    }
}

TEST(WaveformSummary, SinePeaksAppearInEveryColumnOfAFullPeriod) {
    // A 100 Hz sine at 8 kHz: each column of >= 80 samples holds a whole period,
    // so it must reach the sine's peak and trough.
    const Signal sig = test::sine(100.0, 1.0, 8000.0, 0.5);
    const auto s = WaveformSummary::build(sig.samples);
    const auto env = s.envelope(sig.samples, 0.0, 100.0, 80);
    ASSERT_EQ(env.size(), 80u);
    for (const auto& m : env) {
        EXPECT_NEAR(m.max, 0.5f, 1e-3f);
        EXPECT_NEAR(m.min, -0.5f, 1e-3f);
    }
}

TEST(WaveformSummary, EnvelopeColumnsTileTheRangeWithoutGaps) {
    const auto x = randomSignal(50000, 3);
    const auto s = WaveformSummary::build(x);
    const double start = 1234.5, spc = 37.3;
    const int columns = 600;
    const auto env = s.envelope(x, start, spc, columns);
    MinMax joined;
    for (const auto& m : env) joined.add(m);
    const MinMax truth = scan(x, 1234, static_cast<std::int64_t>(std::floor(start + columns * spc)));
    EXPECT_EQ(joined.min, truth.min);
    EXPECT_EQ(joined.max, truth.max);
}

TEST(WaveformSummary, ColumnsBeyondTheSignalAreEmpty) {
    const auto x = randomSignal(1000, 4);
    const auto s = WaveformSummary::build(x);
    const auto env = s.envelope(x, 900.0, 50.0, 4);
    EXPECT_FALSE(env[0].empty());
    EXPECT_FALSE(env[1].empty());
    EXPECT_TRUE(env[2].empty());
    EXPECT_TRUE(env[3].empty());
}

TEST(WaveformSummary, InvalidParametersNameTheField) {
    std::vector<float> x(10, 0.0f);
    try {
        WaveformSummary::build(x, {.firstBlockSamples = 1});
        FAIL() << "expected ParamError";
    } catch (const ParamError& e) {
        EXPECT_EQ(e.subject(), "WaveformSummaryParams.firstBlockSamples");
    }
    EXPECT_THROW(WaveformSummary::build(x, {.factor = 1}), ParamError);
    const auto s = WaveformSummary::build(x);
    EXPECT_THROW(s.envelope(x, 0.0, 0.0, 4), ParamError);
}

}  // namespace
}  // namespace earmark
