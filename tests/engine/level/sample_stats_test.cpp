#include "earmark/core/error.hpp"
#include "earmark/level/sample_stats.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <vector>

namespace earmark {
namespace {

SampleStats measure(const std::vector<float>& x, int channels, std::int64_t block, double clipLevel = 0.999) {
    SampleStatsMeter meter(channels, clipLevel);
    const auto frames = static_cast<std::int64_t>(x.size()) / channels;
    for (std::int64_t at = 0; at < frames; at += block)
        meter.addInterleaved(x.data() + at * channels, std::min(block, frames - at));
    return meter.result();
}

TEST(SampleStats, HalfAmplitudeSinePeaksAtMinus6Dbfs) {
    // 1 kHz at 48 kHz puts a sample on every crest, so the sample peak is exactly
    // 0.5: 20·log10(0.5) = −6.0206 dBFS (sample-peak dBFS, full scale 1.0:
    // common practice).
    const Signal s = test::sine(1000.0, 1.0, 48000.0, 0.5);
    const SampleStats st = measure(s.samples, 1, 1000);
    EXPECT_NEAR(st.samplePeak, 0.5, 1e-7);
    EXPECT_NEAR(st.samplePeakDbfs, -6.0206, 1e-3);
    EXPECT_EQ(st.clippedSamples, 0);
    EXPECT_EQ(st.samples, 48000);
}

TEST(SampleStats, CountsHardClippedSamples) {
    // A 1.6-amplitude sine hard-clipped at ±1.0; the truth is counted here on the
    // unclipped values. Stereo, fed in odd blocks.
    const Signal raw = test::sine(437.0, 1.0, 44100.0, 1.6);
    std::vector<float> x;
    std::int64_t truth = 0;
    for (float v : raw.samples) {
        truth += std::fabs(v) >= 1.0f ? 2 : 0;   // both channels
        const float c = std::clamp(v, -1.0f, 1.0f);
        x.push_back(c);
        x.push_back(-c);
    }
    ASSERT_GT(truth, 1000);
    for (std::int64_t block : {1, 37, 4095}) {
        SCOPED_TRACE(block);
        const SampleStats st = measure(x, 2, block, 1.0);
        EXPECT_EQ(st.clippedSamples, truth);
        EXPECT_EQ(st.samplePeak, 1.0);
        EXPECT_EQ(st.samplePeakDbfs, 0.0);
    }
    // The default level (0.999) also counts the near misses in [0.999, 1).
    std::int64_t nearMiss = 0;
    for (float v : raw.samples) nearMiss += (std::fabs(v) >= 0.999f && std::fabs(v) < 1.0f) ? 2 : 0;
    ASSERT_GT(nearMiss, 0);
    EXPECT_EQ(measure(x, 2, 4095).clippedSamples, truth + nearMiss);
}

TEST(SampleStats, DcOffsetOfOffsetSine) {
    // Whole periods of a sine average to zero, so the mean is the 0.1 offset.
    Signal s = test::sine(1000.0, 2.0, 48000.0, 0.5);
    for (float& v : s.samples) v += 0.1f;
    const SampleStats st = measure(s.samples, 1, 4095);
    EXPECT_NEAR(st.dcOffset, 0.1, 1e-6);
    EXPECT_NEAR(st.samplePeak, 0.6, 1e-6);
}

TEST(SampleStats, EmptyAndSilent) {
    const SampleStats empty = SampleStatsMeter(2).result();
    EXPECT_EQ(empty.samples, 0);
    EXPECT_EQ(empty.dcOffset, 0.0);
    EXPECT_TRUE(std::isinf(empty.samplePeakDbfs) && empty.samplePeakDbfs < 0);
    const SampleStats silent = measure(test::silence(1.0, 16000.0).samples, 1, 37);
    EXPECT_EQ(silent.samplePeak, 0.0);
    EXPECT_TRUE(std::isinf(silent.samplePeakDbfs) && silent.samplePeakDbfs < 0);
}

TEST(SampleStats, InvalidParamsNameTheField) {
    try {
        SampleStatsMeter meter(0);
        FAIL() << "no ParamError";
    } catch (const ParamError& e) {
        EXPECT_EQ(e.subject(), "SampleStatsMeter.channels");
    }
    try {
        SampleStatsMeter meter(1, 0.0);
        FAIL() << "no ParamError";
    } catch (const ParamError& e) {
        EXPECT_EQ(e.subject(), "SampleStatsMeter.clipLevel");
    }
}

}  // namespace
}  // namespace earmark
