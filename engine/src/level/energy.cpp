#include "earmark/level/energy.hpp"

#include "earmark/core/error.hpp"
#include "earmark/dsp/frames.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

EnergyTrack analyseEnergy(const Signal& signal, const EnergyParams& params, Progress progress) {
    if (!(params.hopSeconds > 0)) throw ParamError("EnergyParams.hopSeconds", "must be positive");
    if (!(params.windowSeconds > 0)) throw ParamError("EnergyParams.windowSeconds", "must be positive");
    if (!(signal.sampleRate > 0)) throw ParamError("Signal.sampleRate", "must be positive");
    const int hop = hopSamples(params.hopSeconds, signal.sampleRate);
    const int win = std::max(1, static_cast<int>(std::lround(params.windowSeconds * signal.sampleRate)));
    const FrameLayout layout(static_cast<std::int64_t>(signal.size()), win, hop);

    EnergyTrack track;
    track.hopSeconds = static_cast<double>(hop) / signal.sampleRate;
    const std::int64_t frames = layout.count();
    track.db.resize(static_cast<std::size_t>(frames));

    // Running sum of squares in double: O(1) per frame whatever the window.
    std::vector<double> prefix(signal.size() + 1, 0.0);
    for (std::size_t i = 0; i < signal.size(); ++i)
        prefix[i + 1] = prefix[i] + static_cast<double>(signal.samples[i]) * signal.samples[i];
    const auto n = static_cast<std::int64_t>(signal.size());
    const double floorPower = std::pow(10.0, params.floorDb / 10.0);
    for (std::int64_t f = 0; f < frames; ++f) {
        const std::int64_t a = std::clamp<std::int64_t>(layout.firstSample(f), 0, n);
        const std::int64_t b = std::clamp<std::int64_t>(layout.firstSample(f) + win, 0, n);
        const double power = std::max(0.0, prefix[b] - prefix[a]) / win;  // zeros outside count
        track.db[static_cast<std::size_t>(f)] =
            static_cast<float>(power > floorPower ? 10.0 * std::log10(power) : params.floorDb);
        if ((f & 0xFFFF) == 0) progress.report(static_cast<double>(f) / frames);
    }
    progress.report(1.0);
    return track;
}

}  // namespace earmark
