#include "earmark/playback/playback_stream.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

namespace {

std::span<const float> spanOf(const Signal& take, const PlaybackSpan& s) {
    if (!(take.sampleRate > 0) || !std::isfinite(take.sampleRate)) throw ParamError("Signal.sampleRate", "must be positive");
    const auto first = static_cast<std::int64_t>(std::llround(s.startSeconds * take.sampleRate));
    const auto last = static_cast<std::int64_t>(std::llround(s.endSeconds * take.sampleRate));
    if (!(std::isfinite(s.startSeconds) && std::isfinite(s.endSeconds)) || first < 0 ||
        last > static_cast<std::int64_t>(take.size()) || last <= first)
        throw ParamError("PlaybackSpan", "must lie inside the take and hold at least one sample");
    return std::span<const float>(take.samples).subspan(static_cast<std::size_t>(first), static_cast<std::size_t>(last - first));
}

}  // namespace

PlaybackStream::PlaybackStream(const Signal& take, const PlaybackSpan& span, const PlaybackParams& params)
    : take_(take),
      span_(spanOf(take, span)),
      startSeconds_(static_cast<double>(std::llround(span.startSeconds * take.sampleRate)) / take.sampleRate),
      loop_(span.loop),
      stretch_(params.stretch),
      current_(span_, take.sampleRate, params.stretch) {
    if (!(params.crossfadeSeconds >= 0)) throw ParamError("PlaybackParams.crossfadeSeconds", "must be >= 0");
    stretched_ = static_cast<std::int64_t>(current_.outputLength());
    fade_ = loop_ ? std::min<std::int64_t>(std::llround(params.crossfadeSeconds * take.sampleRate), stretched_ / 2) : 0;
    pass_ = stretched_ - fade_;
}

TimeStretcher PlaybackStream::newPass() const { return TimeStretcher(span_, take_.sampleRate, stretch_); }

std::size_t PlaybackStream::read(float* out, std::size_t frames) {
    std::size_t n = 0;
    while (n < frames) {
        const auto inPass = static_cast<std::int64_t>(current_.produced());
        if (!loop_ || inPass < pass_) {
            // Up to the fade (a loop) or the end (a one-shot).
            const std::int64_t room = loop_ ? pass_ - inPass : stretched_ - inPass;
            const std::size_t got = current_.read(out + n, std::min<std::size_t>(frames - n, static_cast<std::size_t>(room)));
            n += got;
            if (got == 0) break;  // a one-shot span has ended
            continue;
        }
        // The fade: this pass's tail into the next pass's head, g = (i + 0.5)/C as in makeLoop.
        if (!next_) next_.emplace(newPass());
        const std::int64_t i = inPass - pass_;
        if (i == fade_) {
            current_ = std::move(*next_);
            next_.reset();
            continue;
        }
        const std::size_t m = std::min<std::size_t>(frames - n, static_cast<std::size_t>(fade_ - i));
        tail_.resize(m);
        head_.resize(m);
        current_.read(tail_.data(), m);
        next_->read(head_.data(), m);
        for (std::size_t j = 0; j < m; ++j) {
            const double g = (static_cast<double>(i + static_cast<std::int64_t>(j)) + 0.5) / static_cast<double>(fade_);
            out[n + j] = static_cast<float>(tail_[j] * (1.0 - g) + head_[j] * g);
        }
        n += m;
    }
    produced_ += static_cast<std::int64_t>(n);
    return n;
}

std::optional<double> PlaybackStream::takeSecondsAt(std::int64_t outputSample) const {
    if (outputSample < 0) outputSample = 0;
    std::int64_t inPass = outputSample;
    if (loop_) {
        inPass = pass_ > 0 ? outputSample % pass_ : 0;
    } else if (outputSample >= stretched_) {
        return std::nullopt;
    }
    // WSOLA reads output sample o from near o · rate in the span (within its tolerance).
    return startSeconds_ + static_cast<double>(inPass) * stretch_.rate / take_.sampleRate;
}

}  // namespace earmark
