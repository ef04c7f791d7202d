// Planting artefacts at known times into clean takes, for the detectors'
// tests: single-sample clicks, high-passed white-noise bursts, stretches
// whose harmonics are replaced by noise of the same spectral envelope, and
// drop-outs. Header-only; deterministic (fixed seeds).
#pragma once

#include "voice_takes.hpp"

#include "earmark/dsp/autoregressive.hpp"

#include <numbers>
#include <random>

namespace earmark::test {

struct Planted {
    double startS = 0.0, endS = 0.0;  // the span changed (a click: its one sample)
};

// Times t (s) where every energy frame in [t − before, t + after] is within
// `withinDb` of the speech level (and voiced, when `voiced`), at least
// `spacing` apart; `count` of them, picked at random from all such times.
inline std::vector<double> plantingTimes(const VoiceTake& take, double before, double after, double withinDb,
                                         bool voiced, double spacing, std::size_t count, unsigned seed) {
    const double hop = take.energy.hopSeconds;
    const auto framesBefore = static_cast<std::size_t>(std::ceil(before / hop));
    const auto framesAfter = static_cast<std::size_t>(std::ceil(after / hop));
    std::vector<std::size_t> ok;
    for (std::size_t i = framesBefore; i + framesAfter < take.energy.db.size(); ++i) {
        bool good = true;
        for (std::size_t j = i - framesBefore; good && j <= i + framesAfter; ++j) {
            good = take.energy.db[j] >= take.speechLevelDb - withinDb;
            if (voiced) good = good && j < take.pitch.size() && take.pitch.voiced(j);
        }
        if (good) ok.push_back(i);
    }
    std::mt19937 rng(seed);
    std::shuffle(ok.begin(), ok.end(), rng);
    std::vector<double> times;
    for (std::size_t i : ok) {
        const double t = static_cast<double>(i) * hop;
        bool far = true;
        for (double u : times) far = far && std::fabs(u - t) >= spacing;
        if (far) times.push_back(t);
        if (times.size() == count) break;
    }
    std::sort(times.begin(), times.end());
    return times;
}

inline std::size_t sampleAt(const Signal& s, double t) { return static_cast<std::size_t>(std::llround(t * s.sampleRate)); }

// A single sample of ±10^(dbfs/20) added at t (signs alternate).
inline Planted plantClick(Signal& s, double t, double dbfs, bool negative) {
    const std::size_t i = sampleAt(s, t);
    s.samples[i] += static_cast<float>((negative ? -1.0 : 1.0) * std::pow(10.0, dbfs / 20.0));
    return {t, t + 1.0 / s.sampleRate};
}

// `seconds` of white noise high-passed at `cutHz` (windowed-sinc FIR, 127
// taps, Hann) with RMS `rmsDbfs`, added from t.
inline Planted plantNoiseBurst(Signal& s, double t, double seconds, double cutHz, double rmsDbfs, unsigned seed) {
    const int taps = 127, half = taps / 2;
    std::vector<double> h(taps);
    const double fc = cutHz / s.sampleRate;
    for (int k = 0; k < taps; ++k) {
        const int m = k - half;
        const double lowPass = m == 0 ? 2 * fc : std::sin(2 * std::numbers::pi * fc * m) / (std::numbers::pi * m);
        const double w = 0.5 - 0.5 * std::cos(2 * std::numbers::pi * (k + 0.5) / taps);
        h[k] = ((m == 0 ? 1.0 : 0.0) - lowPass) * w;
    }
    const auto n = static_cast<std::size_t>(std::llround(seconds * s.sampleRate));
    std::mt19937 rng(seed);
    std::normal_distribution<double> gauss;
    std::vector<double> white(n + taps), burst(n, 0.0);
    for (double& v : white) v = gauss(rng);
    double power = 0.0;
    for (std::size_t i = 0; i < n; ++i) {
        for (int k = 0; k < taps; ++k) burst[i] += h[k] * white[i + static_cast<std::size_t>(k)];
        power += burst[i] * burst[i];
    }
    const double gain = std::pow(10.0, rmsDbfs / 20.0) / std::sqrt(power / static_cast<double>(n));
    const std::size_t first = sampleAt(s, t);
    for (std::size_t i = 0; i < n && first + i < s.size(); ++i) s.samples[first + i] += static_cast<float>(gain * burst[i]);
    return {t, t + seconds};
}

// From t for `seconds`: each 5 ms block is replaced by white noise shaped by
// the block's own all-pole envelope (order 2 + rate/1 kHz, fitted on 25 ms),
// scaled to the block's RMS; 5 ms linear cross-fades at both ends.
inline Planted plantNoiseForHarmonics(Signal& s, double t, double seconds, unsigned seed) {
    const double rate = s.sampleRate;
    const int order = 2 + static_cast<int>(std::lround(rate / 1000.0));
    const auto block = static_cast<std::size_t>(std::llround(0.005 * rate));
    const auto window = static_cast<std::size_t>(std::llround(0.025 * rate));
    const std::size_t first = sampleAt(s, t), n = static_cast<std::size_t>(std::llround(seconds * rate));
    const auto fade = block;
    const std::vector<float> original = s.samples;
    ArFitter fitter(order, window);
    std::vector<double> a, state(static_cast<std::size_t>(order), 0.0);
    std::mt19937 rng(seed);
    std::normal_distribution<double> gauss;
    std::vector<double> out;
    for (std::size_t b0 = first; b0 < first + n; b0 += block) {
        const std::size_t b1 = std::min(first + n, b0 + block);
        fitter.fit(original, static_cast<std::ptrdiff_t>((b0 + b1) / 2) - static_cast<std::ptrdiff_t>(window / 2), a);
        std::vector<double> y(b1 - b0);
        double py = 0.0, px = 0.0;
        for (std::size_t i = 0; i < y.size(); ++i) {
            double v = gauss(rng);
            for (int k = 1; k <= order; ++k) v -= a[static_cast<std::size_t>(k)] * state[static_cast<std::size_t>(k - 1)];
            for (int k = order - 1; k > 0; --k) state[static_cast<std::size_t>(k)] = state[static_cast<std::size_t>(k - 1)];
            state[0] = v;
            y[i] = v;
            py += v * v;
            px += static_cast<double>(original[b0 + i]) * original[b0 + i];
        }
        const double gain = py > 0 ? std::sqrt(px / py) : 0.0;
        for (double v : y) out.push_back(v * gain);
    }
    for (std::size_t i = 0; i < out.size(); ++i) {
        const double w = std::min({1.0, static_cast<double>(i) / fade, static_cast<double>(out.size() - i) / fade});
        s.samples[first + i] = static_cast<float>(w * out[i] + (1 - w) * original[first + i]);
    }
    return {t, t + seconds};
}

// The samples from t for `seconds` set to zero, without fades.
inline Planted plantDropout(Signal& s, double t, double seconds) {
    const std::size_t first = sampleAt(s, t), n = static_cast<std::size_t>(std::llround(seconds * s.sampleRate));
    for (std::size_t i = first; i < first + n && i < s.size(); ++i) s.samples[i] = 0.0f;
    return {t, t + seconds};
}

// Samples that jump by more than half of full scale against both
// neighbours in the same direction: integer wrap-around in the renderer
// (festival's ked_diphone voice has three in these lines). True clicks of
// the clean takes; the false-event counts leave them out.
inline std::vector<Planted> wrapAroundTimes(const Signal& s) {
    std::vector<Planted> out;
    for (std::size_t i = 1; i + 1 < s.size(); ++i) {
        const float l = s.samples[i] - s.samples[i - 1], r = s.samples[i] - s.samples[i + 1];
        if (std::fabs(l) > 0.5f && std::fabs(r) > 0.5f && (l > 0) == (r > 0))
            out.push_back({static_cast<double>(i) / s.sampleRate, static_cast<double>(i + 1) / s.sampleRate});
    }
    return out;
}

}  // namespace earmark::test
