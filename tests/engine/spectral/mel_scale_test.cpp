// hz ↔ mel against the published formulas and their known points:
// HTK (Young et al., The HTK Book): m = 2595·log10(1 + f/700);
// Slaney (Auditory Toolbox, 1998): 3f/200 below 1 kHz, then
// 15 + 27·ln(f/1000)/ln(6.4) — so 1 kHz is 15 mel and 6.4 kHz is 42 mel.
#include "earmark/spectral/mel.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace earmark {
namespace {

TEST(MelScale, SlaneyKnownPoints) {
    EXPECT_DOUBLE_EQ(hzToMel(0.0, MelScale::Slaney), 0.0);
    EXPECT_NEAR(hzToMel(500.0, MelScale::Slaney), 7.5, 1e-12);    // 3·500/200
    EXPECT_NEAR(hzToMel(1000.0, MelScale::Slaney), 15.0, 1e-12);  // the break point
    EXPECT_NEAR(hzToMel(6400.0, MelScale::Slaney), 42.0, 1e-12);  // 15 + 27·ln 6.4 / ln 6.4
    EXPECT_NEAR(hzToMel(8000.0, MelScale::Slaney), 15.0 + 27.0 * std::log(8.0) / std::log(6.4), 1e-12);
    EXPECT_NEAR(melToHz(15.0, MelScale::Slaney), 1000.0, 1e-9);
    EXPECT_NEAR(melToHz(42.0, MelScale::Slaney), 6400.0, 1e-9);
    EXPECT_NEAR(melToHz(7.5, MelScale::Slaney), 500.0, 1e-12);
}

TEST(MelScale, SlaneyIsContinuousAtOneKilohertz) {
    EXPECT_NEAR(hzToMel(999.999999, MelScale::Slaney), hzToMel(1000.000001, MelScale::Slaney), 1e-7);
    EXPECT_NEAR(melToHz(14.9999999, MelScale::Slaney), melToHz(15.0000001, MelScale::Slaney), 1e-4);
}

TEST(MelScale, HtkKnownPoints) {
    EXPECT_DOUBLE_EQ(hzToMel(0.0, MelScale::Htk), 0.0);
    // 2595·log10(1 + 1000/700) = 999.985…: the scale was fitted so 1 kHz ≈ 1000 mel.
    EXPECT_NEAR(hzToMel(1000.0, MelScale::Htk), 999.99, 0.01);
    EXPECT_NEAR(hzToMel(700.0, MelScale::Htk), 2595.0 * std::log10(2.0), 1e-9);  // 781.17…
    EXPECT_NEAR(melToHz(2595.0, MelScale::Htk), 700.0 * 9.0, 1e-6);             // 10^1 − 1
}

TEST(MelScale, RoundTripsOverTheAudioRange) {
    for (MelScale scale : {MelScale::Htk, MelScale::Slaney})
        for (double hz = 0.0; hz <= 24000.0; hz += 37.5)
            EXPECT_NEAR(melToHz(hzToMel(hz, scale), scale), hz, 1e-9 * std::max(1.0, hz)) << hz;
}

TEST(MelScale, BothScalesRiseMonotonically) {
    for (MelScale scale : {MelScale::Htk, MelScale::Slaney}) {
        double previous = -1.0;
        for (double hz = 0.0; hz <= 24000.0; hz += 10.0) {
            const double m = hzToMel(hz, scale);
            EXPECT_GT(m, previous) << hz;
            previous = m;
        }
    }
}

}  // namespace
}  // namespace earmark
