#include "earmark/dsp/resample.hpp"

#include "earmark/core/error.hpp"

#include <soxr.h>

#include <algorithm>
#include <cmath>
#include <memory>
#include <vector>
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
    // Streamed in blocks: soxr_oneshot() would copy the whole input into its
    // own buffer first, doubling peak memory on hour-long takes.
    const soxr_io_spec_t io = soxr_io_spec(SOXR_FLOAT32_I, SOXR_FLOAT32_I);
    const soxr_quality_spec_t quality = soxr_quality_spec(SOXR_HQ, 0);
    soxr_error_t err = nullptr;
    std::unique_ptr<soxr, decltype(&soxr_delete)> resampler(
        soxr_create(signal.sampleRate, targetRate, 1, &err, &io, &quality, nullptr), &soxr_delete);
    if (err || !resampler) throw Error("resample", std::string("libsoxr failed: ") + (err ? err : "no resampler"));
    constexpr std::size_t kBlock = 1 << 15;
    std::vector<float> block(kBlock * 2 + 64);
    std::size_t written = 0;
    std::size_t consumed = 0;
    auto keep = [&](std::size_t n) {
        const std::size_t room = outLen - std::min(outLen, written);
        std::copy_n(block.begin(), std::min(n, room), out.samples.begin() + static_cast<long>(written));
        written += std::min(n, room);
    };
    while (consumed < signal.size()) {
        const std::size_t chunk = std::min(kBlock, signal.size() - consumed);
        std::size_t used = 0, produced = 0;
        err = soxr_process(resampler.get(), signal.samples.data() + consumed, chunk, &used,
                           block.data(), block.size(), &produced);
        if (err) throw Error("resample", std::string("libsoxr failed: ") + err);
        consumed += used;
        keep(produced);
    }
    for (;;) {  // flush: no more input
        std::size_t produced = 0;
        err = soxr_process(resampler.get(), nullptr, 0, nullptr, block.data(), block.size(), &produced);
        if (err) throw Error("resample", std::string("libsoxr failed: ") + err);
        if (produced == 0 || written >= outLen) break;
        keep(produced);
    }
    // The tail can come out a sample short; the rest of `out` is already zero.
    return out;
}

}  // namespace earmark
