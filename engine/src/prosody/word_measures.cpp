#include "earmark/prosody/word_measures.hpp"

#include "track_stats.hpp"

#include <cmath>

namespace earmark {
namespace {

// z-scores of the defined values; undefined entries get 0.
std::vector<double> zScores(const std::vector<std::optional<double>>& values) {
    double sum = 0, sumSq = 0;
    int n = 0;
    for (const auto& v : values)
        if (v) {
            sum += *v;
            sumSq += *v * *v;
            ++n;
        }
    std::vector<double> z(values.size(), 0.0);
    if (n < 2) return z;
    const double mean = sum / n;
    const double sd = std::sqrt(std::max(0.0, sumSq / n - mean * mean));
    if (!(sd > 1e-12)) return z;
    for (std::size_t i = 0; i < values.size(); ++i)
        if (values[i]) z[i] = (*values[i] - mean) / sd;
    return z;
}

}  // namespace

std::vector<WordMeasures> measureWords(const ProsodyContext& context) {
    const auto& words = context.transcript().words;
    const auto& tokens = context.wordTokens();
    const int minVoiced = context.params().minVoicedFrames;
    std::vector<WordMeasures> out;
    out.reserve(words.size());
    for (std::size_t i = 0; i < words.size(); ++i) {
        const auto& w = words[i];
        WordMeasures m;
        m.text = i < tokens.size() ? tokens[i] : w.label;
        m.startS = w.startS;
        m.endS = w.endS;
        m.durationS = w.endS - w.startS;
        m.syllables = context.wordSyllables(i);
        const auto f0 = detail::f0Stats(context.pitch(), w.startS, w.endS);
        m.voicedFraction = f0.frames > 0 ? static_cast<double>(f0.voiced) / f0.frames : 0.0;
        if (f0.voiced >= minVoiced) {
            m.f0MeanHz = f0.meanHz;
            m.f0MinHz = f0.minHz;
            m.f0MaxHz = f0.maxHz;
            m.f0RangeSt = detail::semitones(f0.maxHz, f0.minHz);
            m.f0PeakPosition = std::clamp((f0.maxAtS - w.startS) / m.durationS, 0.0, 1.0);
            m.f0SlopeStPerS = f0.slopeStPerS;
        }
        m.energyMeanDb = detail::energyMeanDb(context.energy(), w.startS, w.endS);
        m.energyMaxDb = detail::energyMaxDb(context.energy(), w.startS, w.endS);
        if (i > 0) m.pauseBeforeS = std::max(0.0, w.startS - words[i - 1].endS);
        if (i + 1 < words.size()) m.pauseAfterS = std::max(0.0, words[i + 1].startS - w.endS);
        out.push_back(std::move(m));
    }
    // Prominence: weighted sum of z-scores within the take (common practice).
    std::vector<std::optional<double>> peakSt, energy, durPerSyl;
    for (const auto& m : out) {
        peakSt.push_back(m.f0MaxHz ? std::optional<double>(detail::semitones(*m.f0MaxHz, 100.0)) : std::nullopt);
        energy.push_back(m.energyMeanDb);
        durPerSyl.push_back(m.durationS / std::max(1, m.syllables));
    }
    const auto zF0 = zScores(peakSt), zE = zScores(energy), zD = zScores(durPerSyl);
    const auto& wgt = context.params().prominence;
    for (std::size_t i = 0; i < out.size(); ++i)
        out[i].prominence = wgt.f0 * zF0[i] + wgt.energy * zE[i] + wgt.duration * zD[i];
    return out;
}

}  // namespace earmark
