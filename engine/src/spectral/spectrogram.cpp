#include "earmark/spectral/spectrogram.hpp"

#include "stft_core.hpp"


namespace earmark {

void StftParams::validate() const {
    detail::validateStftFraming(*this, "StftParams");
    detail::validateLogFloor(log, floor, "StftParams");
}

Spectrogram computeSpectrogram(const Signal& signal, const StftParams& params, Progress progress) {
    params.validate();
    detail::validateSampleRate(signal.sampleRate);

    const detail::StftGeometry geometry = detail::stftGeometry(static_cast<std::int64_t>(signal.size()), params);
    Spectrogram out;
    detail::describeFrames(out, geometry, params, signal.sampleRate);
    out.bins = params.fftSize / 2 + 1;
    out.kind = params.kind;
    out.log = params.log;
    out.binCentresHz.resize(static_cast<std::size_t>(out.bins));
    for (int k = 0; k < out.bins; ++k)
        out.binCentresHz[static_cast<std::size_t>(k)] = k * signal.sampleRate / params.fftSize;
    out.values.resize(static_cast<std::size_t>(geometry.frames) * static_cast<std::size_t>(out.bins));

    detail::StftFramer framer(signal.samples, params, geometry);
    const detail::LogMapper logMapper(params.kind, params.log, params.floor);
    for (std::int64_t f = 0; f < geometry.frames; ++f) {
        if (f % detail::kFramesPerReport == 0) progress.report(static_cast<double>(f) / geometry.frames);
        float* row = out.values.data() + static_cast<std::size_t>(f) * static_cast<std::size_t>(out.bins);
        detail::spectrumValues(framer.transform(f), {row, static_cast<std::size_t>(out.bins)}, params.kind);
        logMapper.apply({row, static_cast<std::size_t>(out.bins)});
    }
    progress.report(1.0);
    return out;
}

}  // namespace earmark
