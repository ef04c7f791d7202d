// Reference tiers from the renderer's events: words labelled with the text's
// own tokens (numbers, abbreviations and punctuation as the renderer reads
// them), phones inside words, pauses as gaps.
#include "earmark/align/reference_tiers.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

namespace earmark {
namespace {

using ::testing::ElementsAre;

std::vector<std::string> labels(const Tier& t) {
    std::vector<std::string> out;
    for (const auto& iv : t.intervals) out.push_back(iv.label);
    return out;
}

SpeechEvent word(double t, std::size_t begin, std::size_t end) {
    return {SpeechEvent::Kind::Word, t, begin, end, ""};
}
SpeechEvent phone(double t, std::size_t at, const char* name) {
    return {SpeechEvent::Kind::Phoneme, t, at, at, name};
}

TEST(ReferenceTiers, HandMadeEventsGiveExactTiers) {
    // "Hi, 42." spoken as: hi | pause | forty two (two word events in one token) | pause
    const std::string text = "Hi, 42.";
    RenderedSpeech s;
    s.audio.sampleRate = 1000;
    s.audio.samples.assign(2000, 0.0f);
    s.events = {word(0.0, 0, 2),   phone(0.01, 0, "h"), phone(0.08, 0, "aɪ"), phone(0.30, 3, ""),
                phone(0.45, 3, ""), word(0.45, 4, 6),   phone(0.47, 4, "f"),  phone(0.55, 4, "ɔː"),
                phone(0.70, 4, "ɾ"), phone(0.74, 4, "i"), word(0.80, 5, 6),  phone(0.83, 5, "t"),
                phone(0.90, 5, "uː"), phone(1.10, 6, "")};
    const ReferenceTiers r = referenceTiers(text, s);
    ASSERT_THAT(labels(r.words), ElementsAre("Hi", "42"));
    EXPECT_DOUBLE_EQ(r.words.intervals[0].startS, 0.0);
    EXPECT_DOUBLE_EQ(r.words.intervals[0].endS, 0.30);  // ends where the pause starts
    EXPECT_DOUBLE_EQ(r.words.intervals[1].startS, 0.45);
    EXPECT_DOUBLE_EQ(r.words.intervals[1].endS, 1.10);
    ASSERT_THAT(labels(r.phones), ElementsAre("h", "aɪ", "f", "ɔː", "ɾ", "i", "t", "uː"));
    EXPECT_DOUBLE_EQ(r.phones.intervals[0].startS, 0.0);   // first phone starts with its word
    EXPECT_DOUBLE_EQ(r.phones.intervals[5].endS, 0.80);    // "i" ends at the next word event
    EXPECT_DOUBLE_EQ(r.phones.intervals[6].startS, 0.80);  // "t" starts with the event, closure included
    EXPECT_THAT(r.phoneWord, ElementsAre(0, 0, 1, 1, 1, 1, 1, 1));
}

TEST(ReferenceTiers, RenderedTextKeepsTheTextsWords) {
    // Numbers become several spoken words ("forty two", "three point five"),
    // "km/h" is spelled out, a lone dash is not spoken at all.
    const std::string text = "Hello, wörld: 42 ships at 3.5 km/h — \"Café\"";
    const RenderedSpeech s = renderSpeech(text);
    const ReferenceTiers r = referenceTiers(text, s);
    EXPECT_THAT(labels(r.words), ElementsAre("Hello", "wörld", "42", "ships", "at", "3.5", "km/h", "Café"));
    EXPECT_FALSE(checkTier(r.words, s.audio.durationSeconds()).error);
    EXPECT_FALSE(checkTier(r.phones, s.audio.durationSeconds()).error);
    EXPECT_EQ(r.phoneWord.size(), r.phones.intervals.size());
    for (std::size_t k = 0; k < r.phones.intervals.size(); ++k) {
        const Interval& w = r.words.intervals[r.phoneWord[k]];
        EXPECT_GE(r.phones.intervals[k].startS, w.startS);
        EXPECT_LE(r.phones.intervals[k].endS, w.endS);
    }
}

TEST(ReferenceTiers, TokenLabelStripsEdgePunctuationOnly) {
    EXPECT_EQ(tokenLabel("morning,"), "morning");
    EXPECT_EQ(tokenLabel("\"Café\""), "Café");
    EXPECT_EQ(tokenLabel("«bonjour»"), "bonjour");
    EXPECT_EQ(tokenLabel("¿qué?"), "qué");
    EXPECT_EQ(tokenLabel("Smith's"), "Smith's");
    EXPECT_EQ(tokenLabel("3.5"), "3.5");
    EXPECT_EQ(tokenLabel("(km/h)."), "km/h");
    EXPECT_EQ(tokenLabel("東京。"), "東京");
    EXPECT_EQ(tokenLabel("&"), "&");  // nothing left: keep the token
}

}  // namespace
}  // namespace earmark
