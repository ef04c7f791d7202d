// compareTakes on espeak-ng renderings with known differences: the same line
// read 20 % slower (espeak-ng's rate at 0.8×), and a copy shifted up by
// 3 semitones with sox (`pitch 300`, 300 cents). The truth for the slower
// reading is the renderer's own word events (align/reference_tiers.hpp).
#include "earmark/align/reference_tiers.hpp"
#include "earmark/align/speech_render.hpp"
#include "earmark/compare/take_comparison.hpp"
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>

namespace earmark {
namespace {

using ::testing::HasSubstr;

const std::string kLine = "The lighthouse keeper counted seven gulls before breakfast.";

struct Rendered {
    Signal audio;
    Tier words;  // the renderer's own word timings
};

Rendered render(int rateWpm, const std::string& text = kLine) {
    RenderedSpeech s = renderSpeech(text, SpeechParams{"en-us", rateWpm, 50});
    return {std::move(s.audio), referenceTiers(text, s).words};
}

double median(std::vector<double> v) {
    std::sort(v.begin(), v.end());
    return v[v.size() / 2];
}

TEST(TakeComparison, SlowerReadingFromTheTextGivesWordRatiosNearTheRenderersOwn) {
    const Rendered a = render(175), b = render(140);  // 0.8 × the rate
    const TakeComparison c = compareTakes({a.audio, {}}, {b.audio, {}}, kLine);
    EXPECT_EQ(c.a.wordSource, WordSource::FromText);
    EXPECT_EQ(c.b.wordSource, WordSource::FromText);
    EXPECT_EQ(c.alignment.method, AlignmentMethod::WordByWord);
    ASSERT_TRUE(c.words);
    ASSERT_EQ(c.words->words.size(), a.words.intervals.size());
    std::vector<double> ratios, errors;
    for (std::size_t i = 0; i < c.words->words.size(); ++i) {
        const auto& ta = a.words.intervals[i];
        const auto& tb = b.words.intervals[i];
        const double truth = (tb.endS - tb.startS) / (ta.endS - ta.startS);
        const double measured = c.words->words[i].durationRatio;
        ratios.push_back(measured);
        errors.push_back(std::abs(measured / truth - 1.0));
        // Within 5 % of the renderer's own ratio (the shortest word, "The",
        // lasts 0.11 s: 5 % of it is 5 ms).
        EXPECT_NEAR(measured / truth, 1.0, 0.05) << ta.label;
        // Flagged for duration exactly when the change reaches 30 % (away from the threshold).
        const bool flagged = std::ranges::count(c.words->words[i].flags, WordDifference::Duration) > 0;
        if (std::abs(truth - 1.3) > 0.03) {
            EXPECT_EQ(flagged, truth >= 1.3) << ta.label;
        }
    }
    // espeak-ng's rate is not exactly proportional: its own words range 1.19-1.32 here.
    EXPECT_NEAR(median(ratios), 1.25, 0.05);
    EXPECT_NEAR(c.overall.durationRatio, 1.25, 0.05);
    RecordProperty("median_word_ratio", std::to_string(median(ratios)));
    RecordProperty("overall_ratio", std::to_string(c.overall.durationRatio));
    RecordProperty("worst_word_ratio_error", std::to_string(*std::max_element(errors.begin(), errors.end())));
    // Same voice and pitch setting: F0 close.
    ASSERT_TRUE(c.overall.f0MeanDiffSt);
    EXPECT_NEAR(*c.overall.f0MeanDiffSt, 0.0, 1.0);
}

TEST(TakeComparison, WordsOfOneTakeAreCarriedThroughTheFramePath) {
    const Rendered a = render(175), b = render(140);
    const TakeComparison c = compareTakes({a.audio, a.words}, {b.audio, {}});
    EXPECT_EQ(c.alignment.method, AlignmentMethod::FrameWise);
    EXPECT_EQ(c.a.wordSource, WordSource::Given);
    EXPECT_EQ(c.b.wordSource, WordSource::Carried);
    ASSERT_EQ(c.b.words.intervals.size(), b.words.intervals.size());
    double worst = 0.0;
    for (std::size_t i = 0; i < b.words.intervals.size(); ++i) {
        const Interval& truth = b.words.intervals[i];
        const Interval& carried = c.b.words.intervals[i];
        worst = std::max({worst, std::abs(carried.startS - truth.startS), std::abs(carried.endS - truth.endS)});
    }
    EXPECT_LT(worst, 0.05);  // boundaries carried by the warping path within 50 ms
    RecordProperty("worst_carried_boundary_error_s", std::to_string(worst));
    ASSERT_TRUE(c.words);
    std::vector<double> ratios;
    for (const WordComparison& w : c.words->words) ratios.push_back(w.durationRatio);
    EXPECT_NEAR(median(ratios), 1.25, 0.05);
}

TEST(TakeComparison, PitchShiftedCopyShowsTheShiftAndNothingElse) {
    if (std::system("command -v sox >/dev/null 2>&1") != 0) GTEST_SKIP() << "needs sox";
    test::TempDir dir;
    const Rendered a = render(160);
    writeWav(dir.file("a.wav"), a.audio, WavEncoding::Float32);
    // sox pitch: cents, tempo kept (WSOLA). 300 cents = 3 semitones.
    const std::string cmd = "sox -D -R -V1 '" + dir.file("a.wav") + "' '" + dir.file("b.wav") + "' pitch 300";
    ASSERT_EQ(std::system(cmd.c_str()), 0);
    const Signal b = loadAudio(dir.file("b.wav")).signal;
    const TakeComparison c = compareTakes({a.audio, a.words}, {b, {}}, kLine);
    EXPECT_EQ(c.b.wordSource, WordSource::FromText);
    ASSERT_TRUE(c.overall.f0MeanDiffSt);
    EXPECT_NEAR(*c.overall.f0MeanDiffSt, 3.0, 0.3);
    EXPECT_NEAR(*c.overall.f0MeanAbsDiffSt, 3.0, 0.3);
    EXPECT_NEAR(c.overall.durationRatio, 1.0, 0.05);
    // A shift keeps the range (a ratio); sox's WSOLA shifting loses some of
    // the final low creak, which widens B's range by about 1 st here.
    ASSERT_TRUE(c.overall.f0RangeDiffSt);
    EXPECT_NEAR(*c.overall.f0RangeDiffSt, 0.0, 1.5);
    RecordProperty("f0_mean_diff_st", std::to_string(*c.overall.f0MeanDiffSt));
    RecordProperty("f0_range_diff_st", std::to_string(*c.overall.f0RangeDiffSt));
    ASSERT_TRUE(c.words);
    for (const WordComparison& w : c.words->words) {
        if (!w.f0MeanDiffSt) continue;
        // Short words have few voiced frames, and WSOLA smears their edges.
        EXPECT_NEAR(*w.f0MeanDiffSt, 3.0, w.a.durationS >= 0.3 ? 0.3 : 0.6) << w.text;
        EXPECT_THAT(w.flags, ::testing::Contains(WordDifference::F0Mean)) << w.text;  // 3 st >= the 2 st threshold
    }
}

TEST(TakeComparison, IdenticalTakesDifferInNothing) {
    const Rendered a = render(175);
    const TakeComparison c = compareTakes({a.audio, a.words}, {a.audio, a.words});
    EXPECT_EQ(c.alignment.method, AlignmentMethod::WordByWord);
    EXPECT_DOUBLE_EQ(c.overall.mcdDb, 0.0);
    EXPECT_DOUBLE_EQ(c.overall.durationRatio, 1.0);
    ASSERT_TRUE(c.overall.f0MeanDiffSt);
    EXPECT_DOUBLE_EQ(*c.overall.f0MeanDiffSt, 0.0);
    for (const FramePair& p : c.alignment.pairs) EXPECT_EQ(p.a, p.b);
    ASSERT_TRUE(c.words);
    for (const WordComparison& w : c.words->words) {
        EXPECT_DOUBLE_EQ(w.durationRatio, 1.0);
        EXPECT_TRUE(w.flags.empty());
    }
}

TEST(TakeComparison, WithoutWordsOrTextItComparesFrameWiseAndSaysSo) {
    const Rendered a = render(175), b = render(140);
    const TakeComparison c = compareTakes({a.audio, {}}, {b.audio, {}});
    EXPECT_EQ(c.alignment.method, AlignmentMethod::FrameWise);
    EXPECT_FALSE(c.words);
    EXPECT_EQ(c.a.wordSource, WordSource::None);
    ASSERT_FALSE(c.notes.empty());
    EXPECT_THAT(c.notes.back(), HasSubstr("no per-word table"));
    EXPECT_NEAR(c.overall.durationRatio, 1.25, 0.06);  // speech spans from energy
    EXPECT_GT(c.overall.alignedPairs, 0);
    EXPECT_EQ(c.pairMcdDb.size(), c.alignment.pairs.size());
    EXPECT_EQ(c.pairF0DiffSt.size(), c.alignment.pairs.size());
}

TEST(TakeComparison, DifferentWordsAreRefusedNamingTheFirstDifference) {
    const Rendered a = render(175);
    const std::string other = "The lighthouse keeper counted seven crows before breakfast.";
    const Rendered b = render(175, other);
    try {
        compareTakes({a.audio, a.words}, {b.audio, b.words});
        ADD_FAILURE() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "wordsB");
        EXPECT_THAT(e.problem(), HasSubstr("word 6 is 'crows' but take A has 'gulls'"));
    }
}

TEST(TakeComparison, EmptyOrSilentAudioIsABadInputNamingTheTake) {
    const Rendered a = render(175);
    Signal empty;
    empty.sampleRate = 22050;
    try {
        compareTakes({a.audio, {}}, {empty, {}});
        ADD_FAILURE() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "B");
    }
    Signal silence;
    silence.sampleRate = 22050;
    silence.samples.assign(22050, 0.0f);
    try {
        compareTakes({silence, {}}, {a.audio, {}});
        ADD_FAILURE() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "A");
        EXPECT_THAT(e.problem(), HasSubstr("no speech"));
    }
}

}  // namespace
}  // namespace earmark
