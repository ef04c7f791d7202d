#include "band_energy.hpp"

#include "earmark/dsp/fft.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace earmark::detail {

BandEnergy bandEnergy(const Signal& signal, double hopSeconds, double windowSeconds, double lowHz, double highHz,
                      Progress progress) {
    BandEnergy out;
    const double rate = signal.sampleRate;
    const auto hop = static_cast<std::size_t>(std::max(1.0, std::round(hopSeconds * rate)));
    out.hopSeconds = static_cast<double>(hop) / rate;
    int size = 16;
    while (size < windowSeconds * rate) size *= 2;
    const std::size_t n = signal.size();
    const std::size_t frames = n == 0 ? 0 : n / hop + 1;
    out.lowDb.resize(frames);
    out.highDb.resize(frames);
    out.totalDb.resize(frames);
    RealFft fft(size);
    std::vector<float> hann(static_cast<std::size_t>(size));
    double windowPower = 0.0;
    for (int i = 0; i < size; ++i) {
        hann[static_cast<std::size_t>(i)] =
            static_cast<float>(0.5 - 0.5 * std::cos(2.0 * std::numbers::pi * (i + 0.5) / size));
        windowPower += hann[static_cast<std::size_t>(i)] * hann[static_cast<std::size_t>(i)];
    }
    const int bins = fft.bins();
    const int lowBin = std::clamp(static_cast<int>(std::ceil(lowHz * size / rate)), 1, bins);
    const int highBin = std::clamp(static_cast<int>(std::ceil(highHz * size / rate)), 1, bins);
    // Parseval: sum over a one-sided spectrum ×2 / (N·Σw²) = mean power per sample.
    const double norm = 2.0 / (static_cast<double>(size) * windowPower);
    auto db = [](double p) { return static_cast<float>(10.0 * std::log10(std::max(p, 1e-15))); };
    auto time = fft.timeBuffer();
    auto spectrum = fft.spectrumBuffer();
    const auto& x = signal.samples;
    for (std::size_t f = 0; f < frames; ++f) {
        if (f % 4096 == 0) progress.report(static_cast<double>(f) / static_cast<double>(frames));
        const auto start = static_cast<std::ptrdiff_t>(f * hop) - size / 2;
        for (int i = 0; i < size; ++i) {
            const std::ptrdiff_t j = start + i;
            time[static_cast<std::size_t>(i)] =
                (j >= 0 && j < static_cast<std::ptrdiff_t>(n)) ? x[static_cast<std::size_t>(j)] * hann[static_cast<std::size_t>(i)] : 0.0f;
        }
        fft.forward();
        double low = 0.0, high = 0.0, total = 0.0;
        for (int k = 1; k < bins; ++k) {
            const double p = std::norm(spectrum[static_cast<std::size_t>(k)]);
            total += p;
            if (k < lowBin) low += p;
            if (k >= highBin) high += p;
        }
        out.lowDb[f] = db(low * norm);
        out.highDb[f] = db(high * norm);
        out.totalDb[f] = db(total * norm);
    }
    progress.report(1.0);
    return out;
}

}  // namespace earmark::detail
