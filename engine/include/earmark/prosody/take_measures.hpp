// Per-take prosody and level measures.
//
// Speaking rate counts the speech span (first to last speech frame, pauses
// included); articulation rate excludes the pauses. Both exclude leading and
// trailing silence. F0 figures are over voiced frames, in semitones where
// named so; the percentiles use linear interpolation between ranks.
#pragma once

#include "earmark/analysis/take_analysis.hpp"
#include "earmark/prosody/prosody_context.hpp"

#include <cstdint>
#include <optional>

namespace earmark {

struct LevelMeasures {
    std::optional<double> loudnessLufs;  // BS.1770-4 integrated; empty if not measured or all gated
    double peakDbfs = -INFINITY;         // sample peak over all channels
    std::int64_t clippedSamples = 0;     // samples at or above 0.999 of full scale, all channels
    double dcOffset = 0.0;               // mean sample value (linear)
    // Times of the first and last clipped sample in the analysed (mono) signal.
    std::optional<double> firstClipS, lastClipS;
};

LevelMeasures measureLevels(const TakeAnalysis& analysis);

struct TakeMeasures {
    double durationS = 0.0;
    double speechS = 0.0;                  // speech span, pauses included
    double articulationS = 0.0;            // speech span minus pauses
    int words = 0;                         // word tier or text tokens; 0 if unknown
    int syllables = 0;
    SyllableSource syllableSource = SyllableSource::None;
    std::optional<double> wordsPerMinute;  // words / speech span
    std::optional<double> syllablesPerS;   // speaking rate
    std::optional<double> articulationSyllablesPerS;
    std::optional<double> f0MedianHz;
    std::optional<double> f0RangeSt;       // 12·log2(p95/p5)
    std::optional<double> f0SpreadSt;      // standard deviation of 12·log2(F0/median)
    double voicedFraction = 0.0;
    int pauseCount = 0;
    double pauseTotalS = 0.0;
    double longestPauseS = 0.0;
    double leadingSilenceS = 0.0;
    double trailingSilenceS = 0.0;
    double speechLevelDb = -120.0;         // see SpeechActivity
    LevelMeasures level;
};

TakeMeasures measureTake(const ProsodyContext& context, const LevelMeasures& level);

}  // namespace earmark
