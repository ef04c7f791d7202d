// The measures of one time span, as a value: the snapshot a mark carries.
#pragma once

#include "earmark/prosody/prosody_context.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct SpanMeasures {
    double startS = 0.0, endS = 0.0, durationS = 0.0;  // clamped to the take
    int wordCount = 0;                   // words overlapping the span
    std::string words;                   // their text joined by spaces
    std::optional<double> f0MeanHz, f0MinHz, f0MaxHz;
    std::optional<double> f0RangeSt;     // 12·log2(max/min) over voiced frames
    std::optional<double> f0SlopeStPerS; // least-squares slope, semitones per second
    std::optional<double> energyMeanDb;  // 10·log10(mean power), dBFS
    std::optional<double> syllablesPerS; // ProsodyContext::syllablesIn / duration; empty for spans
                                         // shorter than kMinRateSpanSeconds
    std::optional<double> pauseS;        // length of the pause the span lies in (≥ 80 % inside it)
};

// A speaking rate over less than about one syllable's length says nothing
// (a 80 ms span would read 0 or 12 syllables/s); common practice.
inline constexpr double kMinRateSpanSeconds = 0.25;

// Throws ParamError("measureSpan.endS") when endS <= startS after clamping to the take.
SpanMeasures measureSpan(const ProsodyContext& context, double startS, double endS);

}  // namespace earmark
