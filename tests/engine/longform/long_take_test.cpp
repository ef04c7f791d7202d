// Long-take measures: bad input, block independence, and the window
// measures against their definitions on a built read.
#include "earmark/core/error.hpp"
#include "earmark/longform/findings.hpp"
#include "earmark/loudness/bs1770.hpp"

#include "support/long_read.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace earmark {
namespace {

TEST(LongTake, ThreeSecondTakeIsTooShort) {
    const Signal take = test::sine(200.0, 3.0, 16000.0, 0.3);
    try {
        analyseLongTake(take);
        FAIL() << "no error";
    } catch (const InputError& e) {
        EXPECT_NE(std::string(e.what()).find("too short"), std::string::npos) << e.what();
    }
}

TEST(LongTake, SilenceHasNoSpeech) {
    EXPECT_THROW(analyseLongTake(test::silence(40.0, 16000.0)), InputError);
}

TEST(LongTake, InvalidParamsNameTheField) {
    LongTakeParams p;
    p.windowHopSeconds = 30.0;  // above the window
    try {
        p.validate();
        FAIL() << "no error";
    } catch (const ParamError& e) {
        EXPECT_EQ(e.subject(), "LongTakeParams.windowHopSeconds");
    }
}

TEST(LongTake, JoinOutsideTheTakeIsBadInput) {
    const test::LongRead read = test::makeLongRead({.sentences = 12});
    const double end = read.audio.durationSeconds();
    try {
        analyseLongform(read.audio, {10.0, end + 5.0}, LongformRules{});
        FAIL() << "no error";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "chunks");
        EXPECT_NE(std::string(e.what()).find("outside the take"), std::string::npos) << e.what();
    }
}

TEST(LongTake, BlocksDoNotChangeTheResult) {
    const test::LongRead read = test::makeLongRead({.sentences = 12});
    LongTakeParams small, large;
    small.blockSeconds = 10.0;
    large.blockSeconds = 600.0;  // one block
    const LongTakeAnalysis a = analyseLongTake(read.audio, small), b = analyseLongTake(read.audio, large);
    ASSERT_EQ(a.tracks.energy.db.size(), b.tracks.energy.db.size());
    for (std::size_t i = 0; i < a.tracks.energy.db.size(); ++i) ASSERT_EQ(a.tracks.energy.db[i], b.tracks.energy.db[i]) << i;
    int voicingDiffers = 0;
    for (std::size_t i = 0; i < a.tracks.pitch.size(); ++i) voicingDiffers += a.tracks.pitch.voiced(i) != b.tracks.pitch.voiced(i);
    EXPECT_LT(voicingDiffers, 10);  // YIN's voicing gate is relative to the block's loud level
    ASSERT_EQ(a.series.windows.size(), b.series.windows.size());
    for (std::size_t w = 0; w < a.series.windows.size(); ++w) {
        EXPECT_DOUBLE_EQ(a.series.windows[w].loudnessLufs, b.series.windows[w].loudnessLufs);
        EXPECT_NEAR(a.series.windows[w].f0MedianHz, b.series.windows[w].f0MedianHz, 0.5);
    }
}

TEST(LongTake, WindowLoudnessIsTheWindowsBs1770Loudness) {
    // ITU-R BS.1770-4 integrated loudness of the window's samples, measured alone.
    const test::LongRead read = test::makeLongRead({.sentences = 12});
    const LongTakeAnalysis a = analyseLongTake(read.audio);
    ASSERT_GE(a.series.windows.size(), 3u);
    for (const WindowMeasures& m : a.series.windows) {
        const auto s0 = std::llround(m.startS * read.audio.sampleRate);
        const auto s1 = std::llround(m.endS * read.audio.sampleRate);
        const double alone = integratedLoudnessLufs(read.audio.samples.data() + s0, s1 - s0, read.audio.sampleRate);
        EXPECT_NEAR(m.loudnessLufs, alone, 1e-9);
        EXPECT_GE(m.endS - m.startS, 20.0 - 1e-9);
    }
    EXPECT_LE(a.series.windows.back().endS, read.audio.durationSeconds());
}

TEST(LongTake, SpeechSegmentsLieBetweenPauses) {
    const test::LongRead read = test::makeLongRead({.sentences = 12});
    const LongTakeAnalysis a = analyseLongTake(read.audio);
    const auto segments = speechSegments(a.tracks.speech);
    // One segment per sentence at least (espeak-ng may pause inside one).
    ASSERT_GE(segments.size(), 12u);
    EXPECT_NEAR(segments.front().startS, read.sentenceStartS.front(), 0.05);
    EXPECT_NEAR(segments.back().endS, read.sentenceEndS.back(), 0.1);
}

}  // namespace
}  // namespace earmark
