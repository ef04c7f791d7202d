// F0 speed: Earmark's analysePitch (YIN with all six steps, voicing and
// continuity, 5 ms hop, resampling to 16 kHz included) against aubio's
// "yinfast" (FFT-based YIN, a general-purpose reference library) on the same
// 10 minutes of 22.05 kHz speech-like audio, one thread each.
//
// Matched settings: hop 110 samples (= the 4.99 ms Earmark uses at 22.05 kHz);
// aubio buffer 768 samples (34.8 ms), the FFT-friendly size nearest above the
// 33.6 ms span an Earmark frame reads at the defaults (60–500 Hz at 16 kHz:
// W + maxLag + 1 = 537 samples). aubio's yinfast integrates over half its
// buffer and searches lags up to half its buffer (down to 57 Hz here).
//
// The final line prints aubio time / Earmark time (> 1: Earmark is faster),
// in CPU time (the fair figure on a shared machine) and in wall time.
#include "earmark/pitch/yin.hpp"
#include "support/test_signals.hpp"

#include <aubio/aubio.h>
#include <benchmark/benchmark.h>

#include <cstdio>
#include <map>
#include <string>

namespace {

constexpr int kAubioBuffer = 768;
constexpr int kHop = 110;

const earmark::Signal& tenMinutes() {
    static const earmark::Signal s = earmark::test::speechLike(600.0, 22050.0);
    return s;
}

// Seconds per iteration of each benchmark (wall, CPU), for the ratios printed at the end.
struct Timing {
    double wall = 0.0;
    double cpu = 0.0;
};
std::map<std::string, Timing>& timings() {
    static std::map<std::string, Timing> t;
    return t;
}

void earmarkYin(benchmark::State& state) {
    const auto& signal = tenMinutes();
    earmark::PitchParams params;
    params.hopSeconds = kHop / signal.sampleRate;
    std::size_t voiced = 0;
    for (auto _ : state) {
        const earmark::PitchTrack track = earmark::analysePitch(signal, params);
        voiced = 0;
        for (float f : track.f0Hz) voiced += f > 0.0f;
        benchmark::DoNotOptimize(voiced);
    }
    state.counters["x_realtime"] = benchmark::Counter(
        signal.durationSeconds() * static_cast<double>(state.iterations()), benchmark::Counter::kIsRate);
}

void aubioYinFast(benchmark::State& state) {
    const auto& signal = tenMinutes();
    fvec_t* in = new_fvec(kHop);
    fvec_t* out = new_fvec(1);
    for (auto _ : state) {
        // A fresh object per pass, as analysePitch sets itself up per call.
        aubio_pitch_t* p = new_aubio_pitch("yinfast", kAubioBuffer, kHop, static_cast<uint_t>(signal.sampleRate));
        aubio_pitch_set_unit(p, "Hz");
        aubio_pitch_set_tolerance(p, 0.15f);
        double sum = 0.0;
        const std::size_t blocks = signal.size() / kHop;
        for (std::size_t k = 0; k < blocks; ++k) {
            for (int j = 0; j < kHop; ++j) in->data[j] = signal.samples[k * kHop + static_cast<std::size_t>(j)];
            aubio_pitch_do(p, in, out);
            sum += out->data[0] * aubio_pitch_get_confidence(p);
        }
        benchmark::DoNotOptimize(sum);
        del_aubio_pitch(p);
    }
    del_fvec(out);
    del_fvec(in);
    state.counters["x_realtime"] = benchmark::Counter(
        signal.durationSeconds() * static_cast<double>(state.iterations()), benchmark::Counter::kIsRate);
}

// Records each run's real time per iteration, then lets the console reporter print as usual.
class RecordingReporter : public benchmark::ConsoleReporter {
public:
    void ReportRuns(const std::vector<Run>& runs) override {
        for (const auto& r : runs)
            if (r.run_type == Run::RT_Iteration && r.iterations > 0)
                timings()[r.run_name.function_name] = {r.real_accumulated_time / static_cast<double>(r.iterations),
                                                       r.cpu_accumulated_time / static_cast<double>(r.iterations)};
        ConsoleReporter::ReportRuns(runs);
    }
};

}  // namespace

BENCHMARK(earmarkYin)->Unit(benchmark::kMillisecond)->MinTime(3.0);
BENCHMARK(aubioYinFast)->Unit(benchmark::kMillisecond)->MinTime(3.0);

int main(int argc, char** argv) {
    tenMinutes();  // build the signal before any timing
    benchmark::Initialize(&argc, argv);
    if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
    RecordingReporter reporter;
    benchmark::RunSpecifiedBenchmarks(&reporter);
    const auto& t = timings();
    if (t.count("earmarkYin") && t.count("aubioYinFast")) {
        const Timing e = t.at("earmarkYin"), a = t.at("aubioYinFast");
        std::printf("F0 over 10 min @ 22.05 kHz, hop 110: earmark %.0f ms CPU (%.0f ms wall), "
                    "aubio yinfast %.0f ms CPU (%.0f ms wall); aubio/earmark = %.2fx CPU, %.2fx wall\n",
                    1e3 * e.cpu, 1e3 * e.wall, 1e3 * a.cpu, 1e3 * a.wall, a.cpu / e.cpu, a.wall / e.wall);
    }
    benchmark::Shutdown();
    return 0;
}
