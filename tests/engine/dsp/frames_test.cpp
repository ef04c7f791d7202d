// The framing helper and windows: Earmark's centred-frame convention
// (DESIGN.md) and the textbook window definitions (Harris, "On the use of
// windows for harmonic analysis with the DFT", Proc. IEEE 66(1), 1978).
#include "earmark/core/error.hpp"
#include "earmark/dsp/frames.hpp"
#include "earmark/dsp/window.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <numeric>
#include <vector>

namespace earmark {
namespace {

TEST(Frames, CountAndCentres) {
    const FrameLayout layout(1000, 400, 160);
    EXPECT_EQ(layout.count(), 1000 / 160 + 1);
    EXPECT_EQ(layout.centreSample(3), 480);
    EXPECT_EQ(layout.firstSample(3), 480 - 200);
    EXPECT_EQ(FrameLayout(0, 400, 160).count(), 0);
    EXPECT_EQ(FrameLayout(1, 400, 160).count(), 1);
}

TEST(Frames, ZeroPaddingAtEdges) {
    std::vector<float> x(10);
    std::iota(x.begin(), x.end(), 1.0f);  // 1..10
    const FrameLayout layout(10, 4, 2);
    std::vector<float> out(6, -1.0f);
    copyFrame(x, layout, 0, out, FramePadding::Zeros);  // samples -2..1
    EXPECT_EQ(out, (std::vector<float>{0, 0, 1, 2, 0, 0}));  // extra room zero-filled
    copyFrame(x, layout, 5, out, FramePadding::Zeros);  // samples 8..11
    EXPECT_EQ((std::vector<float>(out.begin(), out.begin() + 4)), (std::vector<float>{9, 10, 0, 0}));
}

TEST(Frames, ReflectPaddingMirrorsAboutEdgeSamples) {
    std::vector<float> x = {1, 2, 3, 4};
    const FrameLayout layout(4, 8, 1);
    std::vector<float> out(8);
    copyFrame(x, layout, 0, out, FramePadding::Reflect);  // samples -4..3
    // numpy.pad(..., mode="reflect") convention: x[-1] = x[1]; folds repeatedly.
    EXPECT_EQ(out, (std::vector<float>{3, 4, 3, 2, 1, 2, 3, 4}));
}

TEST(Frames, RejectsBadLayout) {
    EXPECT_THROW(FrameLayout(10, 0, 1), ParamError);
    EXPECT_THROW(FrameLayout(10, 4, 0), ParamError);
    EXPECT_THROW(hopSamples(0.0, 16000), ParamError);
    EXPECT_EQ(hopSamples(0.005, 22050), 110);
}

TEST(Window, HannDefinitions) {
    const auto periodic = makeWindow(WindowShape::Hann, 8);
    const auto symmetric = makeWindow(WindowShape::Hann, 8, WindowSymmetry::Symmetric);
    for (int n = 0; n < 8; ++n) {
        EXPECT_NEAR(periodic[static_cast<std::size_t>(n)], 0.5 - 0.5 * std::cos(2 * std::numbers::pi * n / 8), 1e-7);
        EXPECT_NEAR(symmetric[static_cast<std::size_t>(n)], 0.5 - 0.5 * std::cos(2 * std::numbers::pi * n / 7), 1e-7);
    }
    EXPECT_FLOAT_EQ(periodic[0], 0.0f);
    EXPECT_FLOAT_EQ(periodic[4], 1.0f);
    EXPECT_FLOAT_EQ(symmetric.front(), symmetric.back());
    // Periodic Hann sums to N/2 (coherent gain 0.5, Harris 1978 table I).
    const auto big = makeWindow(WindowShape::Hann, 1024);
    EXPECT_NEAR(std::accumulate(big.begin(), big.end(), 0.0), 512.0, 1e-3);
}

TEST(Window, HammingAndRectangular) {
    const auto h = makeWindow(WindowShape::Hamming, 16);
    EXPECT_NEAR(h[0], 0.08f, 1e-7);
    EXPECT_NEAR(h[8], 1.0f, 1e-7);
    const auto r = makeWindow(WindowShape::Rectangular, 5);
    EXPECT_EQ(r, std::vector<float>(5, 1.0f));
    EXPECT_THROW(makeWindow(WindowShape::Hann, 0), ParamError);
}

}  // namespace
}  // namespace earmark
