#include "earmark/level/sample_stats.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

SampleStatsMeter::SampleStatsMeter(int channels, double clipLevel)
    : channels_(channels), clipLevel_(clipLevel) {
    if (channels < 1) throw ParamError("SampleStatsMeter.channels", "must be at least 1");
    if (!(clipLevel > 0)) throw ParamError("SampleStatsMeter.clipLevel", "must be positive");
}

void SampleStatsMeter::addInterleaved(const float* samples, std::int64_t frames) {
    const std::int64_t n = frames * channels_;
    double peak = peak_;
    std::int64_t clipped = 0;
    double sum = 0.0;  // per block in double, accumulated in long double
    for (std::int64_t i = 0; i < n; ++i) {
        const double v = samples[i];
        const double a = std::fabs(v);
        peak = std::max(peak, a);
        clipped += a >= clipLevel_ ? 1 : 0;
        sum += v;
    }
    peak_ = peak;
    clipped_ += clipped;
    sum_ += sum;
    count_ += n;
}

SampleStats SampleStatsMeter::result() const {
    SampleStats s;
    s.samplePeak = peak_;
    s.samplePeakDbfs = peak_ > 0 ? 20.0 * std::log10(peak_) : -INFINITY;
    s.clippedSamples = clipped_;
    s.dcOffset = count_ > 0 ? static_cast<double>(sum_ / count_) : 0.0;
    s.samples = count_;
    return s;
}

}  // namespace earmark
