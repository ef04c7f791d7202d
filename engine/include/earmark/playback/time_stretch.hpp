// Slowed (or hurried) playback that keeps the pitch: time-scale
// modification by WSOLA — W. Verhelst and M. Roelands, "An overlap-add
// technique based on waveform similarity (WSOLA) for high quality
// time-scale modification of speech", Proc. IEEE ICASSP 1993, vol. 2,
// pp. 554–557.
//
// Output frames of `frameSeconds` (Hann window, 50 % overlap, so the
// windows sum to one) are laid every half frame. Output frame k reads the
// input near k · hop · rate; within ± `toleranceSeconds` of that place the
// segment that best continues the previous one (largest cross-correlation
// with the input that followed the previous segment, over the candidate's RMS) is taken, so periods
// line up and the pitch is kept. The output lasts input / rate (to within
// one sample).
//
// Errors: ParamError naming the field; ParamError("Signal.sampleRate").
// Cancelled via `progress`. Thread-safety: pure function.
// Cost: about (2·tolerance + 1) × frame multiply-adds per half frame of
// output (≈ 20 M per second of output at 22.05 kHz).
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <cstddef>
#include <span>
#include <vector>

namespace earmark {

struct TimeStretchParams {
    double rate = 1.0;               // playback speed: 0.5 = half speed, twice as long. Valid: [0.25, 2]
    double frameSeconds = 0.03;      // WSOLA frame (longer than the longest voice period). Valid: [0.005, 0.1]
    double toleranceSeconds = 0.01;  // search range around the nominal place. Valid: [0, frameSeconds]
    void validate() const;           // throws ParamError("TimeStretchParams.<field>")
};

Signal timeStretch(const Signal& input, const TimeStretchParams& params, Progress progress = {});

// The same stretch rendered a block at a time, for playback that starts at
// once and runs as long as it likes: reading the whole output in blocks of
// any sizes gives exactly timeStretch's samples. `input` is borrowed and must
// outlive the stretcher. Not thread-safe; one per playing stream.
class TimeStretcher {
public:
    // Throws ParamError as timeStretch does.
    TimeStretcher(std::span<const float> input, double sampleRate, const TimeStretchParams& params);
    std::size_t outputLength() const { return static_cast<std::size_t>(outLength_); }
    std::size_t produced() const { return static_cast<std::size_t>(done_); }
    // Writes up to `frames` next output samples; fewer only at the end.
    std::size_t read(float* out, std::size_t frames);

private:
    void nextFrame();  // one WSOLA frame: the next hop of output becomes final
    float at(std::ptrdiff_t i) const;

    std::span<const float> x_;
    double rate_ = 1.0;
    std::ptrdiff_t hop_ = 1, tolerance_ = 0, outLength_ = 0;
    std::vector<float> window_;
    std::vector<float> pending_;  // second half of the last frame, not yet final
    std::vector<float> ready_;    // final samples not yet read
    std::size_t readyAt_ = 0;
    std::ptrdiff_t k_ = 0, previous_ = 0, done_ = 0;
};

}  // namespace earmark
