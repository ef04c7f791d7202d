#include "earmark/artefacts/noise_bursts.hpp"

#include "band_energy.hpp"
#include "runs.hpp"
#include "signal_checks.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

void NoiseBurstParams::validate() const {
    auto positive = [](double v) { return v > 0 && std::isfinite(v); };
    if (!(bandHz >= 1000 && bandHz <= 20000)) throw ParamError("NoiseBurstParams.bandHz", "must be in [1000, 20000]");
    if (!(subBandHz >= 250 && subBandHz <= 4000))
        throw ParamError("NoiseBurstParams.subBandHz", "must be in [250, 4000]");
    if (!(lowBandHz >= 300 && lowBandHz < bandHz))
        throw ParamError("NoiseBurstParams.lowBandHz", "must be in [300, bandHz)");
    if (!(hopSeconds > 0 && hopSeconds <= 0.05)) throw ParamError("NoiseBurstParams.hopSeconds", "must be in (0, 0.05]");
    if (!(windowSeconds >= hopSeconds && windowSeconds <= 0.1))
        throw ParamError("NoiseBurstParams.windowSeconds", "must be in [hopSeconds, 0.1]");
    if (!(contextSeconds > 0 && contextSeconds <= 1))
        throw ParamError("NoiseBurstParams.contextSeconds", "must be in (0, 1]");
    if (!(gapSeconds > 0 && gapSeconds < contextSeconds))
        throw ParamError("NoiseBurstParams.gapSeconds", "must be in (0, contextSeconds)");
    if (!positive(minExcessDb)) throw ParamError("NoiseBurstParams.minExcessDb", "must be positive");
    if (!positive(maxSeconds)) throw ParamError("NoiseBurstParams.maxSeconds", "must be positive");
    if (!positive(belowSpeechDb)) throw ParamError("NoiseBurstParams.belowSpeechDb", "must be positive");
    if (!positive(maxLowDipDb)) throw ParamError("NoiseBurstParams.maxLowDipDb", "must be positive");
    if (!positive(maxMidRiseDb)) throw ParamError("NoiseBurstParams.maxMidRiseDb", "must be positive");
}

namespace {

// Band edges: low band, mid band, then the high band's sub-bands up to the
// Nyquist frequency (a last sub-band narrower than half the width joins the one before).
std::vector<double> bandEdges(const NoiseBurstParams& p, double nyquistHz) {
    std::vector<double> edges = {0.0, p.lowBandHz, p.bandHz};
    while (nyquistHz - edges.back() >= 1.5 * p.subBandHz) edges.push_back(edges.back() + p.subBandHz);
    edges.push_back(nyquistHz + 1.0);  // + 1 Hz: the Nyquist bin belongs to the last band
    return edges;
}

// A band's level over time, and its rise at frame i above the larger of the
// medians of its two sides' contexts.
class ContextRise {
public:
    ContextRise(const detail::BandLevels& levels, std::ptrdiff_t gap, std::ptrdiff_t context)
        : levels_(levels), gap_(gap), context_(context) {}

    float rise(std::size_t band, std::size_t frame) {
        const auto i = static_cast<std::ptrdiff_t>(frame);
        const float left = median(band, i - context_, i - gap_);
        const float right = median(band, i + gap_, i + context_);
        return levels_.at(frame, band) - std::max(left, right);
    }

private:
    float median(std::size_t band, std::ptrdiff_t a, std::ptrdiff_t b) {
        a = std::max<std::ptrdiff_t>(a, 0);
        b = std::min<std::ptrdiff_t>(b, static_cast<std::ptrdiff_t>(levels_.frames()) - 1);
        if (a > b) return -150.0f;
        scratch_.clear();
        for (std::ptrdiff_t f = a; f <= b; ++f) scratch_.push_back(levels_.at(static_cast<std::size_t>(f), band));
        auto mid = scratch_.begin() + static_cast<std::ptrdiff_t>(scratch_.size() / 2);
        std::nth_element(scratch_.begin(), mid, scratch_.end());
        return *mid;
    }

    const detail::BandLevels& levels_;
    std::ptrdiff_t gap_, context_;
    std::vector<float> scratch_;
};

}  // namespace

std::vector<ArtefactEvent> findNoiseBursts(const Signal& signal, const PitchTrack& pitch, double speechLevelDb,
                                           const NoiseBurstParams& p, Progress progress) {
    p.validate();
    detail::checkSignal(signal);
    if (!(pitch.hopSeconds > 0)) throw ParamError("PitchTrack.hopSeconds", "must be positive");
    std::vector<ArtefactEvent> events;
    const double nyquist = signal.sampleRate / 2;
    if (nyquist <= p.bandHz + 500.0 || signal.empty()) return events;
    const auto levels =
        detail::bandLevels(signal, p.hopSeconds, p.windowSeconds, bandEdges(p, nyquist), progress.sub(0, 0.8));
    const double hop = levels.hopSeconds;
    const std::size_t lowBand = 0, midBand = 1, firstHigh = 2, bands = levels.bands;
    ContextRise context(levels, static_cast<std::ptrdiff_t>(std::lround(p.gapSeconds / hop)),
                        static_cast<std::ptrdiff_t>(std::lround(p.contextSeconds / hop)));
    const double audible = speechLevelDb - p.belowSpeechDb;
    std::vector<float> excess(levels.frames(), 0.0f), rises;
    std::vector<bool> flags(levels.frames(), false);
    for (std::size_t f = 0; f < levels.frames(); ++f) {
        double highPower = 0.0;
        for (std::size_t b = firstHigh; b < bands; ++b) highPower += std::pow(10.0, levels.at(f, b) / 10.0);
        if (10.0 * std::log10(std::max(highPower, 1e-15)) < audible) continue;  // most frames stop here
        rises.clear();
        for (std::size_t b = firstHigh; b < bands; ++b) rises.push_back(context.rise(b, f));
        auto mid = rises.begin() + static_cast<std::ptrdiff_t>(rises.size() / 2);
        std::nth_element(rises.begin(), mid, rises.end());
        excess[f] = *mid;
        flags[f] = excess[f] >= p.minExcessDb;
    }
    auto voicedAt = [&](double t) {
        if (t < 0) return false;
        const auto k = static_cast<std::size_t>(std::llround(t / pitch.hopSeconds));
        return k < pitch.size() && pitch.voiced(k);
    };
    // Judged over the run's frames by their medians: one frame is noisy.
    std::vector<float> lows, mids;
    auto consonantLike = [&](const detail::Run& run) {
        lows.clear();
        mids.clear();
        for (std::size_t f = run.first; f <= run.last; ++f) {
            lows.push_back(context.rise(lowBand, f));
            mids.push_back(context.rise(midBand, f));
        }
        auto median = [](std::vector<float>& v) {
            std::sort(v.begin(), v.end());
            return v.size() % 2 ? v[v.size() / 2] : 0.5f * (v[v.size() / 2 - 1] + v[v.size() / 2]);
        };
        return median(lows) < -p.maxLowDipDb || median(mids) >= p.maxMidRiseDb;
    };
    for (const auto& run : detail::flaggedRuns(flags, 1)) {
        const double seconds = static_cast<double>(run.length()) * hop;
        if (seconds > p.maxSeconds) continue;
        if (!voicedAt(static_cast<double>(run.first) * hop - p.gapSeconds) ||
            !voicedAt(static_cast<double>(run.last) * hop + p.gapSeconds) || consonantLike(run))
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
