#include "earmark/dsp/frames.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <string>

namespace earmark {

FrameLayout::FrameLayout(std::int64_t numSamples_, int frameSize_, int hop_)
    : numSamples(numSamples_), frameSize(frameSize_), hop(hop_) {
    if (numSamples < 0) throw ParamError("FrameLayout.numSamples", "must not be negative");
    if (frameSize < 1) throw ParamError("FrameLayout.frameSize", "must be at least 1, got " + std::to_string(frameSize));
    if (hop < 1) throw ParamError("FrameLayout.hop", "must be at least 1, got " + std::to_string(hop));
}

std::int64_t FrameLayout::count() const {
    return numSamples == 0 ? 0 : numSamples / hop + 1;
}

namespace {
std::int64_t reflectIndex(std::int64_t i, std::int64_t n) {
    if (n == 1) return 0;
    const std::int64_t period = 2 * (n - 1);
    i %= period;
    if (i < 0) i += period;
    return i < n ? i : period - i;
}
}  // namespace

void copyFrame(std::span<const float> signal, const FrameLayout& layout, std::int64_t frame,
               std::span<float> out, FramePadding padding) {
    if (out.size() < static_cast<std::size_t>(layout.frameSize))
        throw ParamError("copyFrame.out", "buffer smaller than the frame size");
    const auto n = static_cast<std::int64_t>(signal.size());
    const std::int64_t first = layout.firstSample(frame);
    const std::int64_t last = first + layout.frameSize;  // exclusive
    std::fill(out.begin() + layout.frameSize, out.end(), 0.0f);
    if (first >= 0 && last <= n) {  // the common case: fully inside
        std::copy(signal.begin() + first, signal.begin() + last, out.begin());
        return;
    }
    for (std::int64_t i = first; i < last; ++i) {
        float v = 0.0f;
        if (i >= 0 && i < n) v = signal[static_cast<std::size_t>(i)];
        else if (padding == FramePadding::Reflect && n > 0) v = signal[static_cast<std::size_t>(reflectIndex(i, n))];
        out[static_cast<std::size_t>(i - first)] = v;
    }
}

int hopSamples(double hopSeconds, double sampleRate) {
    if (!(hopSeconds > 0)) throw ParamError("hopSeconds", "must be positive");
    return std::max(1, static_cast<int>(std::lround(hopSeconds * sampleRate)));
}

}  // namespace earmark
