// Private to spectral/: the framing, windowing and FFT shared by the linear
// and mel spectrograms, so both follow exactly one frame convention.
#pragma once

#include "earmark/dsp/fft.hpp"
#include "earmark/dsp/frames.hpp"
#include "earmark/spectral/spectrogram.hpp"

#include <complex>
#include <cstdint>
#include <span>
#include <string>
#include <vector>

namespace earmark::detail {

// Checks the sizes of `p` (not kind/log/floor); errors name "<prefix>.<field>".
void validateStftFraming(const StftParams& p, const std::string& prefix);

// Checks that `floor` suits `log`; errors name "<prefix>.floor".
void validateLogFloor(LogScale log, double floor, const std::string& prefix);

// Throws ParamError("Signal.sampleRate") unless the rate is positive and finite.
void validateSampleRate(double sampleRate);

struct StftGeometry {
    std::int64_t frames = 0;
    std::int64_t padLeft = 0;  // frame i's FFT buffer starts at sample i·hop − padLeft
};

StftGeometry stftGeometry(std::int64_t numSamples, const StftParams& p);

// Fills frames, sampleRate, hopSeconds and (for uncentred frames) timesSeconds.
void describeFrames(Spectrogram& out, const StftGeometry& g, const StftParams& p, double sampleRate);

// Windows one frame into its own RealFft and transforms it. All buffers are
// made once here, so transforming a frame allocates nothing.
class StftFramer {
public:
    StftFramer(std::span<const float> signal, const StftParams& p, const StftGeometry& g);

    // The spectrum (fftSize/2 + 1 bins) of frame `frame`; valid until the next call.
    std::span<const std::complex<float>> transform(std::int64_t frame);

private:
    std::span<const float> signal_;
    int hop_;
    int windowSize_;
    int offset_;  // zeros before the window inside the FFT buffer
    std::int64_t padLeft_;
    FramePadding padding_;
    std::vector<float> window_;
    FrameLayout edgeLayout_;  // windowSize frames on a hop of one sample: any start
    RealFft fft_;
};

// out[k] = |x[k]|² (Power) or |x[k]| (Magnitude) for k < out.size().
void spectrumValues(std::span<const std::complex<float>> x, std::span<float> out, SpectrumKind kind);

// Maps linear magnitudes or powers to the requested log scale, in place.
// Values at or below the floor (and NaN) map exactly to the floor's output.
class LogMapper {
public:
    LogMapper(SpectrumKind kind, LogScale log, double floor);
    void apply(std::span<float> values) const;

private:
    LogScale log_;
    float scale_ = 1.0f;       // output per unit of ln: 1, or 10/ln 10 (power dB), 20/ln 10 (magnitude dB)
    float threshold_ = 0.0f;   // linear value at and below which the floor applies
    float floorOut_ = 0.0f;    // the floor's output value
};

// Frames between progress reports: often enough for a responsive bar, rarely
// enough to cost nothing.
inline constexpr std::int64_t kFramesPerReport = 256;

}  // namespace earmark::detail
