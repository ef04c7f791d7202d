// Speech span from energy: edges of a known burst, silence and steady noise.
#include "earmark/align/speech_span.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

namespace earmark {
namespace {

TEST(SpeechSpan, FindsTheEdgesOfSoundBetweenSilences) {
    const double rate = 16000;
    const Signal s = test::concat({test::silence(0.7, rate), test::sine(220, 1.3, rate, 0.3), test::silence(0.5, rate)});
    const SpeechSpan span = findSpeechSpan(s);
    ASSERT_TRUE(span.found);
    // Frames of 30 ms every 10 ms: an edge is found within half a window.
    EXPECT_NEAR(span.startS, 0.7, 0.02);
    EXPECT_NEAR(span.endS, 2.0, 0.02);
    EXPECT_NEAR(span.levelDb, -13.5, 0.5);  // a 0.3-amplitude sine: 20·log10(0.3/√2) = −13.5 dBFS
}

TEST(SpeechSpan, EdgesHoldInNoise) {
    const double rate = 16000;
    Signal s = test::concat({test::silence(0.5, rate), test::sine(300, 1.0, rate, 0.3), test::silence(0.5, rate)});
    const Signal noise = test::whiteNoise(2.0, rate, 0.003, 9);
    for (std::size_t i = 0; i < s.size(); ++i) s.samples[i] += noise.samples[i];
    const SpeechSpan span = findSpeechSpan(s);
    ASSERT_TRUE(span.found);
    EXPECT_NEAR(span.startS, 0.5, 0.03);
    EXPECT_NEAR(span.endS, 1.5, 0.03);
}

TEST(SpeechSpan, SilenceAndSteadyNoiseHoldNoSpeech) {
    EXPECT_FALSE(findSpeechSpan(test::silence(2.0, 16000)).found);
    EXPECT_FALSE(findSpeechSpan(test::whiteNoise(2.0, 16000, 0.1)).found);
    EXPECT_FALSE(findSpeechSpan(test::sine(440, 1.0, 16000, 0.0005)).found);  // −69 dBFS: below the level bar
    EXPECT_FALSE(findSpeechSpan(Signal{{}, 16000}).found);
}

}  // namespace
}  // namespace earmark
