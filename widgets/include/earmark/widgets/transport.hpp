// Playback logic without an audio device: what span a play command plays,
// where the playhead is after some time, how loops wrap, which sample to feed
// next. The device side (AudioPlayer) only moves bytes and reads a clock.
//
// Plain C++, not thread-safe (the GUI thread owns it).
#pragma once

#include "earmark/widgets/time_mapping.hpp"

#include <cstdint>
#include <optional>

namespace earmark::widgets {

enum class PlayMode {
    FromCursor,     // cursor → end of take
    Selection,      // selection once (nothing without a selection)
    VisibleRange,   // what is on screen, once
    LoopSelection,  // selection, repeated until stopped
};

struct PlayContext {
    double duration = 0.0;  // s
    double cursor = 0.0;    // s
    std::optional<TimeRange> selection;
    TimeRange visible;
};

struct PlaySegment {
    double start = 0.0;  // s
    double end = 0.0;    // s
    bool loop = false;
    double length() const { return end - start; }
};

// The span a mode plays in a context; empty when there is nothing to play
// (no selection, cursor at the end, span shorter than one millisecond).
std::optional<PlaySegment> planPlayback(PlayMode mode, const PlayContext& context);

class Transport {
public:
    // Starts a segment; returns false (and stays stopped) if there is nothing to play.
    bool start(PlayMode mode, const PlayContext& context);
    void stop();
    bool playing() const { return segment_.has_value(); }
    const std::optional<PlaySegment>& segment() const { return segment_; }

    // The playhead after `elapsedSeconds` of output. A one-shot segment stops
    // at its end (returns empty and the transport is stopped); a loop wraps.
    std::optional<double> advance(double elapsedSeconds);

    // The source sample for the n-th output frame (wrapping for loops), or
    // empty past the end of a one-shot segment.
    std::optional<std::int64_t> sourceFrame(std::int64_t outputFrame, double sampleRate) const;

private:
    std::optional<PlaySegment> segment_;
};

}  // namespace earmark::widgets
