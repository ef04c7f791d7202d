// Speed of comparing two takes and of reading model outputs, each beside a
// reference step measured in the same run so the cost reads as a ratio:
// - compareTakes on a ~30 s pair (invented lines read by libespeak-ng at
//   175 and 140 words per minute), frame-wise and word by word (words from
//   the renderer), against the F0 tracks of both takes alone (the YIN part
//   it cannot avoid);
// - diffPredictedMel against computeMelSpectrogram alone (the mel it must
//   compute anyway);
// - the monotonic attention path of a 2000-frame × 200-token matrix.
// Counters: x_realtime = seconds of take A per wall second.
#include "earmark/align/reference_tiers.hpp"
#include "earmark/align/speech_render.hpp"
#include "earmark/compare/take_comparison.hpp"
#include "earmark/model/attention_alignment.hpp"
#include "earmark/model/mel_difference.hpp"
#include "earmark/pitch/yin.hpp"

#include <benchmark/benchmark.h>

#include <cmath>
#include <string>

namespace {

const char* const kLines =
    "The morning boat to the outer islands leaves when the tide turns at the harbour mouth. "
    "Passengers with bicycles should board first and tie them to the rail on the lower deck. "
    "Tea and toast are served in the saloon until the boat rounds the lighthouse point. "
    "On clear days the cliffs of the far island can be seen from the upper deck. "
    "Please keep children away from the ropes while the crew prepares to come alongside. "
    "The return sailing waits for the last bus from the village at the top of the hill. "
    "Timetables for the winter months are pinned inside the ticket office window.";

struct Pair {
    earmark::TakeInput a, b;
};

const Pair& pair() {
    static const Pair p = [] {
        const std::string text = kLines;
        const earmark::RenderedSpeech a = earmark::renderSpeech(text, {"en-us", 175, 50});
        const earmark::RenderedSpeech b = earmark::renderSpeech(text, {"en-us", 140, 50});
        return Pair{{a.audio, earmark::referenceTiers(text, a).words},
                    {b.audio, earmark::referenceTiers(text, b).words}};
    }();
    return p;
}

void setRealtime(benchmark::State& state) {
    state.counters["x_realtime"] =
        benchmark::Counter(pair().a.audio.durationSeconds() * state.iterations(), benchmark::Counter::kIsRate);
}

void BM_PitchOfBothTakes(benchmark::State& state) {
    for (auto _ : state) {
        benchmark::DoNotOptimize(earmark::analysePitch(pair().a.audio));
        benchmark::DoNotOptimize(earmark::analysePitch(pair().b.audio));
    }
    setRealtime(state);
}
BENCHMARK(BM_PitchOfBothTakes)->Unit(benchmark::kMillisecond);

void BM_CompareFrameWise(benchmark::State& state) {
    for (auto _ : state) benchmark::DoNotOptimize(earmark::compareTakes({pair().a.audio, {}}, {pair().b.audio, {}}));
    setRealtime(state);
}
BENCHMARK(BM_CompareFrameWise)->Unit(benchmark::kMillisecond);

void BM_CompareWordByWord(benchmark::State& state) {
    for (auto _ : state) benchmark::DoNotOptimize(earmark::compareTakes(pair().a, pair().b));
    setRealtime(state);
}
BENCHMARK(BM_CompareWordByWord)->Unit(benchmark::kMillisecond);

const earmark::PredictedMel& predicted() {
    static const earmark::PredictedMel p = [] {
        earmark::PredictedMel m;
        m.settings = earmark::MelSettings{};
        m.mel = earmark::computeMelSpectrogram(pair().a.audio, m.settings.melParams());  // 22 050 Hz already
        return m;
    }();
    return p;
}

void BM_MelAlone(benchmark::State& state) {
    for (auto _ : state)
        benchmark::DoNotOptimize(earmark::computeMelSpectrogram(pair().a.audio, predicted().settings.melParams()));
    setRealtime(state);
}
BENCHMARK(BM_MelAlone)->Unit(benchmark::kMillisecond);

void BM_PredictedMelDifference(benchmark::State& state) {
    for (auto _ : state) benchmark::DoNotOptimize(earmark::diffPredictedMel(predicted(), pair().a.audio));
    setRealtime(state);
}
BENCHMARK(BM_PredictedMelDifference)->Unit(benchmark::kMillisecond);

void BM_AttentionPath(benchmark::State& state) {
    earmark::AttentionMatrix m;
    m.frames = 2000;
    m.tokens = 200;
    for (int f = 0; f < m.frames; ++f)
        for (int k = 0; k < m.tokens; ++k) {
            const double d = k - f * 0.1;
            m.weights.push_back(static_cast<float>(std::exp(-0.5 * d * d)));
        }
    for (auto _ : state) benchmark::DoNotOptimize(earmark::alignAttention(m, std::vector<std::string>(200, "x")));
}
BENCHMARK(BM_AttentionPath)->Unit(benchmark::kMillisecond);

}  // namespace

BENCHMARK_MAIN();
