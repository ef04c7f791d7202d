// YIN's frame-level steps checked against the definitions in de Cheveigné &
// Kawahara, JASA 111(4), 2002, evaluated naively here as oracles: the
// difference function (step 2, their eq. 6), the cumulative-mean-normalised
// difference (step 3, eq. 8), the absolute threshold (step 4) and parabolic
// interpolation (step 5).
#include "earmark/core/error.hpp"
#include "earmark/pitch/yin_frame.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <random>
#include <vector>

namespace earmark {
namespace {

std::vector<float> voiceLikeFrame(const YinGeometry& g, double periodSamples, std::uint32_t seed) {
    std::mt19937 gen(seed);
    std::normal_distribution<float> noise(0.0f, 0.05f);
    std::vector<float> x(static_cast<std::size_t>(g.span));
    for (std::size_t j = 0; j < x.size(); ++j) {
        const double ph = 2.0 * std::numbers::pi * static_cast<double>(j) / periodSamples;
        x[j] = static_cast<float>(0.6 * std::sin(ph) + 0.3 * std::sin(2 * ph + 0.4) + 0.1 * std::sin(3 * ph)) + noise(gen);
    }
    return x;
}

TEST(YinGeometry, FollowsFromTheF0RangeAndRate) {
    const YinGeometry g = YinGeometry::forRange(16000, 60, 500);
    EXPECT_EQ(g.minLag, 32);           // floor(16000 / 500)
    EXPECT_EQ(g.maxLag, 268);          // ceil(16000 / 60) + 1
    EXPECT_EQ(g.window, g.maxLag);     // one longest period
    EXPECT_EQ(g.span, 268 + 268 + 1);  // W + maxLag + 1
    EXPECT_EQ(g.fftSize, 640);         // 5·2^7, the first fast size >= 537
    EXPECT_THROW(YinGeometry::forRange(16000, 500, 60), ParamError);
    EXPECT_THROW(YinGeometry::forRange(1000, 60, 500), ParamError);  // maxF0 above rate / 4
}

TEST(YinFrame, DifferenceMatchesTheDirectSumOfEquation6) {
    const YinGeometry g = YinGeometry::forRange(16000, 60, 500);
    YinFrame yin(g);
    std::vector<float> d(static_cast<std::size_t>(yin.lags())), dn(d.size());
    for (std::uint32_t seed : {1u, 2u, 3u}) {
        const auto x = voiceLikeFrame(g, 37.0 + 61.3 * seed, seed);
        yin.compute(x, d, dn);
        double energy = 0.0;
        for (int j = 0; j < g.window; ++j) energy += static_cast<double>(x[j]) * x[j];
        for (int tau = 0; tau < yin.lags(); ++tau) {
            double direct = 0.0;  // Σ_{j<W} (x_j − x_{j+τ})²
            for (int j = 0; j < g.window; ++j) {
                const double e = static_cast<double>(x[j]) - x[static_cast<std::size_t>(j + tau)];
                direct += e * e;
            }
            // float FFT round-off is relative to the frame's energy, not to d(τ)
            ASSERT_NEAR(d[static_cast<std::size_t>(tau)], direct, 2e-5 * energy) << "tau " << tau;
        }
    }
}

TEST(YinFrame, NormalisedDifferenceFollowsEquation8) {
    const YinGeometry g = YinGeometry::forRange(16000, 60, 500);
    YinFrame yin(g);
    std::vector<float> d(static_cast<std::size_t>(yin.lags())), dn(d.size());
    const auto x = voiceLikeFrame(g, 91.7, 5);
    yin.compute(x, d, dn);
    EXPECT_EQ(dn[0], 1.0f);
    double cumulative = 0.0;
    for (std::size_t tau = 1; tau < d.size(); ++tau) {
        cumulative += d[tau];
        EXPECT_NEAR(dn[tau], d[tau] * static_cast<double>(tau) / cumulative, 1e-5 * (1.0 + dn[tau])) << tau;
    }
    // The periodic signal dips close to 0 at its period (rounded lag 92).
    EXPECT_LT(dn[92], 0.05f);
}

TEST(YinFrame, SilenceGivesZeroDifferenceAndUnitNormalisedDifference) {
    const YinGeometry g = YinGeometry::forRange(16000, 60, 500);
    YinFrame yin(g);
    std::vector<float> d(static_cast<std::size_t>(yin.lags())), dn(d.size());
    const std::vector<float> x(static_cast<std::size_t>(g.span), 0.0f);
    yin.compute(x, d, dn);
    for (std::size_t tau = 0; tau < d.size(); ++tau) {
        EXPECT_EQ(d[tau], 0.0f);
        EXPECT_EQ(dn[tau], 1.0f);
    }
    EXPECT_EQ(yin.sumOfSquares(), 0.0);
}

TEST(YinFrame, RejectsWrongBufferSizes) {
    const YinGeometry g = YinGeometry::forRange(16000, 60, 500);
    YinFrame yin(g);
    std::vector<float> d(static_cast<std::size_t>(yin.lags())), dn(d.size());
    const std::vector<float> shortFrame(static_cast<std::size_t>(g.span - 1), 0.0f);
    EXPECT_THROW(yin.compute(shortFrame, d, dn), ParamError);
    const std::vector<float> x(static_cast<std::size_t>(g.span), 0.0f);
    std::vector<float> small(3);
    EXPECT_THROW(yin.compute(x, small, dn), ParamError);
}

TEST(YinDips, AbsoluteThresholdTakesTheFirstDipBelowItNotTheDeepest) {
    // Step 4: a dip at 20 (0.10) below the threshold comes before a deeper one at 40 (0.02).
    std::vector<float> dn(60, 0.9f), d(60, 1.0f);
    for (int t = 17; t <= 23; ++t) dn[static_cast<std::size_t>(t)] = 0.1f + 0.05f * static_cast<float>(std::abs(t - 20));
    for (int t = 37; t <= 43; ++t) dn[static_cast<std::size_t>(t)] = 0.02f + 0.05f * static_cast<float>(std::abs(t - 40));
    for (std::size_t t = 0; t < d.size(); ++t) d[t] = dn[t];
    EXPECT_NEAR(pickDip(d, dn, 5, 55, 0.15f).lag, 20.0f, 1e-6);
    // Above every dip: the global minimum.
    EXPECT_NEAR(pickDip(d, dn, 5, 55, 0.01f).lag, 40.0f, 1e-6);
    EXPECT_NEAR(pickDip(d, dn, 5, 55, 0.01f).aperiodicity, 0.02f, 1e-6);
}

TEST(YinDips, ParabolicInterpolationFindsTheVertex) {
    // Step 5 on d(τ) = (τ − 30.3)² + 1: vertex at 30.3.
    std::vector<float> d(50), dn(50);
    for (std::size_t t = 0; t < d.size(); ++t) {
        d[t] = static_cast<float>((static_cast<double>(t) - 30.3) * (static_cast<double>(t) - 30.3) + 1.0);
        dn[t] = 0.5f * d[t] / 100.0f;
    }
    const YinDip dip = interpolateDip(d, dn, 30);
    EXPECT_NEAR(dip.lag, 30.3f, 1e-4);
    EXPECT_NEAR(dip.aperiodicity, 0.005f, 1e-5);  // dn's own parabola at the vertex
}

TEST(YinDips, DeepestDipsAreSortedAndSkipTheChosenOne) {
    std::vector<float> dn(80, 0.9f);
    const std::pair<int, float> dips[] = {{20, 0.3f}, {40, 0.1f}, {60, 0.2f}, {70, 0.5f}};
    for (auto [lag, v] : dips) dn[static_cast<std::size_t>(lag)] = v;
    const std::vector<float> d(dn);
    YinDip out[2];
    ASSERT_EQ(deepestDips(d, dn, 5, 75, 40.0f, out), 2);
    EXPECT_NEAR(out[0].lag, 60.0f, 1e-6);  // 40 is excluded as the chosen one
    EXPECT_NEAR(out[1].lag, 20.0f, 1e-6);
}

TEST(YinDips, CentredRefinementRecoversASinePeriod) {
    const double period = 123.4;
    std::vector<float> x(4000);
    for (std::size_t j = 0; j < x.size(); ++j)
        x[j] = static_cast<float>(std::sin(2.0 * std::numbers::pi * static_cast<double>(j) / period));
    const float lag = refineLagCentred(x, 2000.0, 268, 124.6f);  // a first guess 1.2 lags off
    EXPECT_NEAR(lag, period, 0.02);
    // Too close to the edge: the guess comes back unchanged.
    EXPECT_EQ(refineLagCentred(x, 50.0, 268, 124.6f), 124.6f);
}

}  // namespace
}  // namespace earmark
