#include "earmark/widgets/transport.hpp"

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

namespace {
constexpr double shortestSeconds = 0.001;
}

std::optional<PlaySegment> planPlayback(PlayMode mode, const PlayContext& c) {
    PlaySegment s;
    switch (mode) {
    case PlayMode::FromCursor:
        s = {std::clamp(c.cursor, 0.0, c.duration), c.duration, false};
        break;
    case PlayMode::Selection:
    case PlayMode::LoopSelection:
        if (!c.selection) return std::nullopt;
        s = {std::clamp(c.selection->start, 0.0, c.duration), std::clamp(c.selection->end, 0.0, c.duration),
             mode == PlayMode::LoopSelection};
        break;
    case PlayMode::VisibleRange:
        s = {std::clamp(c.visible.start, 0.0, c.duration), std::clamp(c.visible.end, 0.0, c.duration), false};
        break;
    }
    if (s.length() < shortestSeconds) return std::nullopt;
    return s;
}

bool Transport::start(PlayMode mode, const PlayContext& context) {
    segment_ = planPlayback(mode, context);
    return segment_.has_value();
}

void Transport::stop() { segment_.reset(); }

std::optional<double> Transport::advance(double elapsed) {
    if (!segment_) return std::nullopt;
    const PlaySegment s = *segment_;
    elapsed = std::max(elapsed, 0.0);
    if (s.loop) return s.start + std::fmod(elapsed, s.length());
    if (elapsed >= s.length()) {
        segment_.reset();
        return std::nullopt;
    }
    return s.start + elapsed;
}

std::optional<std::int64_t> Transport::sourceFrame(std::int64_t outputFrame, double rate) const {
    if (!segment_ || outputFrame < 0) return std::nullopt;
    const auto first = static_cast<std::int64_t>(std::llround(segment_->start * rate));
    const auto last = static_cast<std::int64_t>(std::llround(segment_->end * rate));  // exclusive
    const std::int64_t length = last - first;
    if (length <= 0) return std::nullopt;
    if (segment_->loop) return first + outputFrame % length;
    if (outputFrame >= length) return std::nullopt;
    return first + outputFrame;
}

}  // namespace earmark::widgets
