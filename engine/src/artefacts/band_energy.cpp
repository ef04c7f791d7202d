#include "band_energy.hpp"

#include "earmark/dsp/fft.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace earmark::detail {

namespace {

float powerDb(double p) { return static_cast<float>(10.0 * std::log10(std::max(p, 1e-15))); }

int fftSizeFor(double windowSeconds, double rate) {
    int size = 16;
    while (size < windowSeconds * rate) size *= 2;
    return size;
}

// First FFT bin at or above `hz` (at least 1: the DC bin never counts).
int binAtOrAbove(double hz, int size, double rate) {
    return std::clamp(static_cast<int>(std::ceil(hz * size / rate)), 1, size / 2 + 1);
}

// Calls `frame(power)` for each frame, in order, with the one-sided power
// spectrum scaled to mean power per sample (Parseval: ×2 / (N·Σw²)).
// Returns the hop in seconds after rounding to whole samples.
template <typename FrameFn>
double forEachPowerSpectrum(const Signal& signal, double hopSeconds, double windowSeconds, Progress progress,
                            FrameFn&& frame) {
    const double rate = signal.sampleRate;
    const auto hop = static_cast<std::size_t>(std::max(1.0, std::round(hopSeconds * rate)));
    const int size = fftSizeFor(windowSeconds, rate);
    const std::size_t n = signal.size();
    const std::size_t frames = n == 0 ? 0 : n / hop + 1;
    RealFft fft(size);
    std::vector<float> hann(static_cast<std::size_t>(size));
    double windowPower = 0.0;
    for (int i = 0; i < size; ++i) {
        hann[static_cast<std::size_t>(i)] =
            static_cast<float>(0.5 - 0.5 * std::cos(2.0 * std::numbers::pi * (i + 0.5) / size));
        windowPower += hann[static_cast<std::size_t>(i)] * hann[static_cast<std::size_t>(i)];
    }
    const double norm = 2.0 / (static_cast<double>(size) * windowPower);
    std::vector<double> power(static_cast<std::size_t>(fft.bins()));
    auto time = fft.timeBuffer();
    auto spectrum = fft.spectrumBuffer();
    const auto& x = signal.samples;
    for (std::size_t f = 0; f < frames; ++f) {
        if (f % 4096 == 0) progress.report(static_cast<double>(f) / static_cast<double>(frames));
        const auto start = static_cast<std::ptrdiff_t>(f * hop) - size / 2;
        for (int i = 0; i < size; ++i) {
            const std::ptrdiff_t j = start + i;
            time[static_cast<std::size_t>(i)] = (j >= 0 && j < static_cast<std::ptrdiff_t>(n))
                                                    ? x[static_cast<std::size_t>(j)] * hann[static_cast<std::size_t>(i)]
                                                    : 0.0f;
        }
        fft.forward();
        for (std::size_t k = 0; k < power.size(); ++k) power[k] = std::norm(spectrum[k]) * norm;
        frame(power);
    }
    progress.report(1.0);
    return static_cast<double>(hop) / rate;
}

}  // namespace

BandEnergy bandEnergy(const Signal& signal, double hopSeconds, double windowSeconds, double lowHz, double highHz,
                      Progress progress) {
    BandEnergy out;
    const int size = fftSizeFor(windowSeconds, signal.sampleRate);
    const int lowBin = binAtOrAbove(lowHz, size, signal.sampleRate);
    const int highBin = binAtOrAbove(highHz, size, signal.sampleRate);
    out.hopSeconds = forEachPowerSpectrum(signal, hopSeconds, windowSeconds, progress, [&](const std::vector<double>& power) {
        double low = 0.0, high = 0.0, total = 0.0;
        for (int k = 1; k < static_cast<int>(power.size()); ++k) {
            const double p = power[static_cast<std::size_t>(k)];
            total += p;
            if (k < lowBin) low += p;
            if (k >= highBin) high += p;
        }
        out.lowDb.push_back(powerDb(low));
        out.highDb.push_back(powerDb(high));
        out.totalDb.push_back(powerDb(total));
    });
    return out;
}

BandLevels bandLevels(const Signal& signal, double hopSeconds, double windowSeconds, const std::vector<double>& edgesHz,
                      Progress progress) {
    BandLevels out;
    out.bands = edgesHz.size() < 2 ? 0 : edgesHz.size() - 1;
    if (out.bands == 0) return out;
    const int size = fftSizeFor(windowSeconds, signal.sampleRate);
    std::vector<int> edgeBins;
    for (double hz : edgesHz) edgeBins.push_back(binAtOrAbove(hz, size, signal.sampleRate));
    out.hopSeconds = forEachPowerSpectrum(signal, hopSeconds, windowSeconds, progress, [&](const std::vector<double>& power) {
        for (std::size_t b = 0; b < out.bands; ++b) {
            double sum = 0.0;
            for (int k = edgeBins[b]; k < edgeBins[b + 1]; ++k) sum += power[static_cast<std::size_t>(k)];
            out.db.push_back(powerDb(sum));
        }
    });
    return out;
}

}  // namespace earmark::detail
