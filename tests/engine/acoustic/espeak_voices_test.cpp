// Model alignment (gatherWordEvidence) on takes rendered by libespeak-ng's
// English voices: formant synthesis, far from the recorded speech the model
// was trained on. Truth: the rendering's own word events (where espeak-ng
// itself started each word; support/espeak_truth.hpp).
//
// Bar (from the issue): >= 95 % of word starts within 50 ms, per voice.
// The sentences are invented here.
#include "earmark/acoustic/word_evidence.hpp"
#include "earmark/align/speech_render.hpp"
#include "support/espeak_truth.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

namespace earmark {
namespace {

const char* const kSentences[] = {
    "The night porter locked the gate and walked back to the lodge.",
    "Four barrels of apples were rolled onto the cart before noon.",
    "A thin layer of frost covered the roofs of the village.",
    "Please leave your muddy boots by the kitchen door.",
    "The choir practised the same song until the lamps were lit.",
    "Two old friends argued about the best way to cook a trout.",
    "Rain had turned the lane into a river of brown water.",
    "The clock in the square stopped at exactly ten past four.",
    "He wrapped the parcel in paper and tied it with string.",
    "Our neighbours keep bees in a row of white wooden boxes.",
};

struct Voice {
    const char* name;
    int rateWpm;
    int pitch;
};

struct VoiceFigures {
    std::vector<double> errorsS;  // |aligned start - rendered start| per word
    int unplaced = 0;             // words the model did not place

    double share(double withinS) const {
        int n = 0;
        for (double e : errorsS) n += e <= withinS ? 1 : 0;
        return static_cast<double>(n) / static_cast<double>(errorsS.size());
    }
};

// Each take padded with 0.4 s of silence before and 0.3 s after (a take
// rarely starts on its first word); every other one with white noise at 30 dB SNR.
VoiceFigures measure(const Voice& voice) {
    VoiceFigures f;
    const std::size_t count = sizeof kSentences / sizeof kSentences[0];
    for (std::size_t n = 0; n < count; ++n) {
        const std::string text = kSentences[n];
        const RenderedSpeech rendered = renderSpeech(text, SpeechParams{voice.name, voice.rateWpm, voice.pitch});
        const double leadS = 0.4;
        Signal take = test::concat({test::silence(leadS, rendered.audio.sampleRate), rendered.audio,
                                    test::silence(0.3, rendered.audio.sampleRate)});
        if (n % 2 == 1) test::addNoiseAtSnr(take, 30.0, static_cast<std::uint32_t>(700 + n));
        const std::vector<test::TruthWord> truth = test::truthWords(text, rendered);
        const WordEvidenceResult r = gatherWordEvidence(take, text);
        EXPECT_EQ(static_cast<int>(r.words.size()), truth.back().lastToken + 1) << text;
        if (static_cast<int>(r.words.size()) != truth.back().lastToken + 1) continue;
        for (const test::TruthWord& t : truth) {
            const WordEvidence& w = r.words[static_cast<std::size_t>(t.firstToken)];
            if (!w.spoken) ++f.unplaced;
            f.errorsS.push_back(w.spoken ? std::fabs(w.startS - (t.startS + leadS)) : 10.0);
        }
    }
    std::printf("[ figures  ] espeak-ng %s: %zu word starts, %.1f %% within 50 ms, median %.1f ms, p90 %.1f ms, "
                "%d not placed\n",
                voice.name, f.errorsS.size(), 100 * f.share(0.050), 1000 * test::percentile(f.errorsS, 0.5),
                1000 * test::percentile(f.errorsS, 0.9), f.unplaced);
    return f;
}

void checkVoice(const Voice& voice, double bar) {
    const VoiceFigures f = measure(voice);
    ASSERT_GE(f.errorsS.size(), 90u);
    EXPECT_GE(f.share(0.050), bar);
    EXPECT_LT(test::percentile(f.errorsS, 0.5), 0.015);
}

// The bar. Measured: en-us 95.3 %, en-us+m3 97.2 %, en-gb-x-rp 95.3 %, en+f3 96.2 %
// (the last two were 94.3 % and 91.5 % before pauses over loud vowels were ruled out).
TEST(ModelAlignmentEspeak, AmericanVoice) { checkVoice({"en-us", 170, 50}, 0.95); }
TEST(ModelAlignmentEspeak, AmericanMaleVariant) { checkVoice({"en-us+m3", 175, 45}, 0.95); }
TEST(ModelAlignmentEspeak, BritishVoiceSlowerLower) { checkVoice({"en-gb-x-rp", 150, 40}, 0.95); }
TEST(ModelAlignmentEspeak, FemaleVariantFaster) { checkVoice({"en+f3", 200, 70}, 0.95); }

}  // namespace
}  // namespace earmark
