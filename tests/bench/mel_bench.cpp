// Mel spectrogram cost against the bare FFTs it cannot avoid, in the same run.
//
// Signal: 10 minutes of 22.05 kHz speech-like audio. Reference ("bareFft"):
// the same number of 1024-point real FFTs through RealFft (FFTW), each fed by
// one memcpy from a signal padded in advance, so framing, padding, windowing
// and everything after the FFT are left out. "melSpectrogram" is
// computeMelSpectrogram with its defaults (80 Slaney bands, ln magnitude).
// The program ends by printing mel / bare-FFT CPU time; the bar is <= 2.
#include "earmark/dsp/fft.hpp"
#include "earmark/spectral/mel.hpp"
#include "support/test_signals.hpp"

#include <benchmark/benchmark.h>

#include <algorithm>
#include <cstdio>
#include <cstring>
#include <map>
#include <string>

namespace {

constexpr double kRate = 22050.0;

const earmark::Signal& tenMinutes() {
    static const earmark::Signal s = earmark::test::speechLike(600.0, kRate);
    return s;
}

// The signal with fftSize/2 reflected samples on each side, so frame i is
// simply the fftSize samples starting at i·hop.
const std::vector<float>& paddedSignal(int fftSize) {
    static const std::vector<float> padded = [fftSize] {
        const auto& x = tenMinutes().samples;
        const std::size_t pad = static_cast<std::size_t>(fftSize / 2);
        std::vector<float> out(x.size() + 2 * pad);
        std::copy(x.begin(), x.end(), out.begin() + static_cast<std::ptrdiff_t>(pad));
        for (std::size_t i = 0; i < pad; ++i) {
            out[pad - 1 - i] = x[i + 1];
            out[pad + x.size() + i] = x[x.size() - 2 - i];
        }
        return out;
    }();
    return padded;
}

void bareFft(benchmark::State& state) {
    const earmark::MelParams params;
    const int n = params.stft.fftSize, hop = params.stft.hopSize;
    const std::vector<float>& padded = paddedSignal(n);
    const std::size_t frames = tenMinutes().size() / static_cast<std::size_t>(hop) + 1;  // as the mel path
    earmark::RealFft fft(n);
    for (auto _ : state) {
        for (std::size_t f = 0; f < frames; ++f) {
            std::memcpy(fft.timeBuffer().data(), padded.data() + f * static_cast<std::size_t>(hop),
                        sizeof(float) * static_cast<std::size_t>(n));
            fft.forward();
            benchmark::DoNotOptimize(fft.spectrumBuffer().data());
        }
        benchmark::ClobberMemory();
    }
    state.counters["frames"] = static_cast<double>(frames);
}

void melSpectrogram(benchmark::State& state) {
    const auto& signal = tenMinutes();
    for (auto _ : state) {
        auto mel = earmark::computeMelSpectrogram(signal);
        benchmark::DoNotOptimize(mel.values.data());
    }
}

void powerSpectrogramDb(benchmark::State& state) {
    const auto& signal = tenMinutes();
    for (auto _ : state) {
        auto spec = earmark::computeSpectrogram(signal);  // all 513 bins, power in dB
        benchmark::DoNotOptimize(spec.values.data());
    }
}

// Console output as usual, plus the CPU time per iteration of each benchmark.
class RatioReporter : public benchmark::ConsoleReporter {
public:
    void ReportRuns(const std::vector<Run>& runs) override {
        for (const Run& run : runs)
            if (run.run_type == Run::RT_Iteration) cpuSeconds[run.run_name.function_name] = run.GetAdjustedCPUTime();
        ConsoleReporter::ReportRuns(runs);
    }
    std::map<std::string, double> cpuSeconds;  // in each run's time unit (all ms here)
};

}  // namespace

BENCHMARK(bareFft)->Unit(benchmark::kMillisecond)->MinTime(2.0);
BENCHMARK(melSpectrogram)->Unit(benchmark::kMillisecond)->MinTime(2.0);
BENCHMARK(powerSpectrogramDb)->Unit(benchmark::kMillisecond)->MinTime(2.0);

int main(int argc, char** argv) {
    benchmark::Initialize(&argc, argv);
    if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
    tenMinutes();  // build the signal before any timing
    RatioReporter reporter;
    benchmark::RunSpecifiedBenchmarks(&reporter);
    benchmark::Shutdown();
    const auto& t = reporter.cpuSeconds;
    const auto fft = t.find("bareFft"), mel = t.find("melSpectrogram"), spec = t.find("powerSpectrogramDb");
    if (fft != t.end() && mel != t.end())
        std::printf("melSpectrogram / bareFft CPU time: %.2f (bar: <= 2.00)\n", mel->second / fft->second);
    if (fft != t.end() && spec != t.end())
        std::printf("powerSpectrogramDb / bareFft CPU time: %.2f\n", spec->second / fft->second);
    return 0;
}
