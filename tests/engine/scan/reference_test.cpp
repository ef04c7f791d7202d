// Scan measures against outside references:
// - loudness against libebur128 (BS.1770-4 integrated loudness) on espeak-ng takes;
// - speech span and speaking rate against espeak-ng's own word events (the
//   renderer reports where each word starts and its phones end);
// - the rate of one text rendered at 120 and 240 words per minute: the ratio
//   of measured articulation rates follows the ratio espeak-ng's own word
//   timings give, and both are near the 2:1 speed ratio.
#include "earmark/align/reference_tiers.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/scan/scan_report.hpp"
#include "earmark/tiers/timings_json.hpp"
#include "engine/scan/espeak_takes.hpp"
#include "support/temp_dir.hpp"

#include <ebur128.h>
#include <sndfile.h>

#include <gtest/gtest.h>

#include <fstream>

namespace earmark {
namespace {

double libebur128Lufs(const std::string& path) {
    SF_INFO info{};
    SNDFILE* f = sf_open(path.c_str(), SFM_READ, &info);
    if (!f) throw std::runtime_error("cannot open " + path);
    std::vector<float> samples(static_cast<std::size_t>(info.frames * info.channels));
    sf_readf_float(f, samples.data(), info.frames);
    sf_close(f);
    ebur128_state* st = ebur128_init(static_cast<unsigned>(info.channels), static_cast<unsigned long>(info.samplerate), EBUR128_MODE_I);
    ebur128_add_frames_float(st, samples.data(), static_cast<std::size_t>(info.frames));
    double lufs = 0;
    ebur128_loudness_global(st, &lufs);
    ebur128_destroy(&st);
    return lufs;
}

TEST(ScanReference, LoudnessMatchesLibebur128) {
    if (!test::haveSpeechTools()) GTEST_SKIP() << "espeak-ng and sox are needed";
    test::TempDir dir;
    std::vector<ScanItem> items;
    const auto& lines = test::tramwayLines();
    const char* effects[] = {"", "gain 12", "gain -9", "pad 2.5 0", ""};
    for (int i = 0; i < 5; ++i) {
        test::RenderSpec spec;
        spec.text = lines[static_cast<std::size_t>(i)];
        spec.soxEffects = effects[i];
        const std::string id = std::string("level-") + char('a' + i);
        const auto path = dir.path() / (id + ".wav");
        test::renderTake(spec, path);
        items.push_back({static_cast<std::size_t>(i), id, path.string(), spec.text, "", ""});
    }
    const ScanRun run = runScan(items, ScanSettings{});
    ASSERT_EQ(run.rows.size(), items.size());
    for (const auto& row : run.rows) {
        ASSERT_TRUE(row.measures && row.measures->level.loudnessLufs) << row.status;
        EXPECT_NEAR(*row.measures->level.loudnessLufs, libebur128Lufs(row.file), 0.1) << row.id;
    }
}

struct Rendered {
    std::string wav, timings;
    double firstWordS = 0, lastWordEndS = 0;
    int words = 0;
};

// Renders `text` with the espeak-ng library, writes the audio and the
// renderer's word/phone tiers (Earmark timings JSON).
Rendered render(const std::string& text, int wpm, const std::filesystem::path& dir, const std::string& name) {
    SpeechParams params;
    params.voice = "en-gb-x-rp";
    params.rateWpm = wpm;
    const RenderedSpeech speech = renderSpeech(text, params);
    const ReferenceTiers tiers = referenceTiers(text, speech);
    Rendered r;
    r.wav = (dir / (name + ".wav")).string();
    r.timings = (dir / (name + ".json")).string();
    writeWav(r.wav, speech.audio);
    TierSet set;
    set.durationS = speech.audio.durationSeconds();
    set.tiers = {tiers.words, tiers.phones};
    std::ofstream(r.timings) << timingsToJson(set);
    r.words = static_cast<int>(tiers.words.intervals.size());
    r.firstWordS = tiers.words.intervals.front().startS;
    r.lastWordEndS = tiers.words.intervals.back().endS;
    return r;
}

TEST(ScanReference, SpeechSpanAndRateAgainstTheRenderersWordTimes) {
    test::TempDir dir;
    const std::string text = "The return journey takes about twenty minutes with two stops at the quarry halt.";
    std::vector<ScanItem> items;
    std::vector<Rendered> rendered;
    for (int wpm : {120, 240}) {
        rendered.push_back(render(text, wpm, dir.path(), "r" + std::to_string(wpm)));
        // Once with the renderer's timings (syllables from its phones), once with the text only.
        items.push_back({items.size(), "timed-" + std::to_string(wpm), rendered.back().wav, text, rendered.back().timings, ""});
        items.push_back({items.size(), "text-" + std::to_string(wpm), rendered.back().wav, text, "", ""});
    }
    const ScanRun run = runScan(items, ScanSettings{});
    ASSERT_EQ(run.rows.size(), 4u);
    std::vector<double> articulation;
    for (std::size_t i = 0; i < 4; ++i) {
        const ScanRow& row = run.rows[i];
        ASSERT_EQ(row.status, "ok") << row.id;
        const TakeMeasures& m = *row.measures;
        const Rendered& ref = rendered[i / 2];
        // The energy-based speech span matches the renderer's first word start
        // and last phone end within 50 ms at each end.
        EXPECT_NEAR(m.leadingSilenceS, ref.firstWordS, 0.05) << row.id;
        EXPECT_NEAR(m.durationS - m.trailingSilenceS, ref.lastWordEndS, 0.05) << row.id;
        // Words per minute over the speech span, against the renderer's span.
        const double refWpm = 60.0 * ref.words / (ref.lastWordEndS - ref.firstWordS);
        EXPECT_NEAR(*m.wordsPerMinute / refWpm, 1.0, 0.05) << row.id;
        // Syllables come from phones in both: the renderer's own phones for the
        // timed takes, the acoustic model's phone tier for the text-only ones
        // (the scan gathers word evidence before it measures).
        EXPECT_EQ(row.wordTimesFrom, i % 2 == 0 ? "timings" : "model") << row.id;
        EXPECT_EQ(m.syllableSource, SyllableSource::Phones) << row.id;
        articulation.push_back(*m.articulationSyllablesPerS);
        RecordProperty(row.id + "_wpm", std::to_string(*m.wordsPerMinute) + " (renderer " + std::to_string(refWpm) + ")");
    }
    // 240 vs 120 wpm: measured articulation-rate ratio against the renderer's own span ratio.
    const double refRatio = (rendered[0].lastWordEndS - rendered[0].firstWordS) /
                            (rendered[1].lastWordEndS - rendered[1].firstWordS);
    for (std::size_t k : {0u, 1u}) {
        const double ratio = articulation[k + 2] / articulation[k];
        EXPECT_NEAR(ratio / refRatio, 1.0, 0.1) << "ratio " << ratio << " renderer " << refRatio;
        EXPECT_NEAR(ratio, 2.0, 0.3);
    }
}

}  // namespace
}  // namespace earmark
