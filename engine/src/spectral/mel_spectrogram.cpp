#include "earmark/spectral/mel.hpp"

#include "stft_core.hpp"

#include <algorithm>
#include <cmath>
#include <span>

namespace earmark {

Spectrogram computeMelSpectrogram(const Signal& signal, const MelParams& params, Progress progress) {
    const MelFilterbank fb = makeMelFilterbank(params, signal.sampleRate);  // validates
    const auto bands = static_cast<std::size_t>(fb.bands);

    // Non-zero weights packed band after band, each run padded with zeros to a
    // multiple of 4, so each frame reads one short run per band in 4-wide steps
    // with no leftover loop.
    constexpr int kLanes = 4;
    std::vector<float> packed;
    std::vector<std::size_t> packedStart(bands + 1, 0);
    std::vector<int> paddedCount(bands, 0);
    int usedBins = 0;  // bins above the last (padded) triangle are never needed
    for (std::size_t b = 0; b < bands; ++b) {
        const auto* row = fb.weights.data() + b * static_cast<std::size_t>(fb.bins) + fb.firstBin[b];
        paddedCount[b] = (fb.binCount[b] + kLanes - 1) / kLanes * kLanes;
        packed.insert(packed.end(), row, row + fb.binCount[b]);
        packed.resize(packed.size() + static_cast<std::size_t>(paddedCount[b] - fb.binCount[b]), 0.0f);
        packedStart[b + 1] = packed.size();
        usedBins = std::max(usedBins, fb.firstBin[b] + paddedCount[b]);
    }

    const detail::StftGeometry geometry =
        detail::stftGeometry(static_cast<std::int64_t>(signal.size()), params.stft);
    Spectrogram out;
    detail::describeFrames(out, geometry, params.stft, signal.sampleRate);
    out.bins = fb.bands;
    out.kind = params.kind;
    out.log = params.log;
    out.binCentresHz.assign(fb.edgesHz.begin() + 1, fb.edgesHz.end() - 1);
    out.values.resize(static_cast<std::size_t>(geometry.frames) * bands);

    detail::StftFramer framer(signal.samples, params.stft, geometry);
    const detail::LogMapper logMapper(params.kind, params.log, params.floor);
    // Padding may reach past the last FFT bin: those entries stay zero.
    std::vector<float> linear(static_cast<std::size_t>(usedBins), 0.0f);
    const std::span<float> computed(linear.data(), static_cast<std::size_t>(std::min(usedBins, fb.bins)));
    for (std::int64_t f = 0; f < geometry.frames; ++f) {
        if (f % detail::kFramesPerReport == 0) progress.report(static_cast<double>(f) / geometry.frames);
        detail::spectrumValues(framer.transform(f), computed, params.kind);
        float* row = out.values.data() + static_cast<std::size_t>(f) * bands;
        for (std::size_t b = 0; b < bands; ++b) {
            const float* w = packed.data() + packedStart[b];
            const float* s = linear.data() + fb.firstBin[b];
            float acc[kLanes] = {};
            for (int j = 0; j < paddedCount[b]; j += kLanes)
                for (int l = 0; l < kLanes; ++l) acc[l] += w[j + l] * s[j + l];
            row[b] = (acc[0] + acc[1]) + (acc[2] + acc[3]);
        }
        logMapper.apply({row, bands});
    }
    progress.report(1.0);
    return out;
}

}  // namespace earmark
