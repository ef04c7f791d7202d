#include "support/test_signals.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <random>
#include <stdexcept>

namespace earmark::test {

namespace {
constexpr double kTwoPi = 2.0 * std::numbers::pi;

// Two-pole resonator (digital formant): centre f, bandwidth bw.
struct Resonator {
    double a1 = 0, a2 = 0, gain = 1, y1 = 0, y2 = 0;
    Resonator(double f, double bw, double rate) {
        const double r = std::exp(-std::numbers::pi * bw / rate);
        a1 = -2.0 * r * std::cos(kTwoPi * f / rate);
        a2 = r * r;
        gain = 1.0 - r;  // rough level normalisation
    }
    double operator()(double x) {
        const double y = gain * x - a1 * y1 - a2 * y2;
        y2 = y1;
        y1 = y;
        return y;
    }
};
}  // namespace

Signal sine(double freqHz, double seconds, double sampleRate, double amplitude) {
    Signal s;
    s.sampleRate = sampleRate;
    const auto n = static_cast<std::size_t>(std::llround(seconds * sampleRate));
    s.samples.resize(n);
    for (std::size_t i = 0; i < n; ++i)
        s.samples[i] = static_cast<float>(amplitude * std::sin(kTwoPi * freqHz * static_cast<double>(i) / sampleRate));
    return s;
}

Signal silence(double seconds, double sampleRate) {
    Signal s;
    s.sampleRate = sampleRate;
    s.samples.assign(static_cast<std::size_t>(std::llround(seconds * sampleRate)), 0.0f);
    return s;
}

Signal whiteNoise(double seconds, double sampleRate, double rms, std::uint32_t seed) {
    Signal s = silence(seconds, sampleRate);
    std::mt19937 gen(seed);
    std::normal_distribution<double> dist(0.0, rms);
    for (auto& v : s.samples) v = static_cast<float>(dist(gen));
    return s;
}

void addNoiseAtSnr(Signal& signal, double snrDb, std::uint32_t seed) {
    double power = 0.0;
    std::size_t active = 0;
    for (float v : signal.samples) {
        if (v != 0.0f) {
            power += static_cast<double>(v) * v;
            ++active;
        }
    }
    if (active == 0) return;
    power /= static_cast<double>(active);
    const double noiseRms = std::sqrt(power / std::pow(10.0, snrDb / 10.0));
    std::mt19937 gen(seed);
    std::normal_distribution<double> dist(0.0, noiseRms);
    for (auto& v : signal.samples) v = static_cast<float>(v + dist(gen));
}

Signal concat(const std::vector<Signal>& parts) {
    Signal out;
    if (parts.empty()) return out;
    out.sampleRate = parts.front().sampleRate;
    for (const auto& p : parts) {
        if (p.sampleRate != out.sampleRate) throw std::invalid_argument("concat: sample rates differ");
        out.samples.insert(out.samples.end(), p.samples.begin(), p.samples.end());
    }
    return out;
}

SyntheticVoice synthesiseVoice(const std::vector<VoiceSegment>& segments, double rate, std::uint32_t seed) {
    SyntheticVoice v;
    v.signal.sampleRate = rate;
    std::mt19937 gen(seed);
    std::normal_distribution<double> gauss(0.0, 1.0);
    Resonator f1(550, 80, rate), f2(1500, 120, rate), f3(2500, 160, rate);
    double phase = 0.0;      // radians of the fundamental
    double tilt1 = 0.0, tilt2 = 0.0;
    for (const auto& seg : segments) {
        const auto n = static_cast<std::size_t>(std::llround(seg.seconds * rate));
        for (std::size_t i = 0; i < n; ++i) {
            double x = 0.0;
            float f0 = 0.0f;
            if (seg.kind == VoiceSegment::Kind::Voiced) {
                const double frac = n > 1 ? static_cast<double>(i) / static_cast<double>(n - 1) : 0.0;
                const double f = seg.f0StartHz * std::pow(seg.f0EndHz / seg.f0StartHz, frac);
                f0 = static_cast<float>(f);
                phase = std::fmod(phase + kTwoPi * f / rate, kTwoPi);
                const int harmonics = std::max(1, static_cast<int>(0.9 * rate / 2.0 / f));
                // Dirichlet sum: Σ_{k=1..K} cos(kφ) = sin((K+½)φ)/(2 sin(φ/2)) − ½.
                const double half = std::sin(phase / 2.0);
                const double sum = std::fabs(half) < 1e-9
                                       ? static_cast<double>(harmonics)
                                       : std::sin((harmonics + 0.5) * phase) / (2.0 * half) - 0.5;
                // Two one-pole low-passes: about −12 dB/octave above a few hundred Hz.
                tilt1 += 0.12 * (sum - tilt1);
                tilt2 += 0.12 * (tilt1 - tilt2);
                const double voiced = f3(f2(f1(tilt2)) + 0.5 * f1.y1) + 0.3 * f1.y1;
                x = seg.level * voiced * 4.0;
            } else if (seg.kind == VoiceSegment::Kind::Noise) {
                x = seg.level * gauss(gen);
            }
            v.signal.samples.push_back(static_cast<float>(x));
            v.f0PerSample.push_back(f0);
        }
    }
    return v;
}

double SyntheticVoice::f0At(double t) const {
    const auto i = static_cast<std::int64_t>(std::llround(t * signal.sampleRate));
    if (i < 0 || i >= static_cast<std::int64_t>(f0PerSample.size())) return 0.0;
    return f0PerSample[static_cast<std::size_t>(i)];
}

bool SyntheticVoice::fullyVoicedAround(double t, double halfWindowSeconds) const {
    const auto a = static_cast<std::int64_t>(std::floor((t - halfWindowSeconds) * signal.sampleRate));
    const auto b = static_cast<std::int64_t>(std::ceil((t + halfWindowSeconds) * signal.sampleRate));
    if (a < 0 || b >= static_cast<std::int64_t>(f0PerSample.size())) return false;
    for (auto i = a; i <= b; ++i)
        if (f0PerSample[static_cast<std::size_t>(i)] <= 0.0f) return false;
    return true;
}

Signal speechLike(double seconds, double rate, std::uint32_t seed) {
    std::mt19937 gen(seed);
    std::uniform_real_distribution<double> uni(0.0, 1.0);
    std::vector<VoiceSegment> segs;
    double total = 0.0;
    while (total < seconds) {
        VoiceSegment s;
        const double r = uni(gen);
        if (r < 0.7) {
            s.kind = VoiceSegment::Kind::Voiced;
            s.seconds = 0.12 + 0.2 * uni(gen);
            s.f0StartHz = 90 + 130 * uni(gen);
            s.f0EndHz = std::clamp(s.f0StartHz * (0.8 + 0.4 * uni(gen)), 80.0, 240.0);
            s.level = 0.15 + 0.2 * uni(gen);
        } else if (r < 0.85) {
            s.kind = VoiceSegment::Kind::Noise;
            s.seconds = 0.05 + 0.08 * uni(gen);
            s.level = 0.02 + 0.03 * uni(gen);
        } else {
            s.kind = VoiceSegment::Kind::Silence;
            s.seconds = 0.05 + 0.3 * uni(gen);
        }
        total += s.seconds;
        segs.push_back(s);
    }
    SyntheticVoice v = synthesiseVoice(segs, rate, seed);
    auto& x = v.signal.samples;
    // Syllable-rate envelope (≈4 Hz) so energy and loudness vary like speech.
    for (std::size_t i = 0; i < x.size(); ++i) {
        const double t = static_cast<double>(i) / rate;
        x[i] *= static_cast<float>(0.6 + 0.4 * std::sin(kTwoPi * 4.0 * t));
    }
    x.resize(static_cast<std::size_t>(std::llround(seconds * rate)), 0.0f);
    // Segments change level or kind from one sample to the next (a step in
    // the waveform, which the click detector rightly finds): fade out and in
    // over 5 ms (raised cosine) at every join and at the end, so the
    // waveform is continuous there.
    const auto ramp = static_cast<std::size_t>(std::llround(0.005 * rate));
    auto fade = [&](std::size_t join) {  // zero at `join`, full gain `ramp` samples away on both sides
        for (std::size_t k = 0; k <= ramp; ++k) {
            const auto g = static_cast<float>(0.5 - 0.5 * std::cos(std::numbers::pi * static_cast<double>(k) / static_cast<double>(ramp)));
            if (join + k < x.size()) x[join + k] *= g;
            if (k > 0 && join >= k && join - k < x.size()) x[join - k] *= g;
        }
    };
    std::size_t join = 0;
    for (std::size_t k = 0; k + 1 < segs.size(); ++k) {
        join += static_cast<std::size_t>(std::llround(segs[k].seconds * rate));
        if (join < x.size()) fade(join);
    }
    fade(x.size());
    return v.signal;
}

}  // namespace earmark::test
