#include "earmark/artefacts/clicks.hpp"

#include "earmark/core/error.hpp"
#include "earmark/dsp/autoregressive.hpp"
#include "signal_checks.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

void ClickParams::validate() const {
    if (!(blockSeconds > 0 && blockSeconds <= 0.1)) throw ParamError("ClickParams.blockSeconds", "must be in (0, 0.1]");
    if (!(windowSeconds >= blockSeconds && windowSeconds <= 0.2))
        throw ParamError("ClickParams.windowSeconds", "must be in [blockSeconds, 0.2]");
    if (!(minRatio > 0 && std::isfinite(minRatio))) throw ParamError("ClickParams.minRatio", "must be positive");
    if (!(minIsolation >= 1 && std::isfinite(minIsolation)))
        throw ParamError("ClickParams.minIsolation", "must be >= 1");
    if (!(isolationSeconds > 0 && isolationSeconds <= 0.1))
        throw ParamError("ClickParams.isolationSeconds", "must be in (0, 0.1]");
    if (!(floorBelowSpeechDb > 0 && std::isfinite(floorBelowSpeechDb)))
        throw ParamError("ClickParams.floorBelowSpeechDb", "must be positive");
}

std::vector<ArtefactEvent> findClicks(const Signal& signal, double speechLevelDb, const ClickParams& params,
                                      Progress progress) {
    params.validate();
    detail::checkSignal(signal);
    const auto& x = signal.samples;
    const std::size_t n = x.size();
    const double rate = signal.sampleRate;
    const int order = std::min(40, 2 + static_cast<int>(std::lround(rate / 1000.0)));
    const auto block = static_cast<std::size_t>(std::max(1.0, std::round(params.blockSeconds * rate)));
    const auto window = static_cast<std::size_t>(std::max<double>(order + 2, std::round(params.windowSeconds * rate)));
    std::vector<ArtefactEvent> events;
    if (n < static_cast<std::size_t>(order) * 4) return events;

    // d[n] = |interpolation error| (Godsill & Rayner's single-impulse detector).
    std::vector<float> d(n, 0.0f);
    ArFitter fitter(order, window);
    std::vector<double> a, residual;
    for (std::size_t b0 = 0; b0 < n; b0 += block) {
        if ((b0 / block) % 512 == 0) progress.report(0.9 * static_cast<double>(b0) / static_cast<double>(n));
        const std::size_t b1 = std::min(n, b0 + block);
        const auto centre = static_cast<std::ptrdiff_t>((b0 + b1) / 2);
        fitter.fit(x, centre - static_cast<std::ptrdiff_t>(window / 2), a);
        // Forward prediction error e over the block and `order` samples beyond,
        // then ε[i] = Σ_k a_k e[i + k] (the matched filter for one impulse).
        const std::size_t e1 = std::min(n, b1 + static_cast<std::size_t>(order));
        residual.assign(e1 - b0, 0.0);
        for (std::size_t i = b0; i < e1; ++i) {
            double fwd = x[i];
            for (int k = 1; k <= order && static_cast<std::size_t>(k) <= i; ++k) fwd += a[k] * x[i - k];
            residual[i - b0] = fwd;
        }
        double c0 = 0.0;  // Σ a_k²: ε / c0 is the sample minus its two-sided interpolation
        for (double v : a) c0 += v * v;
        for (std::size_t i = b0; i < b1; ++i) {
            double eps = 0.0;
            for (int k = 0; k <= order && i + k < e1; ++k) eps += a[k] * residual[i - b0 + k];
            d[i] = static_cast<float>(std::fabs(eps) / c0);
        }
    }

    // Robust scale per block, floored relative to the speech level.
    const double floor = std::pow(10.0, (speechLevelDb - params.floorBelowSpeechDb) / 20.0);
    const auto isolation = static_cast<std::ptrdiff_t>(std::max(1.0, std::round(params.isolationSeconds * rate)));
    const auto guard = static_cast<std::ptrdiff_t>(order + 1);
    const auto half = static_cast<std::ptrdiff_t>(rate * 0.0005);
    std::vector<float> scratch;
    for (std::size_t b0 = 0; b0 < n; b0 += block) {
        const std::size_t b1 = std::min(n, b0 + block);
        const std::size_t w0 = b0 > window / 2 ? b0 - window / 2 : 0;
        const std::size_t w1 = std::min(n, b1 + window / 2);
        float peak = 0.0f;
        for (std::size_t i = b0; i < b1; ++i) peak = std::max(peak, d[i]);
        if (peak <= floor * params.minRatio) continue;  // nothing in this block can pass
        scratch.assign(d.begin() + static_cast<std::ptrdiff_t>(w0), d.begin() + static_cast<std::ptrdiff_t>(w1));
        auto mid = scratch.begin() + static_cast<std::ptrdiff_t>(scratch.size() / 2);
        std::nth_element(scratch.begin(), mid, scratch.end());
        const double scale = std::max(floor, 1.4826 * static_cast<double>(*mid));
        for (std::size_t i = b0; i < b1; ++i) {
            const double ratio = d[i] / scale;
            if (ratio < params.minRatio) continue;
            // The largest d nearby, outside the click's own residual tail.
            const auto c = static_cast<std::ptrdiff_t>(i);
            float other = 0.0f;
            for (std::ptrdiff_t j = std::max<std::ptrdiff_t>(0, c - isolation);
                 j <= std::min<std::ptrdiff_t>(static_cast<std::ptrdiff_t>(n) - 1, c + isolation); ++j)
                if (j < c - guard || j > c + guard) other = std::max(other, d[static_cast<std::size_t>(j)]);
            if (d[i] < params.minIsolation * other) continue;
            const double t0 = static_cast<double>(std::max<std::ptrdiff_t>(0, c - half)) / rate;
            const double t1 = static_cast<double>(c + 1 + half) / rate;
            if (!events.empty() && t0 <= events.back().endS) {
                auto& last = events.back();
                last.endS = std::max(last.endS, t1);
                last.value = std::max(last.value, ratio);
            } else {
                events.push_back({t0, t1, ratio});
            }
        }
    }
    progress.report(1.0);
    return events;
}

}  // namespace earmark
