#include "earmark/dsp/resample.hpp"

#include "earmark/core/error.hpp"

#include <soxr.h>

#include <cmath>
#include <string>

namespace earmark {

Signal resample(const Signal& signal, double targetRate) {
    if (!(signal.sampleRate > 0)) throw ParamError("Signal.sampleRate", "must be positive to resample");
    if (!(targetRate > 0)) throw ParamError("resample.targetRate", "must be positive");
    if (signal.sampleRate == targetRate) return signal;
    Signal out;
    out.sampleRate = targetRate;
    const auto outLen = static_cast<std::size_t>(
        std::llround(static_cast<double>(signal.size()) * targetRate / signal.sampleRate));
    out.samples.resize(outLen);
    if (signal.empty() || outLen == 0) return out;
    const soxr_io_spec_t io = soxr_io_spec(SOXR_FLOAT32_I, SOXR_FLOAT32_I);
    const soxr_quality_spec_t quality = soxr_quality_spec(SOXR_HQ, 0);
    size_t done = 0;
    soxr_error_t err = soxr_oneshot(signal.sampleRate, targetRate, 1, signal.samples.data(),
                                    signal.size(), nullptr, out.samples.data(), outLen, &done,
                                    &io, &quality, nullptr);
    if (err) throw Error("resample", std::string("libsoxr failed: ") + err);
    out.samples.resize(done);
    out.samples.resize(outLen, 0.0f);  // oneshot may deliver a sample short at the very end
    return out;
}

}  // namespace earmark
