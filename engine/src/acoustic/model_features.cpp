#include "earmark/acoustic/model_features.hpp"

#include "earmark/core/error.hpp"
#include "earmark/dsp/fft.hpp"
#include "earmark/dsp/resample.hpp"
#include "earmark/level/energy.hpp"
#include "earmark/prosody/speech_activity.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>

namespace earmark {
namespace {

struct MelFilter {
    int firstBin = 0;
    std::vector<float> weights;
};

double toMel(double hz) { return 2595.0 * std::log10(1.0 + hz / 700.0); }
double fromMel(double mel) { return 700.0 * (std::pow(10.0, mel / 2595.0) - 1.0); }

std::vector<MelFilter> melFilters(const ModelFrontEnd& fe) {
    const double melLow = toMel(fe.lowerHz), melHigh = toMel(fe.upperHz);
    const double step = (melHigh - melLow) / (fe.filters + 1);
    const double binHz = fe.sampleRateHz / fe.fftSize;
    std::vector<MelFilter> out;
    for (int i = 0; i < fe.filters; ++i) {
        double edge[3];
        for (int j = 0; j < 3; ++j) {
            edge[j] = fromMel(melLow + (i + j) * step);
            edge[j] = std::floor(edge[j] / binHz + 0.5) * binHz;  // rounded to a bin
        }
        MelFilter f;
        f.firstBin = -1;
        for (int b = 0; b < fe.fftSize / 2; ++b) {
            const double hz = b * binHz;
            if (hz < edge[0]) continue;
            if (hz > edge[2]) break;
            if (f.firstBin < 0) f.firstBin = b;
            const double rise = (edge[1] > edge[0]) ? (hz - edge[0]) / (edge[1] - edge[0]) : 1.0;
            const double fall = (edge[2] > edge[1]) ? (edge[2] - hz) / (edge[2] - edge[1]) : 1.0;
            const double area = 2.0 / (edge[2] - edge[0]);
            f.weights.push_back(static_cast<float>(std::max(0.0, std::min(rise, fall)) * area));
        }
        if (f.firstBin < 0) f.firstBin = 0;
        out.push_back(std::move(f));
    }
    return out;
}

// Silence kept on either side of the speech span in the cepstral mean: about
// what an utterance the model was trained on holds (common practice).
constexpr double kMeanMarginSeconds = 0.25;

// The frames [first, last) whose cepstra make the mean: those starting within the speech
// span widened by kMeanMarginSeconds; every frame when the take has no speech.
std::pair<std::size_t, std::size_t> meanFrames(const Signal& take, const ModelFrontEnd& fe, std::size_t frames) {
    EnergyParams params;
    params.hopSeconds = 0.01;
    const SpeechActivity speech = detectSpeech(analyseEnergy(take, params), take.durationSeconds());
    if (!speech.hasSpeech()) return {0, frames};
    const double hop = 1.0 / fe.framesPerSecond;
    const double from = std::max(0.0, *speech.speechStartS - kMeanMarginSeconds - fe.windowSeconds);
    const double to = *speech.speechEndS + kMeanMarginSeconds;
    const auto first = std::min(frames - 1, static_cast<std::size_t>(std::floor(from / hop)));
    const auto last = std::clamp(static_cast<std::size_t>(std::ceil(to / hop)), first + 1, frames);
    return {first, last};
}

}  // namespace

std::vector<float> modelCepstra(const Signal& take, const ModelFrontEnd& fe, std::size_t* framesOut) {
    const int window = static_cast<int>(std::lround(fe.windowSeconds * fe.sampleRateHz));
    const int hop = static_cast<int>(std::lround(fe.sampleRateHz / fe.framesPerSecond));
    const std::size_t n = take.samples.size();
    std::size_t frames = 0;
    if (n >= static_cast<std::size_t>(window)) frames = 1 + (n - static_cast<std::size_t>(window)) / static_cast<std::size_t>(hop);
    if (framesOut) *framesOut = frames;
    std::vector<float> cep(frames * static_cast<std::size_t>(fe.cepstra));
    if (frames == 0) return cep;

    std::vector<float> hamming(static_cast<std::size_t>(window));
    for (int i = 0; i < window; ++i)
        hamming[static_cast<std::size_t>(i)] =
            static_cast<float>(0.54 - 0.46 * std::cos(2.0 * M_PI * i / (window - 1)));
    const std::vector<MelFilter> filters = melFilters(fe);
    std::vector<std::vector<double>> cosine(static_cast<std::size_t>(fe.cepstra), std::vector<double>(filters.size()));
    for (int i = 0; i < fe.cepstra; ++i)
        for (std::size_t j = 0; j < filters.size(); ++j)
            cosine[static_cast<std::size_t>(i)][j] = std::cos(M_PI * i * (static_cast<double>(j) + 0.5) / filters.size());
    const double norm0 = std::sqrt(1.0 / filters.size()), norm = std::sqrt(2.0 / filters.size());
    std::vector<double> lifter(static_cast<std::size_t>(fe.cepstra), 1.0);
    if (fe.lifter > 0)
        for (int i = 1; i < fe.cepstra; ++i)
            lifter[static_cast<std::size_t>(i)] = 1.0 + fe.lifter / 2.0 * std::sin(M_PI * i / fe.lifter);

    RealFft fft(fe.fftSize);
    std::vector<double> power(static_cast<std::size_t>(fft.bins()));
    std::vector<double> logMel(filters.size());
    constexpr double kScale = 32768.0;  // the model was trained on 16-bit sample values
    // Dither of one 16-bit step, seeded so results repeat: digital silence
    // (padding) would otherwise give log energies at the floor, cepstra far
    // from anything the model saw, and a skewed mean (the recogniser's own
    // front end offers the same remedy).
    std::uint32_t rng = 0x2545F491u;
    const auto dither = [&rng]() {
        rng ^= rng << 13;
        rng ^= rng >> 17;
        rng ^= rng << 5;
        return (static_cast<double>(rng) / 4294967296.0 - 0.5) * 2.0;
    };
    for (std::size_t t = 0; t < frames; ++t) {
        auto buf = fft.timeBuffer();
        std::fill(buf.begin(), buf.end(), 0.0f);
        const std::size_t start = t * static_cast<std::size_t>(hop);
        for (int i = 0; i < window; ++i) {
            const std::size_t k = start + static_cast<std::size_t>(i);
            const double prev = k > 0 ? take.samples[k - 1] : 0.0;
            const double x = (take.samples[k] - fe.preemphasis * prev) * kScale + (fe.dither ? dither() : 0.0);
            buf[static_cast<std::size_t>(i)] = static_cast<float>(x * hamming[static_cast<std::size_t>(i)]);
        }
        fft.forward();
        auto spec = fft.spectrumBuffer();
        for (std::size_t b = 0; b < power.size(); ++b) power[b] = std::norm(spec[b]);
        for (std::size_t j = 0; j < filters.size(); ++j) {
            double sum = 0;
            const MelFilter& f = filters[j];
            for (std::size_t w = 0; w < f.weights.size(); ++w) sum += f.weights[w] * power[static_cast<std::size_t>(f.firstBin) + w];
            logMel[j] = std::log(std::max(sum, 1e-4));
        }
        float* c = cep.data() + t * static_cast<std::size_t>(fe.cepstra);
        for (int i = 0; i < fe.cepstra; ++i) {
            double s = 0;
            for (std::size_t j = 0; j < filters.size(); ++j) s += logMel[j] * cosine[static_cast<std::size_t>(i)][j];
            s *= (i == 0 ? norm0 : norm);
            c[i] = static_cast<float>(s * lifter[static_cast<std::size_t>(i)]);
        }
    }
    return cep;
}

ModelFeatures computeModelFeatures(const Signal& take, const ModelFrontEnd& fe, Progress progress) {
    if (take.empty() || take.sampleRate <= 0) throw InputError("audio", "is empty");
    Signal resampled;
    const Signal* source = &take;
    if (std::fabs(take.sampleRate - fe.sampleRateHz) > 1e-6) {
        resampled = resample(take, fe.sampleRateHz);
        source = &resampled;
    }
    progress.report(0.2);
    std::size_t frames = 0;
    const std::vector<float> cep = modelCepstra(*source, fe, &frames);
    if (frames == 0) throw InputError("audio", "is shorter than one analysis window of the acoustic model");
    progress.report(0.8);
    const std::size_t nc = static_cast<std::size_t>(fe.cepstra);
    std::vector<double> mean(nc, 0.0);
    if (fe.batchCmn) {
        const auto [first, last] = meanFrames(*source, fe, frames);
        for (std::size_t t = first; t < last; ++t)
            for (std::size_t i = 0; i < nc; ++i) mean[i] += cep[t * nc + i];
        for (double& m : mean) m /= static_cast<double>(last - first);
    }
    auto c = [&](std::ptrdiff_t t, std::size_t i) {
        t = std::clamp<std::ptrdiff_t>(t, 0, static_cast<std::ptrdiff_t>(frames) - 1);
        return static_cast<double>(cep[static_cast<std::size_t>(t) * nc + i]) - mean[i];
    };
    ModelFeatures out;
    out.frames = frames;
    out.size = 3 * nc;
    out.hopSeconds = 1.0 / fe.framesPerSecond;
    out.windowSeconds = std::lround(fe.windowSeconds * fe.sampleRateHz) / fe.sampleRateHz;
    out.values.resize(frames * out.size);
    for (std::size_t t = 0; t < frames; ++t) {
        const auto st = static_cast<std::ptrdiff_t>(t);
        float* f = out.values.data() + t * out.size;
        for (std::size_t i = 0; i < nc; ++i) {
            f[i] = static_cast<float>(c(st, i));
            f[nc + i] = static_cast<float>(c(st + 2, i) - c(st - 2, i));
            f[2 * nc + i] = static_cast<float>((c(st + 3, i) - c(st - 1, i)) - (c(st + 1, i) - c(st - 3, i)));
        }
    }
    progress.report(1.0);
    return out;
}

}  // namespace earmark
