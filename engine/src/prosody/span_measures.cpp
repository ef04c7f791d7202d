#include "earmark/prosody/span_measures.hpp"

#include "earmark/core/error.hpp"
#include "track_stats.hpp"

#include <algorithm>

namespace earmark {

SpanMeasures measureSpan(const ProsodyContext& context, double startS, double endS) {
    SpanMeasures m;
    m.startS = std::clamp(startS, 0.0, context.durationS());
    m.endS = std::clamp(endS, 0.0, context.durationS());
    if (!(m.endS > m.startS)) throw ParamError("measureSpan.endS", "the span is empty inside the take");
    m.durationS = m.endS - m.startS;

    const auto& words = context.transcript().words;
    const auto& tokens = context.wordTokens();
    for (std::size_t i = 0; i < words.size(); ++i) {
        if (words[i].endS <= m.startS || words[i].startS >= m.endS) continue;
        ++m.wordCount;
        if (!m.words.empty()) m.words += ' ';
        m.words += i < tokens.size() ? tokens[i] : words[i].label;
    }
    const auto f0 = detail::f0Stats(context.pitch(), m.startS, m.endS);
    if (f0.voiced >= context.params().minVoicedFrames) {
        m.f0MeanHz = f0.meanHz;
        m.f0MinHz = f0.minHz;
        m.f0MaxHz = f0.maxHz;
        m.f0RangeSt = detail::semitones(f0.maxHz, f0.minHz);
        m.f0SlopeStPerS = f0.slopeStPerS;
    }
    m.energyMeanDb = detail::energyMeanDb(context.energy(), m.startS, m.endS);
    if (auto pause = context.activity().pauseCovering(m.startS, m.endS)) {
        m.pauseS = pause->seconds();
    } else if (context.syllableSource() != SyllableSource::None && m.durationS >= kMinRateSpanSeconds) {
        m.syllablesPerS = context.syllablesIn(m.startS, m.endS) / m.durationS;
    }
    return m;
}

}  // namespace earmark
