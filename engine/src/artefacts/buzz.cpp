#include "earmark/artefacts/buzz.hpp"

#include "band_energy.hpp"
#include "runs.hpp"
#include "signal_checks.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

void BuzzParams::validate() const {
    if (!(minAperiodicity > 0 && minAperiodicity <= 2)) throw ParamError("BuzzParams.minAperiodicity", "must be in (0, 2]");
    if (!(unvoicedMinAperiodicity > 0 && unvoicedMinAperiodicity <= minAperiodicity))
        throw ParamError("BuzzParams.unvoicedMinAperiodicity", "must be in (0, minAperiodicity]");
    if (!(maxBelowSpeechDb > 0 && std::isfinite(maxBelowSpeechDb)))
        throw ParamError("BuzzParams.maxBelowSpeechDb", "must be positive");
    if (!(lowHz >= 200 && lowHz <= 8000)) throw ParamError("BuzzParams.lowHz", "must be in [200, 8000]");
    if (!(minLowShare > 0 && minLowShare <= 1)) throw ParamError("BuzzParams.minLowShare", "must be in (0, 1]");
    if (!(minSeconds > 0 && std::isfinite(minSeconds))) throw ParamError("BuzzParams.minSeconds", "must be positive");
}

std::vector<ArtefactEvent> findBuzz(const Signal& signal, const PitchTrack& pitch, double speechLevelDb,
                                    const BuzzParams& p, Progress progress) {
    p.validate();
    detail::checkSignal(signal);
    if (!(pitch.hopSeconds > 0)) throw ParamError("PitchTrack.hopSeconds", "must be positive");
    std::vector<ArtefactEvent> events;
    if (signal.empty()) return events;
    // 25 ms frames on the pitch track's hop: the energy track's window.
    const auto bands = detail::bandEnergy(signal, pitch.hopSeconds, 0.025, p.lowHz, signal.sampleRate, progress.sub(0, 0.9));
    const double hop = bands.hopSeconds;
    const double lowShareDb = 10.0 * std::log10(p.minLowShare);
    std::vector<bool> flags(bands.size(), false);
    for (std::size_t f = 0; f < bands.size(); ++f) {
        // The pitch track's frame nearest in time (same hop up to rounding).
        const auto k = static_cast<std::size_t>(std::llround(static_cast<double>(f) * hop / pitch.hopSeconds));
        if (k >= pitch.size()) continue;
        const float aperiodicity = pitch.aperiodicity[k];
        const bool aperiodic = aperiodicity >= p.minAperiodicity ||
                               (!pitch.voiced(k) && aperiodicity >= p.unvoicedMinAperiodicity);
        flags[f] = bands.totalDb[f] >= speechLevelDb - p.maxBelowSpeechDb && aperiodic &&
                   bands.lowDb[f] - bands.totalDb[f] >= lowShareDb;
    }
    for (const auto& run : detail::flaggedRuns(flags, 1)) {
        const double seconds = static_cast<double>(run.length()) * hop;
        if (seconds < p.minSeconds) continue;
        events.push_back({std::max(0.0, (static_cast<double>(run.first) - 0.5) * hop),
                          (static_cast<double>(run.last) + 0.5) * hop, seconds});
    }
    progress.report(1.0);
    return events;
}

}  // namespace earmark
