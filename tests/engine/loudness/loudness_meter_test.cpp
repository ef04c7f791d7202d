#include "earmark/core/error.hpp"
#include "earmark/loudness/bs1770.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdint>
#include <limits>
#include <numbers>
#include <vector>

namespace earmark {
namespace {

double monoLufs(const Signal& s) {
    return integratedLoudnessLufs(s.samples.data(), static_cast<std::int64_t>(s.size()), s.sampleRate);
}

TEST(LoudnessMeter, SilenceIsMinusInfinity) {
    const double lufs = monoLufs(test::silence(5.0, 48000.0));
    EXPECT_TRUE(std::isinf(lufs) && lufs < 0);
}

TEST(LoudnessMeter, NothingFedIsMinusInfinity) {
    const LoudnessMeter meter(48000.0, 2);
    EXPECT_EQ(meter.integratedLufs(), -std::numeric_limits<double>::infinity());
}

TEST(LoudnessMeter, BelowAbsoluteGateIsMinusInfinity) {
    // A −75 dBFS sine reads about −78 LUFS: every block fails the −70 LKFS gate.
    const double lufs = monoLufs(test::sine(1000.0, 5.0, 48000.0, std::pow(10.0, -75.0 / 20.0)));
    EXPECT_EQ(lufs, -std::numeric_limits<double>::infinity());
}

TEST(LoudnessMeter, NeedsOneFull400MsBlock) {
    const double amplitude = std::pow(10.0, -20.0 / 20.0);
    EXPECT_EQ(monoLufs(test::sine(1000.0, 0.399, 48000.0, amplitude)), -std::numeric_limits<double>::infinity());
    // REFERENCES.md / BS.1770-4: a −20 dBFS 1 kHz mono sine reads ≈ −23.0 LUFS.
    EXPECT_NEAR(monoLufs(test::sine(1000.0, 0.400, 48000.0, amplitude)), -23.0, 0.1);
}

TEST(LoudnessMeter, RejectsInvalidRateAndChannels) {
    for (double rate : {0.0, -1.0, 1000.0, std::numeric_limits<double>::quiet_NaN()}) {
        try {
            LoudnessMeter meter(rate, 1);
            FAIL() << "no ParamError for rate " << rate;
        } catch (const ParamError& e) {
            EXPECT_EQ(e.subject(), "LoudnessMeter.sampleRate");
        }
    }
    for (int channels : {0, -2}) {
        try {
            LoudnessMeter meter(48000.0, channels);
            FAIL() << "no ParamError for channels " << channels;
        } catch (const ParamError& e) {
            EXPECT_EQ(e.subject(), "LoudnessMeter.channels");
        }
    }
    const float x[4] = {};
    EXPECT_THROW(integratedLoudnessLufs(x, 4, 0.0), ParamError);
    LoudnessMeter meter(48000.0, 1);
    EXPECT_THROW(meter.addInterleaved(x, -1), ParamError);
}

TEST(LoudnessMeter, NonFiniteSampleThrowsAndLeavesTheMeterUnchanged) {
    const Signal s = test::sine(1000.0, 2.0, 48000.0, 0.1);
    LoudnessMeter meter(48000.0, 1);
    meter.addInterleaved(s.samples.data(), 30000);
    std::vector<float> bad(1000, 0.1f);
    bad[500] = std::numeric_limits<float>::quiet_NaN();
    EXPECT_THROW(meter.addInterleaved(bad.data(), 1000), InputError);
    bad[500] = std::numeric_limits<float>::infinity();
    EXPECT_THROW(meter.addInterleaved(bad.data(), 1000), InputError);
    meter.addInterleaved(s.samples.data() + 30000, static_cast<std::int64_t>(s.size()) - 30000);
    EXPECT_DOUBLE_EQ(meter.integratedLufs(), monoLufs(s));
}

}  // namespace
}  // namespace earmark
