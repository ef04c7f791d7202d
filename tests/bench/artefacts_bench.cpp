// Speed of the artefact detectors and of slowed playback, on one thread,
// over 60 s of 22.05 kHz speech-like audio (tests/support/test_signals.hpp).
//
// Goals (issue 16): all four detectors together ≥ 300× real time, given the
// take's YIN track (the scan computes it anyway); WSOLA at 0.25× renders its
// output ≥ 5× faster than it plays. Each counter `x_realtime` is seconds of
// audio (input for the detectors, output for the stretch) per CPU second.
// References measured in the same run: the engine's YIN on the same audio
// (for the detectors) and a plain copy of the take in the player's blocks
// (for playback); compare the x_realtime counters.
//
// "stream 0.25x loop" is what the player runs: PlaybackStream over a 15 s
// span looping at 0.25x, read in blocks of 512 frames as the audio device
// pulls them; its x_realtime is the headroom (≥ 5 wanted).
#include "earmark/artefacts/buzz.hpp"
#include "earmark/artefacts/clicks.hpp"
#include "earmark/artefacts/dropouts.hpp"
#include "earmark/artefacts/noise_bursts.hpp"
#include "earmark/pitch/yin.hpp"
#include "earmark/playback/playback_stream.hpp"
#include "earmark/playback/time_stretch.hpp"
#include "support/test_signals.hpp"

#include <benchmark/benchmark.h>

#include <algorithm>
#include <vector>

namespace {

const earmark::Signal& minute() {
    static const earmark::Signal s = earmark::test::speechLike(60.0, 22050.0);
    return s;
}
const earmark::PitchTrack& pitch() {
    static const earmark::PitchTrack t = earmark::analysePitch(minute());
    return t;
}
constexpr double kSpeechLevelDb = -20.0;

template <typename F>
void run(benchmark::State& state, const char* name, double audioSeconds, F&& f) {
    for (auto _ : state) benchmark::DoNotOptimize(f());
    state.counters["x_realtime"] =
        benchmark::Counter(audioSeconds * static_cast<double>(state.iterations()), benchmark::Counter::kIsRate);
    state.SetLabel(name);
}

void yin(benchmark::State& s) { run(s, "yin", 60.0, [] { return earmark::analysePitch(minute()).size(); }); }
void clicks(benchmark::State& s) {
    run(s, "clicks", 60.0, [] { return earmark::findClicks(minute(), kSpeechLevelDb).size(); });
}
void noiseBursts(benchmark::State& s) {
    run(s, "noise bursts", 60.0, [] { return earmark::findNoiseBursts(minute(), pitch(), kSpeechLevelDb).size(); });
}
void buzz(benchmark::State& s) {
    run(s, "buzz", 60.0, [] { return earmark::findBuzz(minute(), pitch(), kSpeechLevelDb).size(); });
}
void dropouts(benchmark::State& s) {
    run(s, "drop-outs", 60.0, [] { return earmark::findDropouts(minute(), pitch(), kSpeechLevelDb).size(); });
}
void allDetectors(benchmark::State& s) {
    run(s, "all four", 60.0, [] {
        return earmark::findClicks(minute(), kSpeechLevelDb).size() +
               earmark::findNoiseBursts(minute(), pitch(), kSpeechLevelDb).size() +
               earmark::findBuzz(minute(), pitch(), kSpeechLevelDb).size() +
               earmark::findDropouts(minute(), pitch(), kSpeechLevelDb).size();
    });
}
void stretchQuarter(benchmark::State& s) {
    // 15 s of input become 60 s of output.
    static const earmark::Signal input{
        std::vector<float>(minute().samples.begin(), minute().samples.begin() + 15 * 22050), 22050.0};
    run(s, "WSOLA 0.25x (output seconds)", 60.0, [] { return earmark::timeStretch(input, {.rate = 0.25}).size(); });
}

constexpr std::size_t kBlock = 512;  // frames per audio-device pull

// The player's path: a looping span at 0.25x read block by block; 60 s of output.
void streamQuarterLoop(benchmark::State& s) {
    run(s, "stream 0.25x loop (output seconds)", 60.0, [] {
        earmark::PlaybackParams params;
        params.stretch.rate = 0.25;
        earmark::PlaybackStream stream(minute(), {.startSeconds = 20.0, .endSeconds = 35.0, .loop = true}, params);
        std::vector<float> block(kBlock);
        std::size_t total = 0;
        while (total < 60 * 22050) total += stream.read(block.data(), kBlock);
        return total + static_cast<std::size_t>(block[0] != 0.0f);
    });
}
// Reference: copying 60 s of the take out in the same blocks.
void copyBlocks(benchmark::State& s) {
    run(s, "copy in blocks (reference)", 60.0, [] {
        const auto& x = minute().samples;
        std::vector<float> block(kBlock);
        float sum = 0.0f;
        for (std::size_t i = 0; i + kBlock <= x.size(); i += kBlock) {
            std::copy_n(x.begin() + static_cast<std::ptrdiff_t>(i), kBlock, block.begin());
            benchmark::DoNotOptimize(block.data());
            sum += block[0];
        }
        return sum;
    });
}

BENCHMARK(yin)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(clicks)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(noiseBursts)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(buzz)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(dropouts)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(allDetectors)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(stretchQuarter)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(streamQuarterLoop)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();
BENCHMARK(copyBlocks)->Unit(benchmark::kMillisecond)->MeasureProcessCPUTime();

}  // namespace

BENCHMARK_MAIN();
