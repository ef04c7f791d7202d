// A pitch (F0) contour on Earmark's centred-frame time axis: frame i is at
// t = i · hopSeconds from the start of the take.
#pragma once

#include <cstddef>
#include <vector>

namespace earmark {

struct PitchTrack {
    double hopSeconds = 0.0;
    std::vector<float> f0Hz;          // F0 in Hz; 0 where the frame is unvoiced (no F0)
    std::vector<float> aperiodicity;  // YIN's cumulative-mean-normalised difference at the
                                      // chosen lag: 0 = perfectly periodic, ~1 = noise
    std::vector<float> confidence;    // 1 − aperiodicity clamped to [0, 1]; 0 in silence

    std::size_t size() const { return f0Hz.size(); }
    bool voiced(std::size_t i) const { return f0Hz[i] > 0.0f; }
    double timeSeconds(std::size_t i) const { return static_cast<double>(i) * hopSeconds; }
};

}  // namespace earmark
