// Sample-level facts of a take: peak, clipping, DC offset. Streaming over
// interleaved blocks so it runs in the same pass as file reading.
#pragma once

#include <cstdint>
#include <cmath>
#include <vector>

namespace earmark {

struct SampleStats {
    double samplePeak = 0.0;           // max |x| over all channels (linear, full scale 1.0)
    double samplePeakDbfs = -INFINITY; // 20·log10(samplePeak)
    std::int64_t clippedSamples = 0;   // samples (all channels) with |x| >= clipLevel
    double dcOffset = 0.0;             // mean over all samples of all channels (linear)
    std::int64_t samples = 0;          // samples counted (frames × channels)
};

class SampleStatsMeter {
public:
    // clipLevel: |x| at or above this counts as clipped. 0.999 (≈ −0.009 dBFS,
    // 32735 of 32767 in 16-bit) is the default — common practice, no single source.
    explicit SampleStatsMeter(int channels, double clipLevel = 0.999);
    void addInterleaved(const float* samples, std::int64_t frames);
    SampleStats result() const;

private:
    int channels_;
    double clipLevel_;
    double peak_ = 0.0;
    std::int64_t clipped_ = 0;
    long double sum_ = 0.0;
    std::int64_t count_ = 0;
};

}  // namespace earmark
