// Long-form measures of a 1-hour take (issue 12: >= 200x real time on one
// core; peak memory <= 2x the float32 audio). The take is a built long read
// (support/long_read.hpp: ≈ 6 minutes of espeak-ng sentences on a noise
// floor) repeated to one hour at 22.05 kHz. Reference in the same run:
// libebur128's integrated loudness of the same hour (one pass of a
// K-weighting filter), so the ratio says how many such passes the long-form
// analysis costs.
//
// Counters: x_realtime = audio seconds / wall seconds (x_realtime_cpu: / the
// process's CPU seconds, the analysis being one thread); peak_rss_over_audio =
// the process's peak resident memory (which includes the audio itself and
// the test's renderer) over the audio's float32 bytes.
#include "earmark/longform/findings.hpp"
#include "earmark/longform/long_alignment.hpp"
#include "support/long_read.hpp"

#include <benchmark/benchmark.h>
#include <ebur128.h>
#include <sys/resource.h>

#include <chrono>
#include <ctime>

using namespace earmark;

namespace {

const test::LongRead& longRead() {
    static const test::LongRead r = test::makeLongRead();
    return r;
}

// The read repeated to an hour, and its text as often (whole copies only).
const Signal& hourTake() {
    static const Signal take = [] {
        const test::LongRead& read = longRead();
        Signal s;
        s.sampleRate = read.audio.sampleRate;
        const auto n = static_cast<std::size_t>(3600.0 * s.sampleRate);
        s.samples.reserve(n);
        while (s.samples.size() < n) {
            const std::size_t k = std::min(n - s.samples.size(), read.audio.size());
            s.samples.insert(s.samples.end(), read.audio.samples.begin(), read.audio.samples.begin() + static_cast<std::ptrdiff_t>(k));
        }
        return s;
    }();
    return take;
}

double peakRssBytes() {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    return static_cast<double>(u.ru_maxrss) * 1024.0;  // KiB on Linux
}

void BM_LongformHour(benchmark::State& state) {
    const Signal& take = hourTake();
    std::size_t findings = 0;
    double seconds = 0, cpuSeconds = 0;
    for (auto _ : state) {
        const auto start = std::chrono::steady_clock::now();
        const std::clock_t cpuStart = std::clock();
        const LongformReport report = analyseLongform(take, {}, LongformRules{});
        seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        cpuSeconds = static_cast<double>(std::clock() - cpuStart) / CLOCKS_PER_SEC;
        state.SetIterationTime(seconds);
        findings = report.findings.size();
        std::string kinds;  // a clean read repeated should raise none: name any that were
        for (const Finding& f : report.findings) kinds += (kinds.empty() ? "" : "; ") + f.reason;
        state.SetLabel(kinds);
        benchmark::DoNotOptimize(report);
    }
    state.counters["x_realtime"] = take.durationSeconds() / seconds;
    state.counters["x_realtime_cpu"] = take.durationSeconds() / cpuSeconds;  // one thread: wall time on a shared machine overstates
    state.counters["peak_rss_over_audio"] = peakRssBytes() / (static_cast<double>(take.size()) * sizeof(float));
    state.counters["findings"] = static_cast<double>(findings);
}

// Long text alignment of the hour (issue 12: <= 2 minutes on 2 cores; this
// runs on one), chunk by chunk with the reference-warping aligner.
void BM_LongAlignHour(benchmark::State& state) {
    const Signal& take = hourTake();
    const auto copies = static_cast<int>(take.size() / longRead().audio.size());
    Signal whole;
    whole.sampleRate = take.sampleRate;
    whole.samples.assign(take.samples.begin(), take.samples.begin() + static_cast<std::ptrdiff_t>(copies * longRead().audio.size()));
    std::string text;
    for (int i = 0; i < copies; ++i) text += longRead().text + "\n\n";
    double seconds = 0;
    int chunks = 0;
    for (auto _ : state) {
        const auto start = std::chrono::steady_clock::now();
        const LongAlignResult r = alignLongText(whole, text, referenceWarpingAligner());
        seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        state.SetIterationTime(seconds);
        chunks = r.chunks;
    }
    state.counters["audio_s"] = whole.durationSeconds();
    state.counters["x_realtime"] = whole.durationSeconds() / seconds;
    state.counters["chunks"] = chunks;
}

void BM_Libebur128Hour(benchmark::State& state) {
    const Signal& take = hourTake();
    double seconds = 0;
    for (auto _ : state) {
        const auto start = std::chrono::steady_clock::now();
        ebur128_state* s = ebur128_init(1, static_cast<unsigned long>(take.sampleRate), EBUR128_MODE_I);
        ebur128_add_frames_float(s, take.samples.data(), take.size());
        double lufs = 0;
        ebur128_loudness_global(s, &lufs);
        ebur128_destroy(&s);
        benchmark::DoNotOptimize(lufs);
        seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        state.SetIterationTime(seconds);
    }
    state.counters["x_realtime"] = take.durationSeconds() / seconds;
}

}  // namespace

BENCHMARK(BM_Libebur128Hour)->Iterations(1)->UseManualTime()->Unit(benchmark::kSecond);
BENCHMARK(BM_LongformHour)->Iterations(1)->UseManualTime()->Unit(benchmark::kSecond);
BENCHMARK(BM_LongAlignHour)->Iterations(1)->UseManualTime()->Unit(benchmark::kSecond);
BENCHMARK_MAIN();
