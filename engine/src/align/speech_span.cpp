#include "earmark/align/speech_span.hpp"

#include "earmark/level/energy.hpp"

#include <algorithm>
#include <cmath>
#include <vector>

namespace earmark {

SpeechSpan findSpeechSpan(const Signal& take, const SpeechSpanParams& params) {
    EnergyParams ep;
    ep.hopSeconds = params.hopSeconds;
    ep.windowSeconds = params.windowSeconds;
    const EnergyTrack energy = analyseEnergy(take, ep);
    SpeechSpan span;
    if (energy.db.empty()) return span;
    std::vector<float> sorted = energy.db;
    std::sort(sorted.begin(), sorted.end());
    const auto percentile = [&](double p) {
        return sorted[static_cast<std::size_t>(std::lround(p * static_cast<double>(sorted.size() - 1)))];
    };
    span.floorDb = percentile(0.10);
    span.levelDb = percentile(0.99);
    span.thresholdDb =
        span.floorDb + std::max(params.minMarginDb, params.marginFraction * (span.levelDb - span.floorDb));
    if (span.levelDb < params.minLevelDbfs || span.levelDb - span.floorDb < params.minRangeDb) return span;
    std::size_t first = 0, last = energy.db.size() - 1;
    while (first < energy.db.size() && energy.db[first] <= span.thresholdDb) ++first;
    while (last > first && energy.db[last] <= span.thresholdDb) --last;
    if (first >= energy.db.size()) return span;
    span.found = true;
    span.startS = static_cast<double>(first) * energy.hopSeconds;
    span.endS = static_cast<double>(last) * energy.hopSeconds;
    return span;
}

}  // namespace earmark
