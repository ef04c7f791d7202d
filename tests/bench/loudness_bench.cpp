// Loudness speed: Earmark's BS.1770-4 meter against libebur128 (reference
// library) on the same 60 s of 48 kHz speech-like audio, in the same run.
#include "earmark/level/energy.hpp"
#include "earmark/loudness/bs1770.hpp"
#include "earmark/dsp/frames.hpp"
#include "support/test_signals.hpp"
#include <benchmark/benchmark.h>
#include <ebur128.h>
#include <algorithm>
#include <cmath>
using namespace earmark;

static const Signal& speech() { static Signal s = test::speechLike(60.0, 48000.0); return s; }
static std::vector<float> stereo() {
    static std::vector<float> v;
    if (v.empty()) { const auto& s = speech(); for (float x : s.samples) { v.push_back(x); v.push_back(0.5f * x); } }
    return v;
}

static void BM_EarmarkLoudness(benchmark::State& st) {
    const int ch = static_cast<int>(st.range(0));
    const auto& m = speech();
    std::vector<float> x = ch == 1 ? m.samples : stereo();
    for (auto _ : st) benchmark::DoNotOptimize(integratedLoudnessLufs(x.data(), x.size() / ch, 48000.0, ch));
    st.SetItemsProcessed(st.iterations() * m.size());
}
static void BM_Libebur128(benchmark::State& st) {
    const int ch = static_cast<int>(st.range(0));
    const auto& m = speech();
    std::vector<float> x = ch == 1 ? m.samples : stereo();
    for (auto _ : st) {
        ebur128_state* s = ebur128_init(ch, 48000, EBUR128_MODE_I);
        ebur128_add_frames_float(s, x.data(), x.size() / ch);
        double l; ebur128_loudness_global(s, &l); benchmark::DoNotOptimize(l);
        ebur128_destroy(&s);
    }
    st.SetItemsProcessed(st.iterations() * m.size());
}
static void BM_LoudnessSilence(benchmark::State& st) {
    std::vector<float> x(48000 * 60, 0.0f); x[0] = 0.5f;
    for (auto _ : st) benchmark::DoNotOptimize(integratedLoudnessLufs(x.data(), x.size(), 48000.0, 1));
}
static void BM_EnergyNew(benchmark::State& st) {
    for (auto _ : st) benchmark::DoNotOptimize(analyseEnergy(speech()).db.data());
}
// The previous plain-prefix-sum version, kept here as the speed reference.
static void BM_EnergyOldPrefix(benchmark::State& st) {
    const Signal& signal = speech();
    for (auto _ : st) {
        const int hop = 240, win = 1200;
        const FrameLayout layout(signal.size(), win, hop);
        std::vector<float> db(layout.count());
        std::vector<double> prefix(signal.size() + 1, 0.0);
        for (std::size_t i = 0; i < signal.size(); ++i) prefix[i + 1] = prefix[i] + double(signal.samples[i]) * signal.samples[i];
        const auto n = (std::int64_t)signal.size();
        for (std::int64_t f = 0; f < layout.count(); ++f) {
            auto a = std::clamp<std::int64_t>(layout.firstSample(f), 0, n), b = std::clamp<std::int64_t>(layout.firstSample(f) + win, 0, n);
            double p = std::max(0.0, prefix[b] - prefix[a]) / win;
            db[f] = p > 1e-12 ? 10 * std::log10(p) : -120;
        }
        benchmark::DoNotOptimize(db.data());
    }
}
BENCHMARK(BM_EarmarkLoudness)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_Libebur128)->Arg(1)->Arg(2)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_LoudnessSilence)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_EnergyNew)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_EnergyOldPrefix)->Unit(benchmark::kMillisecond);
BENCHMARK_MAIN();
