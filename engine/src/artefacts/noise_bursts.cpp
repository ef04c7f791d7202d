#include "earmark/artefacts/noise_bursts.hpp"

#include "band_energy.hpp"
#include "runs.hpp"
#include "signal_checks.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

void NoiseBurstParams::validate() const {
    auto finite = [](double v) { return std::isfinite(v); };
    if (!(bandHz >= 1000 && bandHz <= 20000)) throw ParamError("NoiseBurstParams.bandHz", "must be in [1000, 20000]");
    if (!(hopSeconds > 0 && hopSeconds <= 0.05)) throw ParamError("NoiseBurstParams.hopSeconds", "must be in (0, 0.05]");
    if (!(windowSeconds >= hopSeconds && windowSeconds <= 0.1))
        throw ParamError("NoiseBurstParams.windowSeconds", "must be in [hopSeconds, 0.1]");
    if (!(contextSeconds > 0 && contextSeconds <= 1))
        throw ParamError("NoiseBurstParams.contextSeconds", "must be in (0, 1]");
    if (!(gapSeconds > 0 && gapSeconds < contextSeconds))
        throw ParamError("NoiseBurstParams.gapSeconds", "must be in (0, contextSeconds)");
    if (!(minExcessDb > 0 && finite(minExcessDb))) throw ParamError("NoiseBurstParams.minExcessDb", "must be positive");
    if (!(maxSeconds > 0 && finite(maxSeconds))) throw ParamError("NoiseBurstParams.maxSeconds", "must be positive");
    if (!(belowSpeechDb > 0 && finite(belowSpeechDb)))
        throw ParamError("NoiseBurstParams.belowSpeechDb", "must be positive");
}

namespace {

float medianOf(const std::vector<float>& v, std::ptrdiff_t a, std::ptrdiff_t b, std::vector<float>& scratch) {
    a = std::max<std::ptrdiff_t>(a, 0);
    b = std::min<std::ptrdiff_t>(b, static_cast<std::ptrdiff_t>(v.size()) - 1);
    if (a > b) return -150.0f;
    scratch.assign(v.begin() + a, v.begin() + b + 1);
    auto mid = scratch.begin() + static_cast<std::ptrdiff_t>(scratch.size() / 2);
    std::nth_element(scratch.begin(), mid, scratch.end());
    return *mid;
}

}  // namespace

std::vector<ArtefactEvent> findNoiseBursts(const Signal& signal, const PitchTrack& pitch, double speechLevelDb,
                                           const NoiseBurstParams& p, Progress progress) {
    p.validate();
    detail::checkSignal(signal);
    if (!(pitch.hopSeconds > 0)) throw ParamError("PitchTrack.hopSeconds", "must be positive");
    std::vector<ArtefactEvent> events;
    if (signal.sampleRate / 2 <= p.bandHz + 500.0 || signal.empty()) return events;
    const auto bands = detail::bandEnergy(signal, p.hopSeconds, p.windowSeconds, 1000.0, p.bandHz, progress.sub(0, 0.8));
    const double hop = bands.hopSeconds;
    const auto gap = static_cast<std::ptrdiff_t>(std::lround(p.gapSeconds / hop));
    const auto context = static_cast<std::ptrdiff_t>(std::lround(p.contextSeconds / hop));
    const auto& high = bands.highDb;
    const double audible = speechLevelDb - p.belowSpeechDb;
    std::vector<float> excess(high.size(), 0.0f), scratch;
    std::vector<bool> flags(high.size(), false);
    for (std::size_t f = 0; f < high.size(); ++f) {
        if (high[f] < audible) continue;  // cheap test first: most frames stop here
        const auto i = static_cast<std::ptrdiff_t>(f);
        const float left = medianOf(high, i - context, i - gap, scratch);
        const float right = medianOf(high, i + gap, i + context, scratch);
        excess[f] = high[f] - std::max(left, right);
        flags[f] = excess[f] >= p.minExcessDb;
    }
    auto voicedAt = [&](double t) {
        if (t < 0) return false;
        const auto k = static_cast<std::size_t>(std::llround(t / pitch.hopSeconds));
        return k < pitch.size() && pitch.voiced(k);
    };
    for (const auto& run : detail::flaggedRuns(flags)) {
        const double seconds = static_cast<double>(run.length()) * hop;
        if (seconds > p.maxSeconds) continue;
        if (!voicedAt(static_cast<double>(run.first) * hop - p.gapSeconds) ||
            !voicedAt(static_cast<double>(run.last) * hop + p.gapSeconds))
            continue;
        float peak = 0.0f;
        for (std::size_t f = run.first; f <= run.last; ++f) peak = std::max(peak, excess[f]);
        events.push_back({std::max(0.0, (static_cast<double>(run.first) - 0.5) * hop),
                          (static_cast<double>(run.last) + 0.5) * hop, peak});
    }
    progress.report(1.0);
    return events;
}

}  // namespace earmark
