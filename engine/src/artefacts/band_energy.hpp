// Per-frame band levels from a Hann-windowed FFT, on Earmark's centred-frame
// axis (frame i at i·hop), for the noise-burst and buzz detectors. Internal
// to the engine.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <vector>

namespace earmark::detail {

// Three bands: below `lowHz`, at and above `highHz`, and the whole band.
struct BandEnergy {
    double hopSeconds = 0.0;
    std::vector<float> lowDb, highDb, totalDb;  // mean power per sample, dB re full scale; floor −150 dB
    std::size_t size() const { return totalDb.size(); }
};

// Frames of about `windowSeconds` (the next power of two of samples), hop
// rounded to whole samples; floor(n / hop) + 1 frames, zero padding outside.
BandEnergy bandEnergy(const Signal& signal, double hopSeconds, double windowSeconds, double lowHz, double highHz,
                      Progress progress = {});

// Adjacent bands [edgesHz[b], edgesHz[b + 1]) (ascending edges; a band with
// no FFT bin reads −150 dB), on the frames of bandEnergy.
struct BandLevels {
    double hopSeconds = 0.0;
    std::size_t bands = 0;
    std::vector<float> db;  // frame-major: frame f, band b at f · bands + b; same units as BandEnergy
    std::size_t frames() const { return bands ? db.size() / bands : 0; }
    float at(std::size_t frame, std::size_t band) const { return db[frame * bands + band]; }
};

BandLevels bandLevels(const Signal& signal, double hopSeconds, double windowSeconds, const std::vector<double>& edgesHz,
                      Progress progress = {});

}  // namespace earmark::detail
