// Boundary refinement: a take whose sound is the reference's shifted by a
// known amount has its boundaries moved by exactly that shift (to the energy
// frame), keeping the reference's offset from the landmark.
#include "earmark/align/boundary_refine.hpp"
#include "earmark/core/error.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

namespace earmark {
namespace {

constexpr double kRate = 16000;

// Two tone bursts with a 30 ms dip of quiet tone between them, silence around.
Signal bursts(double lead) {
    return test::concat({test::silence(lead, kRate), test::sine(200, 0.3, kRate, 0.3), test::sine(200, 0.03, kRate, 0.003),
                         test::sine(300, 0.3, kRate, 0.3), test::silence(0.4, kRate)});
}

TEST(BoundaryRefine, MovesCarriedBoundariesOntoTheTakesLandmarks) {
    const Signal ref = bursts(0.2);
    const Signal take = bursts(0.2 + 0.017);  // everything 17 ms later
    const RefineParams p;
    // Reference boundaries: onset at 0.2, the dip between the bursts at 0.515, offset at 0.83.
    // Carried times are 20 ms off the truth (0.217, 0.532, 0.847) in either direction.
    const std::vector<BoundaryToRefine> b = {
        {0.217 + 0.02, 0.2, BoundaryKind::Onset},
        {0.532 - 0.02, 0.515, BoundaryKind::Join},
        {0.847 + 0.02, 0.83, BoundaryKind::Offset},
    };
    const std::vector<double> out = refineBoundaries(take, ref, b, p);
    ASSERT_EQ(out.size(), 3u);
    // The landmark moves by the true shift; what remains is the energy frame (2.5 ms).
    EXPECT_NEAR(out[0], 0.217, 0.003);
    EXPECT_NEAR(out[1], 0.532, 0.003);
    EXPECT_NEAR(out[2], 0.847, 0.003);
}

TEST(BoundaryRefine, WithoutALandmarkTheBoundaryStays) {
    const Signal steady = test::sine(200, 1.0, kRate, 0.3);
    const std::vector<BoundaryToRefine> b = {{0.5, 0.5, BoundaryKind::Join}, {0.4, 0.4, BoundaryKind::Onset}};
    const std::vector<double> out = refineBoundaries(steady, steady, b);
    EXPECT_DOUBLE_EQ(out[0], 0.5);
    EXPECT_DOUBLE_EQ(out[1], 0.4);
}

TEST(BoundaryRefine, FarLandmarksAreOutOfReach) {
    // The take's onset is 200 ms after the carried time: beyond the ±40 ms window.
    const Signal ref = bursts(0.2), take = bursts(0.4);
    const std::vector<double> out = refineBoundaries(take, ref, {{0.2, 0.2, BoundaryKind::Onset}});
    EXPECT_DOUBLE_EQ(out[0], 0.2);
}

TEST(BoundaryRefine, RejectsBadParams) {
    RefineParams p;
    p.windowSeconds = 0;
    EXPECT_THROW(refineBoundaries(bursts(0.1), bursts(0.1), {}, p), ParamError);
}

}  // namespace
}  // namespace earmark
