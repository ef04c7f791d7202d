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

TimeStretcher::TimeStretcher(std::span<const float> input, double sampleRate, const TimeStretchParams& params)
    : x_(input), rate_(params.rate) {
    params.validate();
    if (!(sampleRate > 0) || !std::isfinite(sampleRate)) throw ParamError("Signal.sampleRate", "must be positive");
    outLength_ = static_cast<std::ptrdiff_t>(std::llround(static_cast<double>(x_.size()) / rate_));
    if (x_.empty()) outLength_ = 0;
    hop_ = std::max<std::ptrdiff_t>(1, std::llround(params.frameSeconds * sampleRate / 2));
    tolerance_ = static_cast<std::ptrdiff_t>(std::llround(params.toleranceSeconds * sampleRate));
    const std::ptrdiff_t frame = 2 * hop_;
    // Periodic Hann: at 50 % overlap the windows add up to exactly one.
    window_.resize(static_cast<std::size_t>(frame));
    for (std::ptrdiff_t i = 0; i < frame; ++i)
        window_[static_cast<std::size_t>(i)] =
            static_cast<float>(0.5 - 0.5 * std::cos(2.0 * std::numbers::pi * static_cast<double>(i) / static_cast<double>(frame)));
    pending_.assign(static_cast<std::size_t>(hop_), 0.0f);
    previous_ = -hop_;
}

float TimeStretcher::at(std::ptrdiff_t i) const {
    return i >= 0 && i < static_cast<std::ptrdiff_t>(x_.size()) ? x_[static_cast<std::size_t>(i)] : 0.0f;
}

// Output frame k covers output [k·hop − hop, k·hop + hop) (the first one half
// outside, so sample 0 has full weight); its input segment starts near the
// same place scaled by the rate. After frame k, output [(k−1)·hop, k·hop) is final.
void TimeStretcher::nextFrame() {
    const std::ptrdiff_t frame = 2 * hop_;
    const std::ptrdiff_t outStart = k_ * hop_ - hop_;
    const auto nominal = static_cast<std::ptrdiff_t>(std::llround(static_cast<double>(outStart) * rate_));
    std::ptrdiff_t chosen = nominal;
    if (k_ == 0) {
        chosen = -hop_;
    } else if (tolerance_ > 0) {
        // The input that followed the previous segment is what this frame should resemble.
        const std::ptrdiff_t natural = previous_ + hop_;
        double best = -1e300;
        // Nearest offsets first, so ties (silence) keep the nominal place.
        for (std::ptrdiff_t j = 0; j <= 2 * tolerance_; ++j) {
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
    ready_.clear();
    readyAt_ = 0;
    for (std::ptrdiff_t i = 0; i < hop_; ++i) {
        const auto u = static_cast<std::size_t>(i);
        const float v = pending_[u] + window_[u] * at(chosen + i);
        pending_[u] = window_[u + static_cast<std::size_t>(hop_)] * at(chosen + hop_ + i);
        const std::ptrdiff_t o = outStart + i;
        if (k_ > 0 && o < outLength_) ready_.push_back(v);
    }
    previous_ = chosen;
    ++k_;
}

std::size_t TimeStretcher::read(float* out, std::size_t frames) {
    std::size_t n = 0;
    while (n < frames && done_ < outLength_) {
        if (readyAt_ == ready_.size()) {
            nextFrame();
            continue;
        }
        const std::size_t take = std::min(frames - n, ready_.size() - readyAt_);
        std::copy_n(ready_.begin() + static_cast<std::ptrdiff_t>(readyAt_), take, out + n);
        readyAt_ += take;
        n += take;
        done_ += static_cast<std::ptrdiff_t>(take);
    }
    return n;
}

Signal timeStretch(const Signal& input, const TimeStretchParams& params, Progress progress) {
    TimeStretcher stretcher(input.samples, input.sampleRate, params);
    Signal out;
    out.sampleRate = input.sampleRate;
    out.samples.assign(stretcher.outputLength(), 0.0f);
    constexpr std::size_t block = 1 << 15;
    for (std::size_t at = 0; at < out.samples.size(); at += block) {
        progress.report(static_cast<double>(at) / static_cast<double>(out.samples.size()));
        stretcher.read(out.samples.data() + at, std::min(block, out.samples.size() - at));
    }
    progress.report(1.0);
    return out;
}

}  // namespace earmark
