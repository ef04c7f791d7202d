// The F0 search range is a promise: no F0 outside [minF0Hz, maxF0Hz], and a
// signal whose period lies outside it (or that has none, like DC) is not
// given a subharmonic or a chance dip as its pitch.
#include "earmark/pitch/yin.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <algorithm>

namespace earmark {
namespace {

int voicedFrames(const PitchTrack& t) {
    return static_cast<int>(std::count_if(t.f0Hz.begin(), t.f0Hz.end(), [](float f) { return f > 0; }));
}

TEST(YinRange, PureDcHasNoPitch) {
    // d(τ) of a constant is 0 at every lag (de Cheveigné & Kawahara 2002, eq. 6):
    // nothing repeats, so nothing is voiced.
    for (const float level : {0.1f, 0.5f, -0.9f}) {
        Signal dc = test::silence(1.0, 16000.0);
        std::fill(dc.samples.begin(), dc.samples.end(), level);
        EXPECT_EQ(voicedFrames(analysePitch(dc, {})), 0) << "DC at " << level;
    }
}

TEST(YinRange, AToneAboveTheRangeIsNotGivenItsSubharmonic) {
    PitchParams params;
    params.maxF0Hz = 500;
    const PitchTrack t = analysePitch(test::sine(1000.0, 1.0, 16000.0, 0.5), params);
    EXPECT_EQ(voicedFrames(t), 0);
    for (float f : t.f0Hz) EXPECT_LE(f, params.maxF0Hz);
}

TEST(YinRange, AToneJustInsideTheRangeKeepsItsPitch) {
    PitchParams params;
    params.maxF0Hz = 500;
    const PitchTrack t = analysePitch(test::sine(490.0, 1.0, 16000.0, 0.5), params);
    ASSERT_GT(voicedFrames(t), 150);
    for (float f : t.f0Hz)
        if (f > 0) {
            EXPECT_NEAR(f, 490.0, 2.0);
            EXPECT_LE(f, params.maxF0Hz);
        }
}

}  // namespace
}  // namespace earmark
