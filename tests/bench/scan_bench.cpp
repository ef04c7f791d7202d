// Batch scan speed: 1000 takes of 3.6 s speech-like audio at 22.05 kHz (one
// hour in all) written as 16-bit WAV files, scanned with 1 and 2 worker
// threads (F0, energy, loudness, measures, suspects, ranking). The issue asks
// for < 60 s on 2 cores. Also 200 takes, to compare. Counters: x_realtime =
// audio seconds per wall second; max_rss_mb = the process's peak resident
// memory so far (getrusage; it only grows, so compare separate runs, e.g.
// `--benchmark_filter=/200/` against `--benchmark_filter=/1000/`).
//
// `--takes-dir=DIR` keeps the generated takes in DIR (and reuses them on the
// next run), e.g. for timing `earmark-cli scan DIR` under /usr/bin/time -v.
#include "earmark/io/audio_file.hpp"
#include "earmark/scan/scan_report.hpp"
#include "support/test_signals.hpp"

#include <benchmark/benchmark.h>

#include <sys/resource.h>

#include <cstring>
#include <filesystem>
#include <map>

namespace {

namespace fs = std::filesystem;
fs::path gRoot;
bool gKeep = false;

// The first `count` takes of the shared folder (generated once).
std::vector<earmark::ScanItem> takes(int count) {
    static std::map<int, std::vector<earmark::ScanItem>> cache;
    if (auto it = cache.find(count); it != cache.end()) return it->second;
    const fs::path dir = gRoot / ("takes-" + std::to_string(count));
    fs::create_directories(dir);
    for (int i = 0; i < count; ++i) {
        char name[32];
        std::snprintf(name, sizeof name, "take-%04d.wav", i);
        const fs::path p = dir / name;
        if (!fs::exists(p))
            earmark::writeWav(p.string(), earmark::test::speechLike(3.6, 22050.0, 1000u + static_cast<unsigned>(i)));
    }
    return cache[count] = earmark::listScanInput(dir.string());
}

double maxRssMb() {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    return static_cast<double>(u.ru_maxrss) / 1024.0;  // ru_maxrss is in KiB on Linux
}

void scan(benchmark::State& state) {
    const auto items = takes(static_cast<int>(state.range(0)));
    earmark::ScanSettings settings;
    settings.jobs = static_cast<int>(state.range(1));
    double audio = 0;
    for (auto _ : state) {
        auto report = earmark::makeReport(earmark::runScan(items, settings), settings.rules);
        audio = 0;
        for (const auto& row : report.rows) audio += row.measures ? row.measures->durationS : 0.0;
        benchmark::DoNotOptimize(report.rows.data());
    }
    state.counters["audio_h"] = audio / 3600.0;
    state.counters["x_realtime"] =
        benchmark::Counter(audio * static_cast<double>(state.iterations()), benchmark::Counter::kIsRate);
    state.counters["max_rss_mb"] = maxRssMb();
}

}  // namespace

BENCHMARK(scan)->ArgNames({"takes", "jobs"})->Args({200, 2})->Args({1000, 1})->Args({1000, 2})
    ->Unit(benchmark::kSecond)->Iterations(1)->UseRealTime();

int main(int argc, char** argv) {
    std::vector<char*> rest;
    for (int i = 0; i < argc; ++i) {
        if (std::strncmp(argv[i], "--takes-dir=", 12) == 0) {
            gRoot = argv[i] + 12;
            gKeep = true;
        } else {
            rest.push_back(argv[i]);
        }
    }
    if (!gKeep) gRoot = fs::temp_directory_path() / ("earmark-scan-bench-" + std::to_string(::getpid()));
    int n = static_cast<int>(rest.size());
    benchmark::Initialize(&n, rest.data());
    benchmark::RunSpecifiedBenchmarks();
    benchmark::Shutdown();
    if (!gKeep) fs::remove_all(gRoot);
    return 0;
}
