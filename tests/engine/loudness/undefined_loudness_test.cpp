// Below 3364 Hz BS.1770's K-weighting shelf (≈ 1.7 kHz) lies above Nyquist:
// loudness is undefined there, and the analysis says so instead of failing.
#include "earmark/analysis/take_analysis.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/loudness/bs1770.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace earmark {
namespace {

TEST(UndefinedLoudness, BelowTheKWeightingRateTheTakeIsStillAnalysed) {
    const Signal tone = test::sine(200.0, 1.0, 3000.0, 0.5);
    AnalysisParams params;
    const TakeAnalysis fromSignal = analyseSignal(tone, params);
    ASSERT_TRUE(fromSignal.loudnessLufs);
    EXPECT_TRUE(std::isnan(*fromSignal.loudnessLufs));

    test::TempDir dir;
    writeWav(dir.file("low.wav"), tone);
    const TakeAnalysis fromFile = analyseFile(dir.file("low.wav"), params);
    ASSERT_TRUE(fromFile.loudnessLufs);
    EXPECT_TRUE(std::isnan(*fromFile.loudnessLufs));
    ASSERT_TRUE(fromFile.pitchSummary.medianHz);
    EXPECT_NEAR(*fromFile.pitchSummary.medianHz, 200.0, 1.0);  // the rest is measured as usual
    EXPECT_LT(3000.0, kMinKWeightingRateHz);
}

}  // namespace
}  // namespace earmark
