// Accuracy of text-to-audio alignment against a truth from outside the
// aligner: each test take is rendered by libespeak-ng with a voice variant,
// pitch and speed different from the aligner's reference reading (en-us,
// 175 wpm, pitch 50), some with added white noise and leading/trailing
// silence, and the truth is that rendering's own word events (where the
// renderer itself started and ended each word).
//
// Bar (from the issue): >= 90 % of word boundaries within 50 ms, median
// error < 20 ms. The sentences are invented here.
#include "earmark/align/speech_render.hpp"
#include "earmark/align/text_aligner.hpp"
#include "support/espeak_truth.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

namespace earmark {
namespace {

using test::percentile;
using test::TruthWord;
using test::truthWords;

const char* const kSentences[] = {
    "The lighthouse keeper counted seven gulls before breakfast.",
    "Please carry the blue crate down to the lower deck.",
    "Our ferry leaves the northern pier at a quarter past nine.",
    "Thick fog rolled over the harbour, and the horns began to sound.",
    "A small boy waved from the railing as the boat turned.",
    "Fresh bread arrives from the island bakery every other morning.",
    "The captain asked everyone to remain seated during the crossing.",
    "Twelve bicycles were chained beside the ticket office.",
    "She found a silver key wedged between two wooden planks.",
    "Why does the evening tide rise so quickly in autumn?",
    "Gentle waves lapped against the stone wall of the quay.",
    "The engine room smelled of oil, rope and salt water.",
    "Passengers with heavy luggage should use the side ramp.",
    "A narrow path climbs from the beach to the old chapel.",
    "Nobody expected the storm to arrive before midnight.",
    "The market stalls close early on windy afternoons.",
    "Her brother repairs fishing nets in a shed by the slipway.",
    "Bright lanterns hung along the promenade all summer long.",
    "We waited forty minutes for the delayed return sailing.",
    "The museum keeps a model of every ship built in the town.",
    "Could you tell me where the nearest bus stop is?",
    "Seals often sleep on the sandbank when the water is low.",
    "The radio crackled with a message from the coast guard.",
    "Three children built a castle with a moat and a bridge.",
    "Warm soup was served in the cabin to the tired crew.",
    "The ferry company printed a new timetable in March.",
    "A cold wind swept across the empty car park.",
    "Most visitors walk to the cliffs to watch the sunset.",
    "The harbour master writes every arrival in a thick ledger.",
    "Mind the gap between the boat and the landing stage.",
    "Dolphins followed the bow for almost half an hour.",
    "The café on the pier sells pies, tea and hot chocolate.",
    "Each cabin has two bunks, a small sink and a round window.",
    "After the long crossing, everyone was glad to see land.",
    "The signal lamp flashed green, then red, then green again.",
    "Our guide pointed out the ruins of a Roman fort on the hill.",
};

struct Variant {
    const char* voice;
    int rateWpm;
    int pitch;
    double snrDb;      // <= 0: no noise
    double leadS;      // silence before
    double trailS;     // silence after
};

// Variants cycle over the sentences: different voices, speeds and pitches
// from the reference; every third take noisy, every other one padded.
const Variant kVariants[] = {
    {"en+f3", 150, 70, 0, 0.0, 0.0},         {"en-gb-x-rp", 200, 35, 25, 0.8, 0.5},
    {"en+m3", 165, 40, 0, 1.2, 0.0},         {"en-gb-x-rp", 140, 60, 20, 0.0, 0.0},
    {"en+f2", 190, 65, 0, 0.5, 1.0},         {"en-us+m5", 215, 45, 30, 0.0, 0.3},
    {"en-us+klatt", 180, 55, 25, 0.6, 0.6},  {"en+f4", 235, 80, 0, 0.3, 0.0},
};

// One test take: the rendering (with noise and padding) and its truth.
struct TestTake {
    std::string text;
    Signal audio;
    std::vector<TruthWord> truth;
};

// libespeak-ng's output drifts by a few samples from call to call (its
// synthesiser keeps state between utterances), so the takes are rendered
// once and every comparison uses the same ones.
const std::vector<TestTake>& testTakes() {
    static const std::vector<TestTake> takes = [] {
        std::vector<TestTake> out;
        const std::size_t count = sizeof kSentences / sizeof kSentences[0];
        for (std::size_t n = 0; n < count; ++n) {
            const Variant& v = kVariants[n % (sizeof kVariants / sizeof kVariants[0])];
            TestTake t;
            t.text = kSentences[n];
            const RenderedSpeech rendered = renderSpeech(t.text, SpeechParams{v.voice, v.rateWpm, v.pitch});
            t.truth = truthWords(t.text, rendered);
            t.audio = test::concat({test::silence(v.leadS, rendered.audio.sampleRate), rendered.audio,
                                    test::silence(v.trailS, rendered.audio.sampleRate)});
            if (v.snrDb > 0) test::addNoiseAtSnr(t.audio, v.snrDb, static_cast<std::uint32_t>(100 + n));
            for (auto& w : t.truth) w.startS += v.leadS, w.endS += v.leadS;
            out.push_back(std::move(t));
        }
        return out;
    }();
    return takes;
}

struct Scores {
    std::vector<double> errorsS;
    int takes = 0;
    double seconds = 0.0;  // time spent in alignText

    double share(double withinS) const {
        const auto n = std::count_if(errorsS.begin(), errorsS.end(), [&](double e) { return e <= withinS; });
        return static_cast<double>(n) / static_cast<double>(errorsS.size());
    }
};

Scores score(const AlignParams& params) {
    Scores scores;
    for (const TestTake& take : testTakes()) {
        const auto t0 = std::chrono::steady_clock::now();
        const AlignResult result = alignText(take.audio, take.text, params);
        scores.seconds += std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
        // One aligned word per token of these sentences (no numbers or lone punctuation).
        const Tier& words = *result.tiers.find("words");
        const auto& truth = take.truth;
        EXPECT_EQ(static_cast<int>(words.intervals.size()), truth.back().lastToken + 1) << take.text;
        if (static_cast<int>(words.intervals.size()) != truth.back().lastToken + 1) continue;
        ++scores.takes;
        for (std::size_t k = 0; k < truth.size(); ++k) {
            scores.errorsS.push_back(std::fabs(words.intervals[truth[k].firstToken].startS - truth[k].startS));
            // A shared boundary (word end = next word start) is scored once.
            if (k + 1 == truth.size() || std::fabs(truth[k].endS - truth[k + 1].startS) > 1e-9)
                scores.errorsS.push_back(std::fabs(words.intervals[truth[k].lastToken].endS - truth[k].endS));
        }
    }
    return scores;
}

void report(const char* name, const Scores& s) {
    std::printf("[ figures  ] %s: %d takes, %zu word boundaries: median %.1f ms, p90 %.1f ms, p95 %.1f ms, "
                "max %.1f ms, %.1f %% within 50 ms, %.1f %% within 20 ms; aligned in %.2f s\n",
                name, s.takes, s.errorsS.size(), 1000 * percentile(s.errorsS, 0.5), 1000 * percentile(s.errorsS, 0.9),
                1000 * percentile(s.errorsS, 0.95), 1000 * percentile(s.errorsS, 1.0), 100.0 * s.share(0.050),
                100.0 * s.share(0.020), s.seconds);
}

TEST(AlignmentAccuracy, WordBoundariesOfOtherVoicesMeetTheBar) {
    const Scores s = score(AlignParams{});
    report("default (refined)", s);
    ASSERT_GE(s.takes, 30);
    EXPECT_GE(s.share(0.050), 0.90);
    EXPECT_LT(percentile(s.errorsS, 0.5), 0.020);
}

TEST(AlignmentAccuracy, RefinementDoesNotMakeBoundariesWorse) {
    AlignParams carriedOnly;
    carriedOnly.refine = false;
    const Scores raw = score(carriedOnly);
    const Scores refined = score(AlignParams{});
    report("carried only", raw);
    report("refined", refined);
    EXPECT_LE(percentile(refined.errorsS, 0.5), percentile(raw.errorsS, 0.5) + 0.001);
    EXPECT_GE(refined.share(0.050), raw.share(0.050) - 0.01);
}

}  // namespace
}  // namespace earmark
