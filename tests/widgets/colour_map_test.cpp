// The "dusk" colour map: OKLab conversions and perceptual uniformity.
#include "earmark/widgets/colour_map.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <vector>

namespace earmark::widgets {
namespace {

double deltaE(const OkLab& p, const OkLab& q) {
    return std::sqrt((p.L - q.L) * (p.L - q.L) + (p.a - q.a) * (p.a - q.a) + (p.b - q.b) * (p.b - q.b));
}

TEST(OkLab, WhiteIsLightnessOneWithoutChroma) {
    // OKLab is defined so that the D65 white has L = 1, a = b = 0
    // (Ottosson 2020, "A perceptual color space for image processing"; from memory).
    const OkLab w = linearSrgbToOkLab({1.0, 1.0, 1.0});
    EXPECT_NEAR(w.L, 1.0, 1e-4);
    EXPECT_NEAR(w.a, 0.0, 1e-4);
    EXPECT_NEAR(w.b, 0.0, 1e-4);
    const OkLab k = linearSrgbToOkLab({0.0, 0.0, 0.0});
    EXPECT_NEAR(k.L, 0.0, 1e-9);
}

TEST(OkLab, SrgbPrimariesMatchPublishedCoordinates) {
    // OKLab of the sRGB primaries as listed with the space's definition
    // (Ottosson 2020; values from memory, to 3 decimals).
    const OkLab r = linearSrgbToOkLab({1, 0, 0});
    EXPECT_NEAR(r.L, 0.628, 2e-3);
    EXPECT_NEAR(r.a, 0.225, 2e-3);
    EXPECT_NEAR(r.b, 0.126, 2e-3);
    const OkLab b = linearSrgbToOkLab({0, 0, 1});
    EXPECT_NEAR(b.L, 0.452, 2e-3);
    EXPECT_NEAR(b.a, -0.032, 2e-3);
    EXPECT_NEAR(b.b, -0.312, 2e-3);
}

TEST(OkLab, RoundTripsThroughLinearSrgb) {
    for (double r : {0.0, 0.2, 0.7, 1.0})
        for (double g : {0.0, 0.5, 1.0})
            for (double b : {0.1, 0.9}) {
                const LinearRgb back = okLabToLinearSrgb(linearSrgbToOkLab({r, g, b}));
                EXPECT_NEAR(back.r, r, 1e-6);
                EXPECT_NEAR(back.g, g, 1e-6);
                EXPECT_NEAR(back.b, b, 1e-6);
            }
}

TEST(SrgbTransfer, MatchesIec61966Breakpoints) {
    // IEC 61966-2-1: linear segment 12.92·x below 0.0031308.
    EXPECT_NEAR(srgbEncode(0.001), 0.01292, 1e-9);
    EXPECT_NEAR(srgbEncode(1.0), 1.0, 1e-12);
    EXPECT_NEAR(srgbDecode(srgbEncode(0.18)), 0.18, 1e-12);
}

TEST(DuskColourMap, LightnessRisesStrictlyFromDarkToLight) {
    const auto lab = duskColourMapOkLab();
    EXPECT_LT(lab.front().L, 0.2);
    EXPECT_GT(lab.back().L, 0.93);
    for (std::size_t i = 1; i < lab.size(); ++i) EXPECT_GT(lab[i].L, lab[i - 1].L) << "entry " << i;
}

TEST(DuskColourMap, EqualStepsInTheMapAreEqualPerceivedSteps) {
    // Equal OKLab distance for equal steps along the map. Single neighbours
    // differ by less than one 8-bit sRGB step, so compare spans of 15 entries
    // (17 spans tile the map).
    const auto lab = duskColourMapOkLab();
    std::vector<double> spans;
    for (std::size_t i = 0; i + 15 < lab.size(); i += 15) spans.push_back(deltaE(lab[i], lab[i + 15]));
    ASSERT_EQ(spans.size(), 17u);
    double mean = 0;
    for (double d : spans) mean += d / spans.size();
    for (double d : spans) EXPECT_NEAR(d, mean, 0.15 * mean);
}

TEST(DuskColourMap, EndsAreNearlyGrey) {
    const auto lab = duskColourMapOkLab();
    EXPECT_LT(std::hypot(lab.front().a, lab.front().b), 0.03);
    EXPECT_LT(std::hypot(lab.back().a, lab.back().b), 0.06);
}

}  // namespace
}  // namespace earmark::widgets
