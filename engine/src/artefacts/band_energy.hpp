// Per-frame energy in three bands (below `lowHz`, at and above `highHz`,
// and the whole band) from a Hann-windowed FFT, on Earmark's centred-frame
// axis (frame i at i·hop), for the noise-burst and buzz detectors. Internal
// to the engine.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <vector>

namespace earmark::detail {

struct BandEnergy {
    double hopSeconds = 0.0;
    std::vector<float> lowDb, highDb, totalDb;  // mean power per sample, dB re full scale; floor −150 dB
    std::size_t size() const { return totalDb.size(); }
};

// Frames of about `windowSeconds` (the next power of two of samples), hop
// rounded to whole samples; floor(n / hop) + 1 frames, zero padding outside.
BandEnergy bandEnergy(const Signal& signal, double hopSeconds, double windowSeconds, double lowHz, double highHz,
                      Progress progress = {});

}  // namespace earmark::detail
