// Word, span and take measures on synthetic tracks whose truth is known in
// closed form: a geometric F0 glide is a straight line in semitones, so its
// least-squares slope and range are exact; a uniform spread in semitones has
// a known percentile range and standard deviation (12/√12 st per octave).
#include "earmark/core/error.hpp"
#include "earmark/prosody/span_measures.hpp"
#include "earmark/prosody/take_measures.hpp"
#include "earmark/prosody/word_measures.hpp"

#include "prosody_test_util.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace earmark {
namespace {

using test::kProsodyHop;
using test::iv;

struct Tracks {
    PitchTrack pitch;
    EnergyTrack energy;
    double durationS;
};

// 3 s take: silence 0–0.5; word "rising" 0.5–1.0 (F0 100→200 Hz geometric,
// −20 dB); word "level" 1.0–1.4 (150 Hz, −12 dB); pause 1.4–2.0 (silence);
// word "whisper" 2.0–2.6 (unvoiced, −30 dB); silence to 3.0.
Tracks threeWords() {
    Tracks t;
    t.durationS = 3.0;
    const auto frames = static_cast<std::size_t>(t.durationS / kProsodyHop) + 1;
    t.pitch.hopSeconds = t.energy.hopSeconds = kProsodyHop;
    t.pitch.f0Hz.assign(frames, 0.0f);
    t.pitch.confidence.assign(frames, 0.0f);
    t.pitch.aperiodicity.assign(frames, 1.0f);
    t.energy.db.assign(frames, -120.0f);
    for (std::size_t i = 0; i < frames; ++i) {
        const double s = static_cast<double>(i) * kProsodyHop;
        if (s >= 0.5 && s < 1.0) {
            t.pitch.f0Hz[i] = static_cast<float>(100.0 * std::pow(2.0, (s - 0.5) / 0.5));
            t.energy.db[i] = -20.0f;
        } else if (s >= 1.0 && s < 1.4) {
            t.pitch.f0Hz[i] = 150.0f;
            t.energy.db[i] = -12.0f;
        } else if (s >= 2.0 && s < 2.6) {
            t.energy.db[i] = -30.0f;
        }
    }
    return t;
}

ProsodyContext context(const Tracks& t, Transcript tr) { return ProsodyContext(t.pitch, t.energy, t.durationS, std::move(tr)); }

Transcript threeWordTranscript() {
    Transcript tr;
    tr.text = "Rising level, whisper.";
    tr.words = {iv(0.5, 1.0, "rising"), iv(1.0, 1.4, "level"), iv(2.0, 2.6, "whisper")};
    return tr;
}

TEST(SpeechActivity, FindsSpeechPausesAndSilences) {
    const auto t = threeWords();
    const auto act = detectSpeech(t.energy, t.durationS);
    // Speech level = 95th percentile of frames above the floor = −12 dB; threshold −42 dB.
    EXPECT_NEAR(act.speechLevelDb, -12.0, 1e-6);
    EXPECT_NEAR(act.thresholdDb, -42.0, 1e-6);
    ASSERT_TRUE(act.hasSpeech());
    EXPECT_NEAR(*act.speechStartS, 0.5, kProsodyHop);
    EXPECT_NEAR(*act.speechEndS, 2.6, kProsodyHop);
    ASSERT_EQ(act.pauses.size(), 1u);
    EXPECT_NEAR(act.pauses[0].startS, 1.4, kProsodyHop);
    EXPECT_NEAR(act.pauses[0].seconds(), 0.6, kProsodyHop);
    EXPECT_NEAR(act.leadingSilenceS(), 0.5, kProsodyHop);
    EXPECT_NEAR(act.trailingSilenceS(), 0.4, kProsodyHop);
    EXPECT_NEAR(act.articulationSeconds(), 1.5, 2 * kProsodyHop);
    // A gap shorter than the minimum pause is bridged.
    PauseParams longer;
    longer.minPauseSeconds = 0.7;
    EXPECT_TRUE(detectSpeech(t.energy, t.durationS, longer).pauses.empty());
    EXPECT_THROW(detectSpeech(t.energy, t.durationS, PauseParams{.minPauseSeconds = 0}), ParamError);
}

TEST(SpeechActivity, SilentTakeHasNoSpeech) {
    EnergyTrack e{0.01, std::vector<float>(100, -120.0f)};
    const auto act = detectSpeech(e, 1.0);
    EXPECT_FALSE(act.hasSpeech());
    EXPECT_DOUBLE_EQ(act.leadingSilenceS(), 1.0);
    EXPECT_DOUBLE_EQ(act.articulationSeconds(), 0.0);
}

TEST(WordMeasures, GlideLevelAndUnvoicedWords) {
    const auto t = threeWords();
    const auto ctx = context(t, threeWordTranscript());
    const auto words = measureWords(ctx);
    ASSERT_EQ(words.size(), 3u);
    const auto& rising = words[0];
    EXPECT_EQ(rising.text, "Rising");  // the text's token, punctuation kept
    EXPECT_NEAR(rising.durationS, 0.5, 1e-12);
    EXPECT_NEAR(*rising.f0MinHz, 100.0, 1e-3);
    EXPECT_NEAR(*rising.f0MaxHz, 200.0 * std::pow(2.0, -kProsodyHop / 0.5), 1e-3);  // last frame is one hop early
    EXPECT_NEAR(*rising.f0RangeSt, 12.0 - 12.0 * kProsodyHop / 0.5, 1e-3);
    EXPECT_NEAR(*rising.f0SlopeStPerS, 24.0, 1e-6);  // 12 st over 0.5 s
    EXPECT_NEAR(*rising.f0PeakPosition, 1.0, 2 * kProsodyHop / 0.5);
    EXPECT_NEAR(*rising.energyMeanDb, -20.0, 1e-4);
    EXPECT_NEAR(rising.voicedFraction, 1.0, 1e-12);
    EXPECT_FALSE(rising.pauseBeforeS.has_value());
    EXPECT_NEAR(*rising.pauseAfterS, 0.0, 1e-12);

    const auto& level = words[1];
    EXPECT_EQ(level.text, "level,");
    EXPECT_NEAR(*level.f0RangeSt, 0.0, 1e-9);
    EXPECT_NEAR(*level.f0SlopeStPerS, 0.0, 1e-9);
    EXPECT_NEAR(*level.pauseAfterS, 0.6, 1e-12);

    const auto& whisper = words[2];
    EXPECT_FALSE(whisper.f0MeanHz.has_value());
    EXPECT_FALSE(whisper.f0SlopeStPerS.has_value());
    EXPECT_DOUBLE_EQ(whisper.voicedFraction, 0.0);
    EXPECT_NEAR(*whisper.energyMaxDb, -30.0, 1e-6);

    // Prominence = z(F0 peak st) + z(mean dB) + z(duration per syllable),
    // z-scores worked out by hand: F0 peaks (two voiced words) ±1, whisper 0;
    // energies −20, −12, −30 dB → z 0.0905, 1.1770, −1.2675; 2 syllables each,
    // durations per syllable 0.25, 0.2, 0.3 s → z 0, −1.2247, 1.2247.
    EXPECT_NEAR(rising.prominence, 1.0 + 0.0905 + 0.0, 1e-3);
    EXPECT_NEAR(level.prominence, -1.0 + 1.1770 - 1.2247, 1e-3);
    EXPECT_NEAR(whisper.prominence, 0.0 - 1.2675 + 1.2247, 1e-3);
}

TEST(SpanMeasures, OneFunctionOneValue) {
    const auto t = threeWords();
    const auto ctx = context(t, threeWordTranscript());
    const auto span = measureSpan(ctx, 0.5, 1.0);
    EXPECT_EQ(span.wordCount, 1);
    EXPECT_EQ(span.words, "Rising");
    EXPECT_NEAR(*span.f0SlopeStPerS, 24.0, 1e-6);
    EXPECT_NEAR(*span.f0MinHz, 100.0, 1e-3);
    // "rising" has 2 syllables by the spelling rule: 2 / 0.5 s.
    EXPECT_NEAR(*span.syllablesPerS, 4.0, 1e-9);
    EXPECT_FALSE(span.pauseS.has_value());
    // Inside the same word, a span shorter than a syllable has no rate.
    EXPECT_FALSE(measureSpan(ctx, 0.6, 0.68).syllablesPerS.has_value());
    EXPECT_TRUE(measureSpan(ctx, 0.6, 0.6 + kMinRateSpanSeconds).syllablesPerS.has_value());

    const auto pause = measureSpan(ctx, 1.5, 1.9);
    EXPECT_EQ(pause.wordCount, 0);
    ASSERT_TRUE(pause.pauseS.has_value());
    EXPECT_NEAR(*pause.pauseS, 0.6, kProsodyHop);
    EXPECT_FALSE(pause.f0MeanHz.has_value());

    const auto both = measureSpan(ctx, 0.9, 1.1);
    EXPECT_EQ(both.words, "Rising level,");
    EXPECT_THROW(measureSpan(ctx, 3.5, 4.0), ParamError);
    // Clamped to the take.
    EXPECT_NEAR(measureSpan(ctx, -1.0, 0.25).durationS, 0.25, 1e-12);
}

TEST(TakeMeasures, RatesPitchSpreadAndPauses) {
    // F0 spread uniformly over one octave in semitones (100 → 200 Hz) over 2 s of speech.
    Tracks t;
    t.durationS = 3.0;
    const auto frames = static_cast<std::size_t>(t.durationS / kProsodyHop) + 1;
    t.pitch.hopSeconds = t.energy.hopSeconds = kProsodyHop;
    t.pitch.f0Hz.assign(frames, 0.0f);
    t.energy.db.assign(frames, -120.0f);
    for (std::size_t i = 0; i < frames; ++i) {
        const double s = static_cast<double>(i) * kProsodyHop;
        if (s >= 0.5 && s < 2.5) {
            t.pitch.f0Hz[i] = static_cast<float>(100.0 * std::pow(2.0, (s - 0.5) / 2.0));
            t.energy.db[i] = -18.0f;
        }
    }
    Transcript tr;
    tr.text = "Seven syllables in this little line";  // 2+3+1+1+2+1 = 10
    const auto ctx = context(t, tr);
    LevelMeasures level;
    level.loudnessLufs = -23.0;
    const auto m = measureTake(ctx, level);
    EXPECT_NEAR(m.durationS, 3.0, 1e-12);
    EXPECT_NEAR(m.speechS, 2.0, 2 * kProsodyHop);
    EXPECT_EQ(m.words, 6);
    EXPECT_EQ(m.syllables, 10);
    EXPECT_EQ(m.syllableSource, SyllableSource::Text);
    EXPECT_NEAR(*m.wordsPerMinute, 180.0, 1.0);
    EXPECT_NEAR(*m.syllablesPerS, 5.0, 0.03);
    EXPECT_NEAR(*m.articulationSyllablesPerS, 5.0, 0.03);
    EXPECT_NEAR(*m.f0MedianHz, 100.0 * std::sqrt(2.0), 0.2);
    EXPECT_NEAR(*m.f0RangeSt, 0.9 * 12.0, 0.05);
    EXPECT_NEAR(*m.f0SpreadSt, 12.0 / std::sqrt(12.0), 0.01);
    EXPECT_EQ(m.pauseCount, 0);
    EXPECT_NEAR(m.leadingSilenceS, 0.5, kProsodyHop);
    EXPECT_NEAR(m.trailingSilenceS, 0.5, kProsodyHop);
    EXPECT_EQ(*m.level.loudnessLufs, -23.0);
}

TEST(ProsodyContext, SyllableSourcesInOrderOfPreference) {
    const auto t = threeWords();
    Transcript phones = threeWordTranscript();
    phones.phones = {iv(0.5, 0.6, "R"), iv(0.6, 0.8, "AY1"), iv(0.8, 1.0, "Z"), iv(1.0, 1.2, "EH1"),
                     iv(1.2, 1.4, "L"), iv(2.0, 2.3, "IH"), iv(2.3, 2.6, "ER0")};
    const auto fromPhones = context(t, phones);
    EXPECT_EQ(fromPhones.syllableSource(), SyllableSource::Phones);
    EXPECT_EQ(fromPhones.syllables(), 4);
    EXPECT_EQ(fromPhones.wordSyllables(2), 2);
    const auto fromText = context(t, threeWordTranscript());
    EXPECT_EQ(fromText.syllableSource(), SyllableSource::Text);
    EXPECT_EQ(fromText.syllables(), 2 + 2 + 2);
    const auto fromEnergy = context(t, Transcript{});
    EXPECT_EQ(fromEnergy.syllableSource(), SyllableSource::EnergyPeaks);
    EXPECT_EQ(fromEnergy.wordCount(), 0);
}

}  // namespace
}  // namespace earmark
