// Alignment speed: a two-minute paragraph (invented here), rendered by
// libespeak-ng with a voice and rate other than the aligner's reference,
// aligned to its text on one thread. The issue asks for < 5 s. Beside it,
// in the same run: the reference rendering alone and the MFCCs of the take
// alone, so the cost of each step can be read as a ratio. Counters:
// x_realtime = audio seconds per wall second; dtw_MB = cost cells stored by
// the larger DTW pass (4 bytes each) — bounded by the band, not take × reference.
#include "earmark/align/mfcc.hpp"
#include "earmark/align/speech_render.hpp"
#include "earmark/align/text_aligner.hpp"

#include <benchmark/benchmark.h>

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

}  // namespace

BENCHMARK(alignParagraph)->Unit(benchmark::kMillisecond)->MinTime(3.0);
BENCHMARK(renderReferenceOnly)->Unit(benchmark::kMillisecond);
BENCHMARK(takeMfccOnly)->Unit(benchmark::kMillisecond);
BENCHMARK_MAIN();
