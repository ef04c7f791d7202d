#include "earmark/widgets/transport.hpp"

#include <algorithm>
#include <cmath>
#include <iterator>

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

double stepPlaybackRate(double rate, int steps) {
    constexpr std::ptrdiff_t count = std::size(kPlaybackRates);
    constexpr double eps = 1e-9;
    if (steps == 0) return rate;
    std::ptrdiff_t index;
    if (steps > 0) {  // the first rung above, then steps − 1 more
        index = count;
        for (std::ptrdiff_t i = count - 1; i >= 0; --i)
            if (kPlaybackRates[i] > rate + eps) index = i;
        index = index == count ? count - 1 : index + steps - 1;
    } else {  // the last rung below, then |steps| − 1 more
        index = -1;
        for (std::ptrdiff_t i = 0; i < count; ++i)
            if (kPlaybackRates[i] < rate - eps) index = i;
        index = index < 0 ? 0 : index + steps + 1;
    }
    return kPlaybackRates[std::clamp<std::ptrdiff_t>(index, 0, count - 1)];
}

void Transport::setRate(double rate) {
    rate_ = std::clamp(std::isfinite(rate) ? rate : 1.0, kPlaybackRates[0], std::end(kPlaybackRates)[-1]);
}

bool Transport::start(PlayMode mode, const PlayContext& context) {
    if (looping_ && mode == PlayMode::Selection) mode = PlayMode::LoopSelection;
    segment_ = planPlayback(mode, context);
    segmentRate_ = rate_;
    return segment_.has_value();
}

void Transport::stop() { segment_.reset(); }

PlaybackSpan Transport::playbackSpan() const {
    const PlaySegment s = segment_.value();
    return {s.start, s.end, s.loop};
}

PlaybackParams Transport::playbackParams() const {
    PlaybackParams p;
    p.stretch.rate = segmentRate_;
    p.crossfadeSeconds = crossfade_;
    return p;
}

}  // namespace earmark::widgets
