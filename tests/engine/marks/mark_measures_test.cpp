// The measure snapshot of a mark, checked against the known truth of a
// synthetic voice (exact F0 per sample) and the RMS definition of level.
#include "earmark/marks/mark_measures.hpp"

#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace earmark {
namespace {

using K = test::VoiceSegment::Kind;

TEST(MarkMeasures, SnapshotKeepsDefinedMeasuresOnly) {
    SpanMeasures m;
    m.durationS = 0.8;
    m.f0MeanHz = 150.0;
    m.energyMeanDb = -20.0;
    m.f0RangeSt = std::nan("");
    const MeasureSnapshot s = toMeasureSnapshot(m);
    EXPECT_EQ(s.at("duration_s"), 0.8);
    EXPECT_EQ(s.at("f0_mean_hz"), 150.0);
    EXPECT_EQ(s.at("energy_mean_db"), -20.0);
    EXPECT_EQ(s.count("f0_range_st"), 0u);  // NaN is left out, never stored
    EXPECT_EQ(s.count("f0_min_hz"), 0u);
    EXPECT_EQ(s.count("pause_s"), 0u);
    EXPECT_EQ(s.size(), 3u);
}

TEST(MarkMeasures, SpanOfAPitchGlideMatchesTheSyntheticTruth) {
    // 0.3 s silence, 1.0 s voiced gliding geometrically 120 → 180 Hz, 0.3 s silence.
    const double rate = 16000;
    const auto voice = test::synthesiseVoice(
        {{K::Silence, 0.3, 0, 0, 0}, {K::Voiced, 1.0, 120, 180, 0.3}, {K::Silence, 0.3, 0, 0, 0}}, rate);
    const TakeAnalysis analysis = analyseSignal(voice.signal, markMeasureAnalysisParams());
    const ProsodyContext context = ProsodyContext::fromAnalysis(analysis, Transcript{});
    const double start = 0.5, end = 1.1;
    const MeasureSnapshot s = measureMarkSpan(context, start, end);

    EXPECT_DOUBLE_EQ(s.at("duration_s"), 0.6);
    const double truthMin = voice.f0At(start), truthMax = voice.f0At(end);
    EXPECT_NEAR(s.at("f0_min_hz") / truthMin, 1.0, 0.02);
    EXPECT_NEAR(s.at("f0_max_hz") / truthMax, 1.0, 0.02);
    // Semitones: 12·log2(f2/f1) (definition of the equal-tempered semitone).
    EXPECT_NEAR(s.at("f0_range_st"), 12.0 * std::log2(truthMax / truthMin), 0.3);
    // A geometric glide is a straight line in semitones: slope = range / time.
    EXPECT_NEAR(s.at("f0_slope_st_per_s"), 12.0 * std::log2(180.0 / 120.0) / 1.0, 0.5);
    double truthMean = 0;
    int n = 0;
    for (double t = start; t <= end + 1e-9; t += 0.005, ++n) truthMean += voice.f0At(t);
    EXPECT_NEAR(s.at("f0_mean_hz") / (truthMean / n), 1.0, 0.02);

    // Level: 10·log10 of the mean square of the span's samples.
    double power = 0;
    const auto i0 = static_cast<std::size_t>(start * rate), i1 = static_cast<std::size_t>(end * rate);
    for (std::size_t i = i0; i < i1; ++i) power += double(voice.signal.samples[i]) * voice.signal.samples[i];
    EXPECT_NEAR(s.at("energy_mean_db"), 10.0 * std::log10(power / double(i1 - i0)), 0.3);
}

TEST(MarkMeasures, SilentSpanHasNoPitchMeasures) {
    const auto voice = test::synthesiseVoice(
        {{K::Silence, 0.5, 0, 0, 0}, {K::Voiced, 0.5, 150, 150, 0.3}, {K::Silence, 0.5, 0, 0, 0}}, 16000);
    const TakeAnalysis analysis = analyseSignal(voice.signal, markMeasureAnalysisParams());
    const ProsodyContext context = ProsodyContext::fromAnalysis(analysis, Transcript{});
    const MeasureSnapshot s = measureMarkSpan(context, 0.05, 0.4);
    EXPECT_EQ(s.count("f0_mean_hz"), 0u);
    EXPECT_EQ(s.count("f0_range_st"), 0u);
    EXPECT_EQ(s.at("duration_s"), 0.4 - 0.05);
}

}  // namespace
}  // namespace earmark
