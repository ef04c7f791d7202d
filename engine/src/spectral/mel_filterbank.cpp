#include "earmark/spectral/mel.hpp"

#include "earmark/core/error.hpp"
#include "stft_core.hpp"

#include <algorithm>
#include <cmath>
#include <sstream>

namespace earmark {

void MelParams::validate(double sampleRate) const {
    detail::validateSampleRate(sampleRate);
    detail::validateStftFraming(stft, "MelParams.stft");
    if (bands < 1) throw ParamError("MelParams.bands", "must be at least 1, got " + std::to_string(bands));
    if (!std::isfinite(fminHz) || fminHz < 0)
        throw ParamError("MelParams.fminHz", "must be finite and >= 0, got " + std::to_string(fminHz));
    if (!std::isfinite(fmaxHz) || fmaxHz > sampleRate / 2)
        throw ParamError("MelParams.fmaxHz", "must not exceed half the sample rate (" +
                                                 std::to_string(sampleRate / 2) + " Hz), got " + std::to_string(fmaxHz));
    if (!(fminHz < fmaxHz))
        throw ParamError("MelParams.fmaxHz", "must be above fminHz (" + std::to_string(fminHz) + " Hz), got " +
                                                 std::to_string(fmaxHz));
    detail::validateLogFloor(log, floor, "MelParams");
}

MelFilterbank makeMelFilterbank(const MelParams& params, double sampleRate) {
    params.validate(sampleRate);
    MelFilterbank fb;
    fb.bands = params.bands;
    fb.bins = params.stft.fftSize / 2 + 1;
    const auto bands = static_cast<std::size_t>(fb.bands);
    const auto bins = static_cast<std::size_t>(fb.bins);

    const double melLo = hzToMel(params.fminHz, params.scale);
    const double melHi = hzToMel(params.fmaxHz, params.scale);
    fb.edgesHz.resize(bands + 2);
    for (std::size_t i = 0; i < bands + 2; ++i)
        fb.edgesHz[i] = melToHz(melLo + (melHi - melLo) * static_cast<double>(i) / static_cast<double>(bands + 1),
                                params.scale);

    fb.weights.assign(bands * bins, 0.0f);
    fb.firstBin.assign(bands, 0);
    fb.binCount.assign(bands, 0);
    const double binHz = sampleRate / params.stft.fftSize;
    for (std::size_t b = 0; b < bands; ++b) {
        const double lo = fb.edgesHz[b], mid = fb.edgesHz[b + 1], hi = fb.edgesHz[b + 2];
        const double scale = params.normalisation == MelNormalisation::Area ? 2.0 / (hi - lo) : 1.0;
        int first = -1, last = -1;
        for (std::size_t k = 0; k < bins; ++k) {
            const double f = static_cast<double>(k) * binHz;
            const double w = std::max(0.0, std::min((f - lo) / (mid - lo), (hi - f) / (hi - mid)));
            if (w <= 0) continue;
            fb.weights[b * bins + k] = static_cast<float>(w * scale);
            if (first < 0) first = static_cast<int>(k);
            last = static_cast<int>(k);
        }
        if (first < 0) {
            std::ostringstream why;
            why << "band " << b << " (" << lo << "–" << hi << " Hz) covers no FFT bin: too many bands ("
                << params.bands << ") for fftSize " << params.stft.fftSize << " at " << sampleRate
                << " Hz (bins every " << binHz << " Hz); use fewer bands, a larger fftSize or a wider fmin–fmax";
            throw ParamError("MelParams.bands", why.str());
        }
        fb.firstBin[b] = first;
        fb.binCount[b] = last - first + 1;
    }
    return fb;
}

}  // namespace earmark
