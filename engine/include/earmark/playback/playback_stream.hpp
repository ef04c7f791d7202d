// What the speaker plays for one span of a take at a rate: the span
// time-stretched by WSOLA (time_stretch.hpp) and, for a loop, pass after pass
// joined by the cross-fade of loop.hpp — rendered a block at a time, so a
// long take starts at once and an endless loop needs no more memory than one.
//
// Reading n samples in any block sizes gives exactly
//   one-shot: timeStretch(span, rate)
//   loop:     renderLoop(timeStretch(span, rate), crossfade, passes)
// and `takeSecondsAt` says which take time the n-th output sample plays, so the
// playhead follows what is heard at any rate.
//
// Errors: ParamError naming the field (rate, frame, tolerance as in
// TimeStretchParams; "PlaybackSpan" for a span outside the take or shorter
// than one sample; "PlaybackParams.crossfadeSeconds" for a negative fade).
// A fade longer than half a pass is shortened to half a pass.
// Thread-safety: not thread-safe; the take must outlive the stream.
#pragma once

#include "earmark/core/signal.hpp"
#include "earmark/playback/time_stretch.hpp"

#include <cstdint>
#include <optional>

namespace earmark {

struct PlaybackSpan {
    double startSeconds = 0.0;  // in the take
    double endSeconds = 0.0;    // in the take, exclusive
    bool loop = false;
};

struct PlaybackParams {
    TimeStretchParams stretch;       // .rate is the playback speed
    double crossfadeSeconds = 0.01;  // output seconds over which a loop's end fades into its start
};

class PlaybackStream {
public:
    PlaybackStream(const Signal& take, const PlaybackSpan& span, const PlaybackParams& params);

    // Writes up to `frames` samples; fewer only when a one-shot span ends.
    std::size_t read(float* out, std::size_t frames);
    std::int64_t produced() const { return produced_; }

    // Output samples of one pass: the stretched span, less the fade for a loop.
    std::int64_t passLength() const { return pass_; }
    // The take time (s) heard at output sample n, or empty past a one-shot's end.
    std::optional<double> takeSecondsAt(std::int64_t outputSample) const;

private:
    TimeStretcher newPass() const;

    const Signal& take_;
    std::span<const float> span_;
    double startSeconds_ = 0.0;
    bool loop_ = false;
    TimeStretchParams stretch_;
    std::int64_t stretched_ = 0, fade_ = 0, pass_ = 0, produced_ = 0;
    TimeStretcher current_;
    std::optional<TimeStretcher> next_;  // the following pass, during a fade
    std::vector<float> tail_, head_;
};

}  // namespace earmark
