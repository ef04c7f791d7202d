#include "earmark/align/mfcc.hpp"

#include "earmark/core/error.hpp"
#include "earmark/dsp/resample.hpp"
#include "earmark/spectral/mel.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace earmark {

void MfccParams::validate() const {
    if (!(sampleRateHz > 0)) throw ParamError("MfccParams.sampleRateHz", "must be positive");
    if (!(hopSeconds > 0)) throw ParamError("MfccParams.hopSeconds", "must be positive");
    if (!(windowSeconds > 0) || windowSeconds * sampleRateHz > fftSize)
        throw ParamError("MfccParams.windowSeconds", "must be positive and fit in fftSize samples");
    if (fftSize < 2) throw ParamError("MfccParams.fftSize", "must be at least 2");
    if (bands < 1) throw ParamError("MfccParams.bands", "must be at least 1");
    if (!(fminHz >= 0) || !(fmaxHz > fminHz) || fmaxHz > sampleRateHz / 2)
        throw ParamError("MfccParams.fmaxHz", "needs 0 <= fminHz < fmaxHz <= sampleRateHz/2");
    if (coefficients < 1 || coefficients > bands)
        throw ParamError("MfccParams.coefficients", "must be 1 … bands");
    if (!(dynamicRangeDb > 0)) throw ParamError("MfccParams.dynamicRangeDb", "must be positive");
}

namespace {

Spectrogram logMel(const Signal& signal, const MfccParams& params, Progress progress) {
    if (!(signal.sampleRate > 0)) throw ParamError("Signal.sampleRate", "must be positive");
    const Signal x = resample(signal, params.sampleRateHz);
    MelParams mel;
    mel.stft.fftSize = params.fftSize;
    mel.stft.windowSize = std::max(2, static_cast<int>(std::lround(params.windowSeconds * params.sampleRateHz)));
    mel.stft.hopSize = hopSamples(params.hopSeconds, params.sampleRateHz);
    mel.stft.window = WindowShape::Hamming;
    mel.bands = params.bands;
    mel.fminHz = params.fminHz;
    mel.fmaxHz = params.fmaxHz;
    mel.scale = MelScale::Htk;
    mel.normalisation = MelNormalisation::None;
    mel.kind = SpectrumKind::Power;
    mel.log = LogScale::Natural;
    mel.floor = 1e-12;
    return computeMelSpectrogram(x, mel, progress);
}

// Floors at the loudest value minus the dynamic range, then DCT-II and mean normalisation.
FeatureMatrix cepstra(Spectrogram& spec, const MfccParams& params) {
    FeatureMatrix out;
    out.frames = spec.frames;
    out.dims = params.coefficients;
    out.hopSeconds = spec.hopSeconds;
    out.values.assign(static_cast<std::size_t>(out.frames) * out.dims, 0.0f);
    if (out.frames == 0) return out;

    // Power in natural log: dB·ln(10)/10.
    const float top = *std::max_element(spec.values.begin(), spec.values.end());
    const float floorValue = top - static_cast<float>(params.dynamicRangeDb * std::numbers::ln10 / 10.0);
    for (float& v : spec.values) v = std::max(v, floorValue);

    // Orthonormal DCT-II basis, coefficients × bands.
    const int B = params.bands, K = params.coefficients;
    std::vector<float> basis(static_cast<std::size_t>(K) * B);
    for (int k = 0; k < K; ++k) {
        const double scale = std::sqrt((k == 0 ? 1.0 : 2.0) / B);
        for (int b = 0; b < B; ++b)
            basis[static_cast<std::size_t>(k) * B + b] =
                static_cast<float>(scale * std::cos(std::numbers::pi * k * (b + 0.5) / B));
    }
    std::vector<double> mean(K, 0.0);
    for (int f = 0; f < out.frames; ++f) {
        const float* logMelRow = spec.values.data() + static_cast<std::size_t>(f) * B;
        float* c = out.row(f);
        for (int k = 0; k < K; ++k) {
            const float* w = basis.data() + static_cast<std::size_t>(k) * B;
            float acc = 0.0f;
            for (int b = 0; b < B; ++b) acc += w[b] * logMelRow[b];
            c[k] = acc;
            mean[k] += acc;
        }
    }
    if (params.meanNormalise) {
        for (double& m : mean) m /= out.frames;
        for (int f = 0; f < out.frames; ++f)
            for (int k = 0; k < K; ++k) out.row(f)[k] -= static_cast<float>(mean[k]);
    }
    return out;
}

float percentileOf(std::vector<float> v, double q) {
    if (v.empty()) return 0.0f;
    const auto k = static_cast<std::size_t>(q * static_cast<double>(v.size() - 1));
    std::nth_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(k), v.end());
    return v[k];
}

// ln Σ_b exp(v_b) of each frame: the frame's energy in the log domain.
std::vector<float> frameEnergies(const Spectrogram& s) {
    std::vector<float> e(static_cast<std::size_t>(s.frames));
    for (int f = 0; f < s.frames; ++f) {
        const float* row = s.values.data() + static_cast<std::size_t>(f) * s.bins;
        const float top = *std::max_element(row, row + s.bins);
        double acc = 0.0;
        for (int b = 0; b < s.bins; ++b) acc += std::exp(static_cast<double>(row[b] - top));
        e[f] = top + static_cast<float>(std::log(acc));
    }
    return e;
}

}  // namespace

FeatureMatrix computeMfcc(const Signal& signal, const MfccParams& params, Progress progress) {
    params.validate();
    Spectrogram spec = logMel(signal, params, progress.sub(0.0, 0.9));
    FeatureMatrix out = cepstra(spec, params);
    progress.report(1.0);
    return out;
}

MfccPair computeMatchedMfcc(const Signal& take, const Signal& reference, const MfccParams& params,
                            Progress progress) {
    params.validate();
    Spectrogram t = logMel(take, params, progress.sub(0.0, 0.6));
    Spectrogram r = logMel(reference, params, progress.sub(0.6, 0.85));
    if (t.frames > 0 && r.frames > 0) {
        const float shift = percentileOf(frameEnergies(t), 0.95) - percentileOf(frameEnergies(r), 0.95);
        for (float& v : r.values) v += shift;
        const int B = t.bins;
        std::vector<float> band(static_cast<std::size_t>(t.frames));
        for (int b = 0; b < B; ++b) {
            for (int f = 0; f < t.frames; ++f) band[f] = t.values[static_cast<std::size_t>(f) * B + b];
            const float floorValue = percentileOf(band, 0.05);
            for (int f = 0; f < t.frames; ++f) {
                float& v = t.values[static_cast<std::size_t>(f) * B + b];
                v = std::max(v, floorValue);
            }
            for (int f = 0; f < r.frames; ++f) {
                float& v = r.values[static_cast<std::size_t>(f) * B + b];
                v = std::max(v, floorValue);
            }
        }
    }
    MfccPair out{cepstra(t, params), cepstra(r, params)};
    progress.report(1.0);
    return out;
}

}  // namespace earmark
