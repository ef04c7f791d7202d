#include "earmark/playback/loop.hpp"

#include "earmark/core/error.hpp"

#include <cmath>

namespace earmark {

Loop makeLoop(const Signal& span, double crossfadeSeconds) {
    if (!(span.sampleRate > 0) || !std::isfinite(span.sampleRate)) throw ParamError("Signal.sampleRate", "must be positive");
    const std::size_t n = span.size();
    if (!(crossfadeSeconds >= 0) || crossfadeSeconds * span.sampleRate > static_cast<double>(n) / 2)
        throw ParamError("LoopParams.crossfadeSeconds", "must be >= 0 and at most half the span");
    const auto fade = static_cast<std::size_t>(std::llround(crossfadeSeconds * span.sampleRate));
    Loop loop;
    loop.firstPass.sampleRate = loop.body.sampleRate = span.sampleRate;
    loop.firstPass.samples.assign(span.samples.begin(), span.samples.begin() + static_cast<std::ptrdiff_t>(n - fade));
    loop.body.samples = loop.firstPass.samples;
    for (std::size_t i = 0; i < fade; ++i) {
        const double g = (static_cast<double>(i) + 0.5) / static_cast<double>(fade);
        loop.body.samples[i] = static_cast<float>(span.samples[n - fade + i] * (1.0 - g) + span.samples[i] * g);
    }
    return loop;
}

Signal renderLoop(const Signal& span, double crossfadeSeconds, std::size_t passes) {
    if (passes < 1) throw ParamError("renderLoop.passes", "must be >= 1");
    Loop loop = makeLoop(span, crossfadeSeconds);
    Signal out = std::move(loop.firstPass);
    for (std::size_t p = 1; p < passes; ++p) out.samples.insert(out.samples.end(), loop.body.samples.begin(), loop.body.samples.end());
    return out;
}

}  // namespace earmark
