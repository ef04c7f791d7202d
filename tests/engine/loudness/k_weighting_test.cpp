#include "earmark/core/error.hpp"
#include "earmark/loudness/bs1770.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <limits>
#include <numbers>

namespace earmark {
namespace {

// ITU-R BS.1770-4, Annex 1, Table 1 (stage 1, shelf) and Table 2 (stage 2,
// RLB high-pass): coefficients at 48 kHz.
TEST(KWeighting, Reproduces48kHzTablesOfBs1770) {
    const KWeighting k = kWeighting(48000.0);
    constexpr double tol = 1e-6;
    EXPECT_NEAR(k.shelf.b0, 1.53512485958697, tol);
    EXPECT_NEAR(k.shelf.b1, -2.69169618940638, tol);
    EXPECT_NEAR(k.shelf.b2, 1.19839281085285, tol);
    EXPECT_NEAR(k.shelf.a1, -1.69065929318241, tol);
    EXPECT_NEAR(k.shelf.a2, 0.73248077421585, tol);
    EXPECT_NEAR(k.highPass.b0, 1.0, tol);
    EXPECT_NEAR(k.highPass.b1, -2.0, tol);
    EXPECT_NEAR(k.highPass.b2, 1.0, tol);
    EXPECT_NEAR(k.highPass.a1, -1.99004745483398, tol);
    EXPECT_NEAR(k.highPass.a2, 0.99007225036621, tol);
}

double gainDb(const Biquad& q, double f, double rate) {
    const std::complex<double> z1 = std::polar(1.0, -2.0 * std::numbers::pi * f / rate);
    const std::complex<double> z2 = z1 * z1;
    return 20.0 * std::log10(std::abs((q.b0 + q.b1 * z1 + q.b2 * z2) / (1.0 + q.a1 * z1 + q.a2 * z2)));
}

// The bilinear transform maps s = ∞ to Nyquist and s = 0 to DC, so at every
// rate the shelf reads exactly the prototype's high gain (3.99984 dB, see
// REFERENCES.md) at Nyquist and 0 dB at DC, and the high-pass removes DC.
TEST(KWeighting, ShapeHoldsAtOtherRates) {
    for (double rate : {16000.0, 22050.0, 44100.0, 96000.0}) {
        SCOPED_TRACE(rate);
        const KWeighting k = kWeighting(rate);
        EXPECT_NEAR(gainDb(k.shelf, 0.0, rate), 0.0, 1e-9);
        EXPECT_NEAR(gainDb(k.shelf, rate / 2.0, rate), 3.99984, 1e-4);
        EXPECT_EQ(k.highPass.b0 + k.highPass.b1 + k.highPass.b2, 0.0);
    }
}

TEST(KWeighting, RejectsRatesWithTheShelfAboveNyquist) {
    for (double rate : {0.0, -48000.0, 3000.0, std::numeric_limits<double>::quiet_NaN(),
                        std::numeric_limits<double>::infinity()}) {
        SCOPED_TRACE(rate);
        try {
            kWeighting(rate);
            FAIL() << "no ParamError";
        } catch (const ParamError& e) {
            EXPECT_EQ(e.subject(), "kWeighting.sampleRate");
        }
    }
}

}  // namespace
}  // namespace earmark
