// Alignment speed: a two-minute paragraph (invented here), rendered by
// libespeak-ng with a voice and rate other than the aligner's reference,
// aligned to its text on one thread. The issue asks for < 5 s. Beside it,
// in the same run: the reference rendering alone and the MFCCs of the take
// alone, so the cost of each step can be read as a ratio. Counters:
// x_realtime = audio seconds per wall second; dtw_MB = cost cells stored by
// the larger DTW pass (4 bytes each) — bounded by the band, not take × reference.
//
// Word evidence on the same paragraph (issue 10): model alignment (two
// passes) + GOP scores, goal <= 10 s on one core; the scan of the paragraph
// as a take with its text (word evidence on) against the same scan without
// text (word evidence off), goal >= 30x real time; and the peak memory of
// word evidence on a long take (the paragraph three times, ≈ 6 min) —
// peak_rss_mb only grows, so run that one alone:
// `--benchmark_filter=wordEvidenceLongTake`.
#include "earmark/acoustic/word_evidence.hpp"
#include "earmark/align/mfcc.hpp"
#include "earmark/align/speech_render.hpp"
#include "earmark/align/text_aligner.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/scan/scan_run.hpp"

#include <benchmark/benchmark.h>

#include <sys/resource.h>
#include <unistd.h>

#include <filesystem>
#include <string>

namespace {

const char* const kParagraph[] = {
    "Every spring the island council repaints the wooden benches along the harbour wall.",
    "The work begins at dawn, before the first ferry brings visitors across the sound.",
    "Volunteers carry tins of green paint from the boat shed to the end of the pier.",
    "Children are allowed to help with the lower planks if they promise to stay tidy.",
    "By midday the smell of fresh paint drifts over the fish market and the post office.",
    "Gulls watch from the lamp posts, hoping that someone will drop a sandwich.",
    "Last year a sudden shower washed half of the paint into the water.",
    "Since then the council checks the forecast twice before choosing a day.",
    "The oldest bench has a brass plate with the name of a retired lighthouse keeper.",
    "He sat there every evening for forty years and counted the boats coming home.",
    "Nobody paints over the plate, and someone polishes it once a month.",
    "In the afternoon the volunteers stop for tea and cake in the chapel hall.",
    "The baker sends a tray of scones, still warm, with a boy on a bicycle.",
    "Stories are told about storms, shipwrecks and the winter the harbour froze.",
    "Some of the stories grow a little taller every time they are repeated.",
    "When the tea is finished, the brushes are cleaned in buckets of soapy water.",
    "The benches must dry overnight, so ropes are tied across them with small flags.",
    "A notice on the ferry board asks passengers not to sit on the wet paint.",
    "Every year at least one visitor ignores the notice and leaves with green trousers.",
    "The next morning the ropes come down and the benches shine in the sun.",
    "Fishermen sit on them to mend their nets and argue about the weather.",
    "Older couples share a flask of coffee and watch the tide creep up the slipway.",
    "In summer the benches are never empty, from breakfast until long after dark.",
    "A painter from the mainland once spent a whole week sketching the harbour.",
    "Her picture of the benches now hangs in the waiting room at the ferry terminal.",
    "Tourists often stop to photograph it before they board the evening sailing.",
    "The council has talked about replacing the old benches with metal ones.",
    "Each time the idea is raised, the meeting hall fills with unhappy residents.",
    "They say that metal would be cold in winter and far too hot in summer.",
    "So the wooden benches stay, and the painting day remains a local tradition.",
    "It is one of the few days when the whole island works side by side.",
    "By evening everyone is tired, speckled with paint and quietly pleased.",
    "The last ferry sounds its horn as it leaves, and the harbour lights come on.",
    "Tomorrow the gulls will return to their posts and wait for the visitors.",
};

struct Paragraph {
    std::string text;
    earmark::Signal take;
};

const Paragraph& paragraph() {
    static const Paragraph p = [] {
        Paragraph out;
        for (const char* s : kParagraph) out.text += std::string(s) + " ";
        out.take = earmark::renderSpeech(out.text, earmark::SpeechParams{"en-gb-x-rp", 160, 45}).audio;
        return out;
    }();
    return p;
}

void alignParagraph(benchmark::State& state) {
    const Paragraph& p = paragraph();
    std::size_t cells = 0;
    for (auto _ : state) {
        const earmark::AlignResult r = earmark::alignText(p.take, p.text);
        cells = r.dtwCells;
        benchmark::DoNotOptimize(r.meanConfidence);
    }
    state.counters["audio_s"] = p.take.durationSeconds();
    state.counters["dtw_MB"] = static_cast<double>(cells) * 4.0 / 1e6;
    state.counters["x_realtime"] = benchmark::Counter(
        p.take.durationSeconds() * static_cast<double>(state.iterations()), benchmark::Counter::kIsRate);
}

void renderReferenceOnly(benchmark::State& state) {
    const Paragraph& p = paragraph();
    for (auto _ : state) benchmark::DoNotOptimize(earmark::renderSpeech(p.text).audio.samples.data());
}

void takeMfccOnly(benchmark::State& state) {
    const Paragraph& p = paragraph();
    for (auto _ : state) benchmark::DoNotOptimize(earmark::computeMfcc(p.take).values.data());
}

double peakRssMb() {
    rusage u{};
    getrusage(RUSAGE_SELF, &u);
    return static_cast<double>(u.ru_maxrss) / 1024.0;  // KiB on Linux
}

void realtimeCounter(benchmark::State& state, double audioS) {
    state.counters["audio_s"] = audioS;
    state.counters["x_realtime"] =
        benchmark::Counter(audioS * static_cast<double>(state.iterations()), benchmark::Counter::kIsRate);
}

void wordEvidenceParagraph(benchmark::State& state) {
    const Paragraph& p = paragraph();
    for (auto _ : state) benchmark::DoNotOptimize(earmark::gatherWordEvidence(p.take, p.text).meanConfidence);
    realtimeCounter(state, p.take.durationSeconds());
}

// The paragraph as a WAV file, scanned as one take (one worker), with its
// text (range 1: word evidence) or without (range 0: the same scan, no words).
void scanParagraph(benchmark::State& state) {
    const Paragraph& p = paragraph();
    namespace fs = std::filesystem;
    const fs::path wav = fs::temp_directory_path() / ("earmark-align-bench-" + std::to_string(::getpid()) + ".wav");
    earmark::writeWav(wav.string(), p.take);
    earmark::ScanItem item;
    item.id = "paragraph";
    item.audioPath = wav.string();
    item.voice = "en-us";
    if (state.range(0) != 0) item.text = p.text;
    earmark::ScanSettings settings;
    settings.jobs = 1;
    for (auto _ : state) benchmark::DoNotOptimize(earmark::scanTake(item, settings).suspects.size());
    fs::remove(wav);
    realtimeCounter(state, p.take.durationSeconds());
}

void wordEvidenceLongTake(benchmark::State& state) {
    const Paragraph& p = paragraph();
    earmark::Signal take = p.take;
    std::string text;
    for (int i = 0; i < 3; ++i) text += p.text;
    for (int i = 0; i < 2; ++i) take.samples.insert(take.samples.end(), p.take.samples.begin(), p.take.samples.end());
    const double before = peakRssMb();
    for (auto _ : state) benchmark::DoNotOptimize(earmark::gatherWordEvidence(take, text).meanConfidence);
    realtimeCounter(state, take.durationSeconds());
    state.counters["peak_rss_mb"] = peakRssMb();
    state.counters["rss_growth_mb"] = peakRssMb() - before;
    state.counters["audio_f32_mb"] = static_cast<double>(take.samples.size()) * sizeof(float) / 1e6;
}

}  // namespace

BENCHMARK(wordEvidenceParagraph)->Unit(benchmark::kMillisecond)->Iterations(2)->UseRealTime();
BENCHMARK(scanParagraph)->ArgName("words")->Arg(0)->Arg(1)->Unit(benchmark::kMillisecond)->Iterations(2)->UseRealTime();
BENCHMARK(wordEvidenceLongTake)->Unit(benchmark::kMillisecond)->Iterations(1)->UseRealTime();
BENCHMARK(alignParagraph)->Unit(benchmark::kMillisecond)->MinTime(3.0);
BENCHMARK(renderReferenceOnly)->Unit(benchmark::kMillisecond);
BENCHMARK(takeMfccOnly)->Unit(benchmark::kMillisecond);
BENCHMARK_MAIN();
