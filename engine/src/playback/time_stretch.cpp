#include "earmark/playback/time_stretch.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <vector>

namespace earmark {

void TimeStretchParams::validate() const {
    if (!(rate >= 0.25 && rate <= 2.0)) throw ParamError("TimeStretchParams.rate", "must be in [0.25, 2]");
    if (!(frameSeconds >= 0.005 && frameSeconds <= 0.1))
        throw ParamError("TimeStretchParams.frameSeconds", "must be in [0.005, 0.1]");
    if (!(toleranceSeconds >= 0 && toleranceSeconds <= frameSeconds))
        throw ParamError("TimeStretchParams.toleranceSeconds", "must be in [0, frameSeconds]");
}

Signal timeStretch(const Signal& input, const TimeStretchParams& params, Progress progress) {
    params.validate();
    if (!(input.sampleRate > 0) || !std::isfinite(input.sampleRate))
        throw ParamError("Signal.sampleRate", "must be positive");
    Signal out;
    out.sampleRate = input.sampleRate;
    const auto& x = input.samples;
    const auto n = static_cast<std::ptrdiff_t>(x.size());
    const auto outLength = static_cast<std::ptrdiff_t>(std::llround(static_cast<double>(n) / params.rate));
    out.samples.assign(static_cast<std::size_t>(outLength), 0.0f);
    if (n == 0) return out;
    const std::ptrdiff_t hop = std::max<std::ptrdiff_t>(1, std::llround(params.frameSeconds * input.sampleRate / 2));
    const std::ptrdiff_t frame = 2 * hop;
    const auto tolerance = static_cast<std::ptrdiff_t>(std::llround(params.toleranceSeconds * input.sampleRate));
    // Periodic Hann: at 50 % overlap the windows add up to exactly one.
    std::vector<float> window(static_cast<std::size_t>(frame));
    for (std::ptrdiff_t i = 0; i < frame; ++i)
        window[static_cast<std::size_t>(i)] =
            static_cast<float>(0.5 - 0.5 * std::cos(2.0 * std::numbers::pi * static_cast<double>(i) / static_cast<double>(frame)));
    auto at = [&](std::ptrdiff_t i) { return i >= 0 && i < n ? x[static_cast<std::size_t>(i)] : 0.0f; };

    // Output frame k starts at k·hop − hop (the first one half outside, so
    // sample 0 has full weight); its input segment starts near the same
    // place scaled by the rate.
    std::ptrdiff_t previous = -hop;  // input start of the previous segment
    const std::ptrdiff_t frames = outLength / hop + 2;
    for (std::ptrdiff_t k = 0; k < frames; ++k) {
        if (k % 256 == 0) progress.report(static_cast<double>(k) / static_cast<double>(frames));
        const std::ptrdiff_t outStart = k * hop - hop;
        const auto nominal = static_cast<std::ptrdiff_t>(std::llround(static_cast<double>(outStart) * params.rate));
        std::ptrdiff_t chosen = nominal;
        if (k > 0 && tolerance > 0) {
            // The input that followed the previous segment is what this frame should resemble.
            const std::ptrdiff_t natural = previous + hop;
            double best = -1e300;
            // Nearest offsets first, so ties (silence) keep the nominal place.
            for (std::ptrdiff_t j = 0; j <= 2 * tolerance; ++j) {
                const std::ptrdiff_t d = j % 2 == 0 ? j / 2 : -(j + 1) / 2;
                const std::ptrdiff_t s = nominal + d;
                // Normalised by the candidate's energy: by Cauchy–Schwarz the
                // natural continuation itself (when in range) scores highest.
                double c = 0.0, e = 1e-12;
                for (std::ptrdiff_t i = 0; i < frame; ++i) {
                    const double v = at(s + i);
                    c += v * at(natural + i);
                    e += v * v;
                }
                c /= std::sqrt(e);
                if (c > best) {
                    best = c;
                    chosen = s;
                }
            }
        }
        if (k == 0) chosen = -hop;
        for (std::ptrdiff_t i = 0; i < frame; ++i) {
            const std::ptrdiff_t o = outStart + i;
            if (o >= 0 && o < outLength) out.samples[static_cast<std::size_t>(o)] += window[static_cast<std::size_t>(i)] * at(chosen + i);
        }
        previous = chosen;
    }
    progress.report(1.0);
    return out;
}

}  // namespace earmark
