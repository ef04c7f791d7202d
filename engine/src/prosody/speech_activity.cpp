#include "earmark/prosody/speech_activity.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {
namespace {

double percentileOf(std::vector<float> v, double p) {
    std::sort(v.begin(), v.end());
    const double pos = p / 100.0 * static_cast<double>(v.size() - 1);
    const auto lo = static_cast<std::size_t>(std::floor(pos));
    const auto hi = std::min(lo + 1, v.size() - 1);
    return v[lo] + (pos - static_cast<double>(lo)) * (v[hi] - v[lo]);
}

// Sets runs of `value` shorter than minFrames (and not touching either end
// when `interiorOnly`) to the other value.
void removeShortRuns(std::vector<std::uint8_t>& flags, std::uint8_t value, long minFrames, bool interiorOnly) {
    const auto n = static_cast<long>(flags.size());
    long i = 0;
    while (i < n) {
        if (flags[i] != value) {
            ++i;
            continue;
        }
        long j = i;
        while (j < n && flags[j] == value) ++j;
        const bool interior = i > 0 && j < n;
        if (j - i < minFrames && (interior || !interiorOnly))
            std::fill(flags.begin() + i, flags.begin() + j, static_cast<std::uint8_t>(1 - value));
        i = j;
    }
}

}  // namespace

void PauseParams::validate() const {
    if (!(minPauseSeconds > 0)) throw ParamError("PauseParams.minPauseSeconds", "must be positive");
    if (!(silenceBelowSpeechDb > 0)) throw ParamError("PauseParams.silenceBelowSpeechDb", "must be positive");
    if (!std::isfinite(absoluteSilenceDb) || absoluteSilenceDb > 0)
        throw ParamError("PauseParams.absoluteSilenceDb", "must be a finite dBFS value <= 0");
    if (!(minSpeechSeconds >= 0)) throw ParamError("PauseParams.minSpeechSeconds", "must be >= 0");
    if (!(speechLevelPercentile > 0 && speechLevelPercentile <= 100))
        throw ParamError("PauseParams.speechLevelPercentile", "must be in (0, 100]");
}

double SpeechActivity::articulationSeconds() const {
    if (!hasSpeech()) return 0.0;
    double total = *speechEndS - *speechStartS;
    for (const auto& p : pauses) total -= p.seconds();
    return std::max(0.0, total);
}

double SpeechActivity::longestSilenceWithin(double startS, double endS) const {
    if (!(hopSeconds > 0)) return 0.0;
    const auto n = static_cast<long>(rawSpeech.size());
    const long a = std::clamp(static_cast<long>(std::ceil(startS / hopSeconds)), 0L, n);
    const long b = std::clamp(static_cast<long>(std::ceil(endS / hopSeconds)), 0L, n);
    long best = 0, run = 0;
    for (long i = a; i < b; ++i) {
        run = rawSpeech[i] ? 0 : run + 1;
        best = std::max(best, run);
    }
    return static_cast<double>(best) * hopSeconds;
}

std::optional<Pause> SpeechActivity::pauseCovering(double startS, double endS, double share) const {
    const double span = endS - startS;
    if (!(span > 0)) return std::nullopt;
    for (const auto& p : pauses) {
        const double overlap = std::min(endS, p.endS) - std::max(startS, p.startS);
        if (overlap >= share * span) return p;
    }
    return std::nullopt;
}

SpeechActivity detectSpeech(const EnergyTrack& energy, double durationS, const PauseParams& params) {
    params.validate();
    if (!(energy.hopSeconds > 0)) throw ParamError("detectSpeech.energy", "energy track has no positive hop");
    SpeechActivity out;
    out.hopSeconds = energy.hopSeconds;
    out.durationS = durationS;
    const double hop = energy.hopSeconds;
    // Only frames whose centre lies inside the take.
    const auto frames = std::min(energy.db.size(),
                                 static_cast<std::size_t>(std::floor(durationS / hop + 1e-9)) + 1);
    std::vector<float> loud;
    for (std::size_t i = 0; i < frames; ++i)
        if (energy.db[i] > params.absoluteSilenceDb) loud.push_back(energy.db[i]);
    out.speechLevelDb = params.absoluteSilenceDb;
    out.thresholdDb = params.absoluteSilenceDb;
    out.rawSpeech.assign(frames, 0);
    if (loud.empty()) {
        out.speech = out.rawSpeech;
        return out;
    }
    out.speechLevelDb = percentileOf(std::move(loud), params.speechLevelPercentile);
    out.thresholdDb = std::max(params.absoluteSilenceDb, out.speechLevelDb - params.silenceBelowSpeechDb);
    for (std::size_t i = 0; i < frames; ++i) out.rawSpeech[i] = energy.db[i] >= out.thresholdDb ? 1 : 0;

    out.speech = out.rawSpeech;
    const auto minPause = static_cast<long>(std::ceil(params.minPauseSeconds / hop - 1e-9));
    const auto minSpeech = static_cast<long>(std::ceil(params.minSpeechSeconds / hop - 1e-9));
    removeShortRuns(out.speech, 0, minPause, true);     // bridge short gaps inside speech
    removeShortRuns(out.speech, 1, minSpeech, false);   // drop clicks
    removeShortRuns(out.speech, 0, minPause, true);     // gaps left by dropped clicks

    const auto n = static_cast<long>(frames);
    long firstSpeech = -1, lastSpeech = -1;
    for (long i = 0; i < n; ++i)
        if (out.speech[i]) {
            if (firstSpeech < 0) firstSpeech = i;
            lastSpeech = i;
        }
    if (firstSpeech < 0) return out;
    out.speechStartS = std::max(0.0, (static_cast<double>(firstSpeech) - 0.5) * hop);
    out.speechEndS = std::min(durationS, (static_cast<double>(lastSpeech) + 0.5) * hop);
    long i = firstSpeech;
    while (i <= lastSpeech) {
        if (out.speech[i]) {
            ++i;
            continue;
        }
        long j = i;
        while (j <= lastSpeech && !out.speech[j]) ++j;
        out.pauses.push_back({(static_cast<double>(i) - 0.5) * hop, (static_cast<double>(j) - 0.5) * hop});
        i = j;
    }
    return out;
}

}  // namespace earmark
