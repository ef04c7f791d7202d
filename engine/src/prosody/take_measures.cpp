#include "earmark/prosody/take_measures.hpp"

#include "track_stats.hpp"

#include <cmath>

namespace earmark {

LevelMeasures measureLevels(const TakeAnalysis& analysis) {
    LevelMeasures l;
    if (analysis.loudnessLufs && std::isfinite(*analysis.loudnessLufs)) l.loudnessLufs = analysis.loudnessLufs;
    l.peakDbfs = analysis.sampleStats.samplePeakDbfs;
    l.clippedSamples = analysis.sampleStats.clippedSamples;
    l.dcOffset = analysis.sampleStats.dcOffset;
    if (l.clippedSamples > 0) {
        const auto& s = analysis.signal;
        // Same level as SampleStatsMeter's default clip level.
        constexpr float kClip = 0.999f;
        for (std::size_t i = 0; i < s.size(); ++i)
            if (std::fabs(s.samples[i]) >= kClip) {
                if (!l.firstClipS) l.firstClipS = static_cast<double>(i) / s.sampleRate;
                l.lastClipS = static_cast<double>(i) / s.sampleRate;
            }
    }
    return l;
}

TakeMeasures measureTake(const ProsodyContext& context, const LevelMeasures& level) {
    TakeMeasures m;
    const auto& act = context.activity();
    m.durationS = context.durationS();
    m.level = level;
    m.speechLevelDb = act.speechLevelDb;
    m.leadingSilenceS = act.leadingSilenceS();
    m.trailingSilenceS = act.trailingSilenceS();
    m.pauseCount = static_cast<int>(act.pauses.size());
    for (const auto& p : act.pauses) {
        m.pauseTotalS += p.seconds();
        m.longestPauseS = std::max(m.longestPauseS, p.seconds());
    }
    if (act.hasSpeech()) {
        m.speechS = *act.speechEndS - *act.speechStartS;
        m.articulationS = act.articulationSeconds();
    }
    m.words = context.wordCount();
    m.syllables = context.syllables();
    m.syllableSource = context.syllableSource();
    if (m.speechS > 0) {
        if (m.words > 0) m.wordsPerMinute = 60.0 * m.words / m.speechS;
        if (m.syllableSource != SyllableSource::None) {
            m.syllablesPerS = m.syllables / m.speechS;
            if (m.articulationS > 0) m.articulationSyllablesPerS = m.syllables / m.articulationS;
        }
    }
    const auto& pitch = context.pitch();
    auto voiced = detail::voicedF0(pitch, 0.0, pitch.timeSeconds(pitch.size()) + 1.0);
    m.voicedFraction = pitch.size() ? static_cast<double>(voiced.size()) / static_cast<double>(pitch.size()) : 0.0;
    if (static_cast<int>(voiced.size()) >= context.params().minVoicedFrames) {
        const double median = detail::percentile(voiced, 50);
        m.f0MedianHz = median;
        m.f0RangeSt = detail::semitones(detail::percentile(voiced, 95), detail::percentile(voiced, 5));
        double sum = 0, sumSq = 0;
        for (float f : voiced) {
            const double st = detail::semitones(f, median);
            sum += st;
            sumSq += st * st;
        }
        const double n = static_cast<double>(voiced.size());
        const double mean = sum / n;
        m.f0SpreadSt = std::sqrt(std::max(0.0, sumSq / n - mean * mean));
    }
    return m;
}

}  // namespace earmark
