// The noise-floor rule of noise_floor.hpp: the model it rests on checked
// against YIN's own d′ (de Cheveigné & Kawahara, JASA 111(4), 2002, eq. 8,
// computed by YinFrame) on a sine in white noise of known power, and the
// floor, shares and bars on hand-made energies.
#include "earmark/pitch/noise_floor.hpp"
#include "earmark/pitch/yin_frame.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <numbers>
#include <random>
#include <vector>

namespace earmark {
namespace {

// A sine of power S in white noise of power N reads d′(T) ≈ N / (S + N) at its
// period T: the share of the frame's energy the noise explains.
TEST(NoiseFloor, DPrimeAtThePeriodIsTheNoiseShare) {
    const YinGeometry g = YinGeometry::forRange(16000, 60, 500);
    YinFrame yin(g);
    std::vector<float> d(static_cast<std::size_t>(yin.lags())), dn(d.size());
    const double period = 80.0;  // 200 Hz: an integer lag, no interpolation needed
    std::mt19937 gen(4);
    for (double snrDb : {10.0, 3.0, 0.0, -3.0}) {
        const double signalPower = 0.5 * 0.3 * 0.3;  // sine of amplitude 0.3
        const double noisePower = signalPower / std::pow(10.0, snrDb / 10.0);
        std::normal_distribution<double> noise(0.0, std::sqrt(noisePower));
        double sum = 0.0;
        constexpr int kFrames = 40;  // d′ of one frame scatters by up to ≈ 0.06 at these shares
        for (int f = 0; f < kFrames; ++f) {
            std::vector<float> x(static_cast<std::size_t>(g.span));
            for (std::size_t j = 0; j < x.size(); ++j)
                x[j] = static_cast<float>(0.3 * std::sin(2.0 * std::numbers::pi * static_cast<double>(j) / period) +
                                          noise(gen));
            yin.compute(x, d, dn);
            sum += dn[static_cast<std::size_t>(period)];
        }
        const double share = noisePower / (signalPower + noisePower);
        EXPECT_NEAR(sum / kFrames, share, 0.01 + 0.04 * share) << snrDb << " dB";
    }
}

TEST(NoiseFloor, SteadyFloorIsTheLowPercentile) {
    // 100 frames of noise within ±0.3 dB of −40 dB, 900 frames of "speech" well above.
    std::vector<float> e;
    for (int i = 0; i < 100; ++i) e.push_back(-40.0f + 0.3f * static_cast<float>(std::sin(i)));
    for (int i = 0; i < 900; ++i) e.push_back(-25.0f + 10.0f * static_cast<float>(i % 7) / 7.0f);
    const double floor = steadyNoiseFloorDb(e);
    EXPECT_NEAR(floor, -40.0, 0.3);
}

TEST(NoiseFloor, SpreadOutQuietFramesAreNoSteadyFloor) {
    // The quietest frames rise steadily, 1 dB per 1 % of frames, as in speech without pauses.
    std::vector<float> e;
    for (int i = 0; i < 1000; ++i) e.push_back(-60.0f + 0.1f * static_cast<float>(i));
    EXPECT_EQ(steadyNoiseFloorDb(e), -std::numeric_limits<double>::infinity());
    EXPECT_EQ(steadyNoiseFloorDb({}), -std::numeric_limits<double>::infinity());
    // Digital silence is steady: every share comes out 0.
    const std::vector<float> silent(200, -300.0f);
    EXPECT_EQ(steadyNoiseFloorDb(silent), -300.0);
}

TEST(NoiseFloor, SharesFollowTheExcessOverTheFloor) {
    const std::vector<float> e = {-30.0f, -30.5f, -29.2f, -20.0f, -27.0f, -300.0f};
    const auto rho = noiseShares(e, -30.0);
    EXPECT_EQ(rho[0], 0.0f);                  // at the floor
    EXPECT_EQ(rho[1], 0.0f);                  // below it
    EXPECT_EQ(rho[2], 0.0f);                  // 0.8 dB above: less than minExcessDb
    EXPECT_NEAR(rho[3], 0.1, 1e-6);           // 10 dB above
    EXPECT_NEAR(rho[4], std::pow(10.0, -0.3), 1e-6);
    EXPECT_EQ(rho[5], 0.0f);
    for (float r : noiseShares(e, -std::numeric_limits<double>::infinity())) EXPECT_EQ(r, 0.0f);
}

TEST(NoiseFloor, BarAsksThePeriodicPartWhatTheCleanBarAsks) {
    EXPECT_DOUBLE_EQ(barInNoise(0.0, 0.35, 0.6), 0.35);
    // ρ = 0.2: a periodic part with d′ = 0.35 reads 0.35·0.8 + 0.2 = 0.48.
    EXPECT_NEAR(barInNoise(0.2, 0.35, 0.6), 0.48, 1e-12);
    EXPECT_DOUBLE_EQ(barInNoise(0.9, 0.35, 0.6), 0.6);  // capped
    EXPECT_DOUBLE_EQ(barInNoise(0.5, 0.8, 0.6), 0.8);   // never below the clean bar
}

}  // namespace
}  // namespace earmark
