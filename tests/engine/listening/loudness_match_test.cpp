// Level matching inside a trial: BS.1770 loudness is linear in level, so two
// takes of one signal 12.04 dB apart (a factor of 4) are matched by −12.04 dB
// on the louder one; silence keeps 0 dB.
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/listening/loudness_match.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

namespace earmark::listening {
namespace {

TEST(LoudnessMatch, GainsBringEveryTakeToTheQuietest) {
    const double inf = std::numeric_limits<double>::infinity();
    const auto g = matchingGainsDb({-20.0, -26.5, -inf, -23.0});
    ASSERT_EQ(g.size(), 4u);
    EXPECT_DOUBLE_EQ(g[0], -6.5);
    EXPECT_DOUBLE_EQ(g[1], 0.0);
    EXPECT_DOUBLE_EQ(g[2], 0.0);
    EXPECT_DOUBLE_EQ(g[3], -3.5);
}

TEST(LoudnessMatch, MeasuresFilesWithBs1770) {
    test::TempDir dir;
    writeWav(dir.file("loud.wav"), test::sine(997.0, 3.0, 48000, 0.5));
    writeWav(dir.file("quiet.wav"), test::sine(997.0, 3.0, 48000, 0.125));
    writeWav(dir.file("silent.wav"), test::silence(3.0, 48000));
    const auto m = measureTrialLoudness({dir.file("loud.wav"), dir.file("quiet.wav"), dir.file("silent.wav")});
    ASSERT_EQ(m.size(), 3u);
    EXPECT_NEAR(m[0].gainDb, -20.0 * std::log10(4.0), 0.01);
    EXPECT_EQ(m[1].gainDb, 0.0);
    EXPECT_TRUE(std::isinf(m[2].loudnessLufs));
    EXPECT_EQ(m[2].gainDb, 0.0);
    EXPECT_THROW(measureTrialLoudness({dir.file("missing.wav")}), InputError);
}

}  // namespace
}  // namespace earmark::listening
