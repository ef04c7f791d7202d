// Playback logic without an audio device: what span a play command plays, at
// what rate, looped or not. What is heard and where the playhead is come from
// one place, the PlaybackStream built from playbackSpan() and playbackParams()
// (earmark/playback/playback_stream.hpp: its takeSecondsAt maps output samples
// to take time). The device side (AudioPlayer) only moves bytes and reads a clock.
//
// Plain C++, not thread-safe (the GUI thread owns it).
#pragma once

#include "earmark/playback/playback_stream.hpp"
#include "earmark/widgets/time_mapping.hpp"

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

// Playback speeds a rate step moves between (0.25× … 2×; 1 = as recorded).
// The ladder is Earmark's own choice: finer near 1, coarse at the ends.
inline constexpr double kPlaybackRates[] = {0.25, 0.35, 0.5, 0.7, 0.85, 1.0, 1.25, 1.5, 2.0};

// The rate `steps` rungs above (positive) or below (negative) `rate` on the
// ladder, stopping at its ends; a rate between rungs first moves to the
// next rung in that direction.
double stepPlaybackRate(double rate, int steps);

class Transport {
public:
    // Starts a segment; returns false (and stays stopped) if there is nothing to play.
    bool start(PlayMode mode, const PlayContext& context);
    void stop();
    bool playing() const { return segment_.has_value(); }
    const std::optional<PlaySegment>& segment() const { return segment_; }

    // Playback speed, clamped to [0.25, 2]; what is heard is the segment
    // time-stretched to length / rate (earmark/playback/time_stretch.hpp).
    // Takes effect at the next start().
    void setRate(double rate);
    double rate() const { return rate_; }

    // Loop toggle: while on, PlayMode::Selection plays as LoopSelection.
    void setLooping(bool on) { looping_ = on; }
    bool looping() const { return looping_; }

    // Cross-fade at the loop point, in output seconds (earmark/playback/loop.hpp);
    // 0 = a plain wrap. Each pass of a loop then lasts length / rate − fade.
    void setLoopCrossfade(double seconds) { crossfade_ = seconds > 0 ? seconds : 0.0; }
    double loopCrossfade() const { return crossfade_; }

    // The running segment as the stream plays it: span, and the rate and
    // loop cross-fade in force at start(). Requires playing().
    PlaybackSpan playbackSpan() const;
    PlaybackParams playbackParams() const;

    // The rate the running segment started with.
    double segmentRate() const { return segmentRate_; }

private:
    std::optional<PlaySegment> segment_;
    double rate_ = 1.0;
    double segmentRate_ = 1.0;  // the rate the running segment started with
    bool looping_ = false;
    double crossfade_ = 0.0;
};

}  // namespace earmark::widgets
