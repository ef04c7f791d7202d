// The scan's per-word prosody on a take with text and no timings: the word
// times are the acoustic model's word tier, and the row says so.
//
// Take: Debian's festival voice cmu_us_slt_arctic_hts reading a text of our
// own (tests/data/evidence/render_festival_takes.py); festival's own word
// start times (its utterance structure) are the outside truth.
#include "earmark/acoustic/word_evidence.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/scan/scan_report.hpp"
#include "earmark/scan/scan_run.hpp"
#include "support/temp_dir.hpp"
#include "support/festival_takes.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <fstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;

TEST(ScanWordProsody, TakeWithTextAndNoTimingsUsesTheModelsWordTier) {
    const fs::path wav = test::festivalTakes() / "slt-01.wav";
    const std::string text = test::firstLine(fs::path(wav).replace_extension(".txt"));
    ScanSettings settings;
    const ScanRow row = scanTake(ScanItem{0, "slt-01", wav.string(), text, "", ""}, settings);
    ASSERT_FALSE(row.failed) << row.status;
    EXPECT_EQ(row.words.method, "model");
    EXPECT_EQ(row.wordTimesFrom, "model");

    // The model's word tier for the same take, gathered on its own.
    const WordEvidenceResult evidence = gatherWordEvidence(loadAudio(wav.string()).signal, text);
    const Tier* modelWords = evidence.tiers.find(kWordsTier);
    ASSERT_NE(modelWords, nullptr);
    ASSERT_EQ(row.wordProsody.size(), modelWords->intervals.size());
    ASSERT_GE(row.wordProsody.size(), 8u);
    for (std::size_t i = 0; i < row.wordProsody.size(); ++i) {
        EXPECT_NEAR(row.wordProsody[i].startS, modelWords->intervals[i].startS, 0.010) << i;  // one 10 ms frame
        EXPECT_NEAR(row.wordProsody[i].endS, modelWords->intervals[i].endS, 0.010) << i;
        EXPECT_GT(row.wordProsody[i].durationS, 0.0) << i;
    }

    // And those times sit on festival's own word starts: each within 100 ms, most within 50 ms
    // (the alignment bar itself is checked over all takes in tests/engine/acoustic).
    std::ifstream truth(fs::path(wav).replace_extension(".words"));
    double start = 0, end = 0;
    std::string label;
    std::size_t i = 0, within = 0;
    while (truth >> start >> end >> label && i < row.wordProsody.size()) {
        EXPECT_NE(row.wordProsody[i].text.find(label.substr(0, 3)), std::string::npos) << label;
        EXPECT_NEAR(row.wordProsody[i].startS, start, 0.100) << label;
        if (std::abs(row.wordProsody[i].startS - start) <= 0.050) ++within;
        ++i;
    }
    EXPECT_EQ(i, row.wordProsody.size());
    EXPECT_GE(2 * within, i);  // measured on this take: 7 of 9
    // The measures count the model's words, not just the text's tokens.
    ASSERT_TRUE(row.measures.has_value());
    EXPECT_EQ(row.measures->words, static_cast<int>(row.wordProsody.size()));

    // The report carries both: the CSV's word_times column, the JSON's word_times and word_measures
    // (merge reads them back, so shards keep them).
    ScanRun run;
    run.rows = {row};
    run.total = 1;
    const ScanReport report = makeReport(run, settings.rules);
    test::TempDir dir;
    std::ofstream(dir.path() / "r.csv", std::ios::binary) << reportToCsv(report);
    std::ofstream(dir.path() / "r.json", std::ios::binary) << reportToJson(report, settings.rules);
    EXPECT_NE(reportToCsv(report).find(",word_times,"), std::string::npos);
    const ScanReport fromCsv = readReport((dir.path() / "r.csv").string());
    ASSERT_EQ(fromCsv.rows.size(), 1u);
    EXPECT_EQ(fromCsv.rows[0].wordTimesFrom, "model");
    const ScanReport fromJson = readReport((dir.path() / "r.json").string());
    ASSERT_EQ(fromJson.rows.size(), 1u);
    EXPECT_EQ(fromJson.rows[0].wordTimesFrom, "model");
    const auto& back = fromJson.rows[0].wordProsody;
    ASSERT_EQ(back.size(), row.wordProsody.size());
    for (std::size_t k = 0; k < back.size(); ++k) {
        EXPECT_EQ(back[k].text, row.wordProsody[k].text);
        EXPECT_DOUBLE_EQ(back[k].startS, row.wordProsody[k].startS);
        EXPECT_DOUBLE_EQ(back[k].endS, row.wordProsody[k].endS);
        EXPECT_EQ(back[k].syllables, row.wordProsody[k].syllables);
        EXPECT_EQ(back[k].f0MeanHz.has_value(), row.wordProsody[k].f0MeanHz.has_value()) << back[k].text;
        if (back[k].f0MeanHz) {
            EXPECT_DOUBLE_EQ(*back[k].f0MeanHz, *row.wordProsody[k].f0MeanHz);
        }
        EXPECT_EQ(back[k].pauseBeforeS.has_value(), row.wordProsody[k].pauseBeforeS.has_value());
        EXPECT_DOUBLE_EQ(back[k].prominence, row.wordProsody[k].prominence);
    }
}

// A script mostly not in the take (three times the take's own text): the model places under half of
// it, so the row gets no word suspects and no model word times, and its status says why.
TEST(ScanWordProsody, EvidenceThatPlacesUnderHalfTheScriptIsNotUsed) {
    const fs::path wav = test::festivalTakes() / "kal-01.wav";
    const std::string text = test::firstLine(fs::path(wav).replace_extension(".txt"));
    ScanSettings settings;
    const ScanRow row = scanTake(ScanItem{0, "kal-01", wav.string(), text + " " + text + " " + text, "", ""}, settings);
    ASSERT_FALSE(row.failed) << row.status;
    EXPECT_NE(row.status.find("words not checked: the acoustic model placed only"), std::string::npos) << row.status;
    EXPECT_FALSE(row.words.gathered());
    EXPECT_EQ(row.wordTimesFrom, "");
    EXPECT_TRUE(row.wordProsody.empty());
    for (const auto& s : row.suspects) {
        const std::string name = suspectName(s.kind);
        for (const char* wordRule : {"skipped-word", "repeated-word", "extra-speech", "early-end", "substituted-word"})
            EXPECT_NE(name, wordRule) << s.reason;
    }
    // The measures count the script's tokens instead.
    ASSERT_TRUE(row.measures.has_value());
    const auto tokens = std::count(text.begin(), text.end(), ' ') + 1;
    EXPECT_EQ(row.measures->words, 3 * tokens);
}

TEST(ScanWordProsody, VoicesTheModelDoesNotCoverGetNoModelWordTimes) {
    const fs::path wav = test::festivalTakes() / "kal-01.wav";
    ScanSettings settings;
    const ScanRow row = scanTake(ScanItem{0, "b", wav.string(), "Guten Morgen", "", "de"}, settings);
    EXPECT_FALSE(row.failed);
    EXPECT_EQ(row.wordTimesFrom, "");
    EXPECT_TRUE(row.wordProsody.empty());
}

}  // namespace
}  // namespace earmark
