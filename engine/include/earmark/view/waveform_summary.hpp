// A multi-resolution min/max summary of a signal, so a waveform view can draw
// the envelope of any time span in time that does not grow with its length.
//
// Level k holds the minimum and maximum of consecutive blocks of
// firstBlockSamples · factor^k samples (the last block of a level may be
// shorter). A range query walks the levels like a segment tree: the aligned
// middle of the range is read from the coarsest level that fits, the ragged
// edges from finer levels and, at the finest, from the samples themselves. The
// result is therefore exact (the same as scanning every sample) while reading
// at most about 2 · factor values per level plus 2 · firstBlockSamples samples.
//
// Memory: about 8 / firstBlockSamples · 4/3 bytes per sample (≈ 0.17 byte per
// sample with the defaults), on top of the signal, which the summary does not
// own: every query takes the same samples the summary was built from.
//
// Thread-safety: a built summary is immutable; concurrent queries are safe.
#pragma once

#include <cstdint>
#include <span>
#include <vector>

namespace earmark {

struct WaveformSummaryParams {
    int firstBlockSamples = 64;  // block length of the finest level (>= 2)
    int factor = 4;              // each level's block is this many of the level below (>= 2)

    void validate() const;  // throws ParamError naming the field
};

// Extremes of a span of samples. An empty span has min > max (see empty()).
struct MinMax {
    float min = 1.0f;
    float max = -1.0f;
    bool empty() const { return min > max; }
    void add(float v) {
        if (empty()) {
            min = max = v;
        } else {
            if (v < min) min = v;
            if (v > max) max = v;
        }
    }
    void add(const MinMax& o) {
        if (o.empty()) return;
        if (empty()) {
            *this = o;
        } else {
            if (o.min < min) min = o.min;
            if (o.max > max) max = o.max;
        }
    }
};

class WaveformSummary {
public:
    struct Level {
        std::int64_t blockSamples = 0;
        std::vector<MinMax> blocks;
    };

    WaveformSummary() = default;

    // Levels are added until one has a single block. Throws ParamError.
    static WaveformSummary build(std::span<const float> samples, const WaveformSummaryParams& params = {});

    std::int64_t sampleCount() const { return sampleCount_; }
    const std::vector<Level>& levels() const { return levels_; }

    // Extremes of samples [first, last) (clamped to the signal); empty if the
    // clamped range is empty. `samples` must be the span given to build().
    MinMax range(std::span<const float> samples, std::int64_t first, std::int64_t last) const;

    // One MinMax per column: column c covers samples
    // [floor(startSample + c·samplesPerColumn), floor(startSample + (c+1)·samplesPerColumn)),
    // clamped to the signal, so neighbouring columns neither overlap nor leave
    // gaps. Columns outside the signal are empty. samplesPerColumn must be > 0.
    std::vector<MinMax> envelope(std::span<const float> samples, double startSample,
                                 double samplesPerColumn, int columns) const;

private:
    std::int64_t sampleCount_ = 0;
    std::vector<Level> levels_;
};

}  // namespace earmark
