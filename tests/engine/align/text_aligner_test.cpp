// alignText on whole takes: valid tiers, pauses kept, confidence that tells a
// right text from a wrong one, and every bad input the issue names (empty
// text, a script the voice cannot read, text much longer than the audio,
// silence) ending in a clear error — never a hang.
#include "earmark/align/speech_render.hpp"
#include "earmark/align/text_aligner.hpp"
#include "earmark/core/error.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <chrono>

namespace earmark {
namespace {

using ::testing::HasSubstr;

const std::string kLine = "The lighthouse keeper counted seven gulls before breakfast.";

// A take of `text` by a voice other than the aligner's reference.
Signal takeOf(const std::string& text, const char* voice = "en-gb-x-rp", int rate = 160) {
    return renderSpeech(text, SpeechParams{voice, rate, 45}).audio;
}

template <typename Fn>
void expectInputError(Fn fn, const std::string& subject, const std::string& problem) {
    try {
        fn();
        ADD_FAILURE() << "expected InputError about " << subject;
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), subject);
        EXPECT_THAT(e.problem(), HasSubstr(problem));
    }
}

TEST(TextAligner, GivesValidWordAndPhoneTiersInsideTheTake) {
    const Signal take = takeOf(kLine);
    const AlignResult r = alignText(take, kLine);
    ASSERT_EQ(r.tiers.tiers.size(), 2u);
    const Tier& words = *r.tiers.find("words");
    const Tier& phones = *r.tiers.find("phones");
    ASSERT_EQ(words.intervals.size(), 8u);
    EXPECT_EQ(words.intervals.front().label, "The");
    EXPECT_EQ(words.intervals.back().label, "breakfast");  // the full stop is not part of the word
    EXPECT_FALSE(checkTier(words, take.durationSeconds()).error);
    EXPECT_FALSE(checkTier(phones, take.durationSeconds()).error);
    EXPECT_GT(phones.intervals.size(), words.intervals.size());
    // Every phone lies inside a word.
    std::size_t w = 0;
    for (const Interval& p : phones.intervals) {
        while (w < words.intervals.size() && words.intervals[w].endS < p.endS - 1e-9) ++w;
        ASSERT_LT(w, words.intervals.size());
        EXPECT_GE(p.startS, words.intervals[w].startS - 1e-9) << p.label;
    }
    for (const Interval& iv : words.intervals) {
        ASSERT_TRUE(iv.confidence);
        EXPECT_GE(*iv.confidence, 0.0);
        EXPECT_LE(*iv.confidence, 1.0);
    }
    ASSERT_TRUE(r.tiers.durationS);
    EXPECT_DOUBLE_EQ(*r.tiers.durationS, take.durationSeconds());
}

TEST(TextAligner, NumbersAndPunctuationKeepTheTextsOwnWords) {
    const std::string text = "Platform 42 opens at 3.5 past, café time!";
    const AlignResult r = alignText(takeOf(text), text);
    std::vector<std::string> labels;
    for (const Interval& iv : r.tiers.find("words")->intervals) labels.push_back(iv.label);
    EXPECT_THAT(labels, ::testing::ElementsAre("Platform", "42", "opens", "at", "3.5", "past", "café", "time"));
}

TEST(TextAligner, APauseTheReadingLacksStaysAGap) {
    // The take pauses 1 s between "keeper" and "counted"; the reference does not.
    const Signal first = takeOf("The lighthouse keeper");
    const Signal second = takeOf("counted seven gulls before breakfast.");
    const Signal take = test::concat({first, test::silence(1.0, first.sampleRate), second});
    const AlignResult r = alignText(take, kLine);
    const auto& w = r.tiers.find("words")->intervals;
    ASSERT_EQ(w.size(), 8u);
    const double gap = w[3].startS - w[2].endS;
    EXPECT_GT(gap, 0.8) << "keeper ends " << w[2].endS << ", counted starts " << w[3].startS;
    EXPECT_NEAR(w[3].startS, first.durationSeconds() + 1.0, 0.06);
}

TEST(TextAligner, ConfidenceTellsTheRightTextFromAWrongOne) {
    const Signal take = takeOf(kLine);
    const AlignResult right = alignText(take, kLine);
    const AlignResult wrong = alignText(take, "Please carry the blue crate down to the lower deck.");
    EXPECT_GT(right.meanConfidence, 0.8);
    EXPECT_LT(wrong.meanConfidence, 0.4);
    // Right text in noise still scores well above the wrong text.
    Signal noisy = take;
    test::addNoiseAtSnr(noisy, 20.0);
    EXPECT_GT(alignText(noisy, kLine).meanConfidence, wrong.meanConfidence + 0.3);
}

TEST(TextAligner, ExtraTextGetsLowConfidenceNotAHang) {
    // Text about twice as long as the audio: aligned (within the length
    // ratio), but the words the take lacks score low.
    const std::string longer = kLine + " Then he rowed across the bay to fetch the morning post.";
    const auto t0 = std::chrono::steady_clock::now();
    const AlignResult r = alignText(takeOf(kLine), longer);
    EXPECT_LT(std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count(), 5.0);
    const auto& w = r.tiers.find("words")->intervals;
    ASSERT_EQ(w.size(), 19u);
    double extra = 0.0;
    for (std::size_t k = 8; k < w.size(); ++k) extra += *w[k].confidence;
    EXPECT_LT(extra / 11.0, 0.5);
}

TEST(TextAligner, TextMuchLongerThanTheAudioIsRefused) {
    std::string longText;
    for (int k = 0; k < 6; ++k) longText += kLine + " ";
    expectInputError([&] { alignText(takeOf("Good morning."), longText); }, "text", "does not match the audio");
}

TEST(TextAligner, EmptyOrUnspeakableTextIsRefused) {
    const Signal take = takeOf(kLine);
    expectInputError([&] { alignText(take, ""); }, "text", "is empty");
    expectInputError([&] { alignText(take, "  ... -- !  "); }, "text", "is empty");
}

TEST(TextAligner, TextInAScriptTheVoiceCannotReadIsRefused) {
    expectInputError([&] { alignText(takeOf(kLine), "灯塔看守人数了七只海鸥。"); }, "text", "Han script");
    AlignParams ru;
    ru.speech.voice = "ru";
    EXPECT_NO_THROW(alignText(takeOf("Привет, как дела?", "ru"), "Привет, как дела?", ru));
}

TEST(TextAligner, SilenceOrNoiseOnlyAudioIsRefused) {
    expectInputError([&] { alignText(test::silence(3.0, 22050), kLine); }, "audio", "no speech");
    expectInputError([&] { alignText(test::whiteNoise(3.0, 22050, 0.05), kLine); }, "audio", "no speech");
    expectInputError([&] { alignText(Signal{{}, 22050}, kLine); }, "audio", "empty");
}

TEST(TextAligner, BadParametersAndUnknownVoicesAreParamErrors) {
    const Signal take = takeOf("Good morning.");
    AlignParams p;
    p.speech.voice = "no-such-voice";
    EXPECT_THROW(alignText(take, "Good morning.", p), ParamError);
    p = {};
    p.coarseFactor = 0;
    EXPECT_THROW(alignText(take, "Good morning.", p), ParamError);
    p = {};
    p.badDistanceRatio = p.goodDistanceRatio;
    EXPECT_THROW(alignText(take, "Good morning.", p), ParamError);
}

TEST(TextAligner, ProgressReachesTheEndAndCanCancel) {
    const Signal take = takeOf(kLine);
    double last = -1.0;
    bool monotone = true;
    alignText(take, kLine, {}, Progress([&](double f) {
                  monotone = monotone && f >= last - 1e-12;
                  last = f;
                  return true;
              }));
    EXPECT_TRUE(monotone);
    EXPECT_DOUBLE_EQ(last, 1.0);
    EXPECT_THROW(alignText(take, kLine, {}, Progress([](double f) { return f < 0.3; })), Cancelled);
}

}  // namespace
}  // namespace earmark
