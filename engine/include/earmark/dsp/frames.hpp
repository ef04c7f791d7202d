// The one framing helper: centre-padded frames on a fixed hop.
//
// Earmark's time convention (docs/, DESIGN.md): frame i is centred at
// t = i·hop seconds. Frame i covers samples [i·hop − size/2, i·hop − size/2 + size);
// samples outside the signal come from the padding mode. There are
// floor(numSamples / hop) + 1 frames, so the last frame is centred at or
// before the last sample.
#pragma once

#include <cstdint>
#include <span>

namespace earmark {

enum class FramePadding {
    Zeros,    // outside the signal is silence
    Reflect,  // mirror about the first/last sample (x[-1] = x[1]), common for spectrograms
};

struct FrameLayout {
    std::int64_t numSamples = 0;
    int frameSize = 0;  // samples per frame (window length)
    int hop = 0;        // samples between frame centres

    // Throws ParamError on non-positive sizes.
    FrameLayout(std::int64_t numSamples, int frameSize, int hop);

    std::int64_t count() const;                       // number of frames
    std::int64_t firstSample(std::int64_t frame) const { return frame * hop - frameSize / 2; }
    std::int64_t centreSample(std::int64_t frame) const { return frame * hop; }
};

// Copies frame `frame` of `signal` into out (out.size() >= layout.frameSize;
// extra room is zero-filled), padding outside the signal per `padding`.
// Reflection folds repeatedly, so even frames much longer than the signal work.
void copyFrame(std::span<const float> signal, const FrameLayout& layout, std::int64_t frame,
               std::span<float> out, FramePadding padding = FramePadding::Zeros);

// Number of samples of a hop given in seconds (rounded, at least 1).
int hopSamples(double hopSeconds, double sampleRate);

}  // namespace earmark
