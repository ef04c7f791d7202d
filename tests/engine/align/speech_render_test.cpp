// The libespeak-ng wrapper: events in time order, text positions that point
// at the words of the text, parameters that take effect and do not leak into
// the next call, thread safety, and clear errors.
#include "earmark/align/speech_render.hpp"
#include "earmark/core/error.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <thread>

namespace earmark {
namespace {

std::vector<std::string> spokenWords(const std::string& text, const RenderedSpeech& r) {
    std::vector<std::string> out;
    for (const auto& e : r.events)
        if (e.kind == SpeechEvent::Kind::Word) out.push_back(text.substr(e.textBegin, e.textEnd - e.textBegin));
    return out;
}

TEST(SpeechRender, EventsAreTimeOrderedAndPointAtTheWords) {
    const std::string text = "Good morning, Ostrel.";
    const RenderedSpeech r = renderSpeech(text);
    EXPECT_EQ(r.audio.sampleRate, 22050.0);  // the stock voices' rate (espeak-ng documentation)
    EXPECT_GT(r.audio.durationSeconds(), 0.5);
    EXPECT_LT(r.audio.durationSeconds(), 3.0);
    EXPECT_EQ(r.language, "en-us");
    EXPECT_THAT(spokenWords(text, r), ::testing::ElementsAre("Good", "morning", "Ostrel"));
    double last = 0.0;
    int sounding = 0;
    for (const auto& e : r.events) {
        EXPECT_GE(e.timeS, last);
        EXPECT_LE(e.timeS, r.audio.durationSeconds());
        last = e.timeS;
        if (e.kind == SpeechEvent::Kind::Phoneme && !e.phoneme.empty()) ++sounding;
    }
    EXPECT_GE(sounding, 10);  // ɡ ʊ d m ɔː ɹ n ɪ ŋ ɑ s t ɹ əl …
}

TEST(SpeechRender, PositionsCountCharactersNotBytes) {
    // "café" and "東京" are multi-byte in UTF-8; each word event must still cut the text at its word.
    const std::string text = "café naïve crème";
    EXPECT_THAT(spokenWords(text, renderSpeech(text)), ::testing::ElementsAre("café", "naïve", "crème"));
}

TEST(SpeechRender, RateAndVoiceTakeEffectAndDoNotLeak) {
    const std::string text = "The ferry leaves the northern pier at nine.";
    const double normal = renderSpeech(text).audio.durationSeconds();
    const double fast = renderSpeech(text, SpeechParams{"en-us", 350, 50}).audio.durationSeconds();
    const double again = renderSpeech(text).audio.durationSeconds();
    EXPECT_LT(fast, 0.7 * normal);
    EXPECT_NEAR(again, normal, 0.01);  // rate reset for the next call
    const RenderedSpeech rp = renderSpeech(text, SpeechParams{"en-gb-x-rp", 175, 50});
    EXPECT_EQ(rp.language, "en-gb-x-rp");
    EXPECT_EQ(renderSpeech(text).language, "en-us");
}

TEST(SpeechRender, IsSafeFromSeveralThreads) {
    const std::string text = "Seals sleep on the sandbank.";
    std::vector<std::size_t> words(4);
    std::vector<std::thread> threads;
    for (int t = 0; t < 4; ++t)
        threads.emplace_back([&, t] { words[t] = spokenWords(text, renderSpeech(text)).size(); });
    for (auto& th : threads) th.join();
    for (std::size_t n : words) EXPECT_EQ(n, 4u);  // "on the" is one word event: read together
}

TEST(SpeechRender, ErrorsNameWhatIsWrong) {
    EXPECT_THROW(renderSpeech("hi", SpeechParams{"zz-not-a-voice", 175, 50}), ParamError);
    EXPECT_THROW(renderSpeech("hi", SpeechParams{"en-us", 20, 50}), ParamError);
    EXPECT_THROW(renderSpeech("hi", SpeechParams{"en-us", 175, 120}), ParamError);
    EXPECT_THROW(renderSpeech("hi", SpeechParams{"", 175, 50}), ParamError);
    try {
        renderSpeech("bad \xC3\x28 byte");
        FAIL();
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "text");
        EXPECT_THAT(e.problem(), ::testing::HasSubstr("byte 5"));
    }
}

}  // namespace
}  // namespace earmark
