// Statistics of the F0 and energy tracks over a time range (frames whose
// centres lie in [startS, endS)). Private to the prosody code.
#pragma once

#include "earmark/level/energy.hpp"
#include "earmark/pitch/pitch_track.hpp"

#include <optional>
#include <vector>

namespace earmark::detail {

struct FrameRange {
    std::size_t begin = 0, end = 0;  // [begin, end)
};
FrameRange framesIn(double hopSeconds, std::size_t frames, double startS, double endS);

struct F0Stats {
    int frames = 0;        // all frames in the range
    int voiced = 0;        // voiced frames
    double meanHz = 0, minHz = 0, maxHz = 0;
    double maxAtS = 0;     // time of the maximum
    std::optional<double> slopeStPerS;  // least squares over voiced frames (needs ≥ 2 distinct times)
};
F0Stats f0Stats(const PitchTrack& pitch, double startS, double endS);

// Semitones of a above b.
double semitones(double aHz, double bHz);

// 10·log10 of the mean power of the energy frames in range; empty if none.
std::optional<double> energyMeanDb(const EnergyTrack& energy, double startS, double endS);
std::optional<double> energyMaxDb(const EnergyTrack& energy, double startS, double endS);

// Voiced F0 values in range.
std::vector<float> voicedF0(const PitchTrack& pitch, double startS, double endS);

// Linear interpolation between closest ranks; v must be non-empty.
double percentile(std::vector<float> v, double p);

}  // namespace earmark::detail
