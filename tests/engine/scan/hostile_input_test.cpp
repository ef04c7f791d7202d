// The scan with messy real-world listings: files differing only by
// extension, a timings file with numbers beyond a double, names that are not
// UTF-8 or hold a line break, and figures merge must read back exactly.
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/scan/scan_input.hpp"
#include "earmark/scan/scan_report.hpp"
#include "earmark/scan/scan_run.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace earmark {
namespace {

TEST(ScanHostileInput, FilesDifferingOnlyByExtensionGetDistinctIds) {
    test::TempDir dir;
    const Signal s = test::sine(150.0, 0.5, 16000.0, 0.3);
    for (const char* name : {"x.wav", "x.flac", "y.wav"}) writeWav(dir.file(name), s);
    const auto items = listScanInput(dir.path().string());
    ASSERT_EQ(items.size(), 3u);
    EXPECT_EQ(items[0].id, "x.flac");
    EXPECT_EQ(items[1].id, "x.wav");
    EXPECT_EQ(items[2].id, "y");  // alone, it keeps the short id
}

TEST(ScanHostileInput, ATimingsFileWithAHugeNumberIsIgnoredNotTheAudio) {
    test::TempDir dir;
    writeWav(dir.file("a.wav"), test::speechLike(1.5, 16000.0));
    std::ofstream(dir.file("a.json"), std::ios::binary) << R"({"words": [{"text": "a", "start": 0, "end": 1e400}]})";
    ScanItem item;
    item.id = "a";
    item.audioPath = dir.file("a.wav");
    item.timingsPath = dir.file("a.json");
    ScanSettings settings;
    settings.jobs = 1;
    const ScanRun run = runScan({item}, settings);
    ASSERT_EQ(run.rows.size(), 1u);
    EXPECT_FALSE(run.rows[0].failed) << run.rows[0].status;
    EXPECT_TRUE(run.rows[0].measures.has_value());
    EXPECT_EQ(run.rows[0].status.rfind("ok; timings ignored: " + dir.file("a.json") + ": holds a number too large", 0),
              0u)
        << run.rows[0].status;
}

ScanRow measuredRow(std::size_t index, double lufs) {
    ScanRow row;
    row.index = index;
    // Appended, not `"t" + to_string`: GCC 12 raises a false -Wrestrict on that.
    row.id = std::string("t").append(std::to_string(index));
    row.file = row.id + ".wav";
    row.measures = TakeMeasures{};
    row.measures->durationS = 2.0 + index / 7.0;  // not a round number of milliseconds
    row.measures->level.loudnessLufs = lufs;
    row.takeScore = 0.1234567 * index;
    return row;
}

TEST(ScanHostileInput, TheCsvKeepsWhatMergeDecidesOn) {
    // The set median is -23.004 LUFS; the last take lies 0.003 LU beyond the
    // 6 LU limit. Rounded to 0.01 in the CSV, the merge saw exactly 6 LU and
    // raised no suspect, where one run did.
    const ScanRules rules;
    ScanReport one;
    for (std::size_t i = 0; i < 6; ++i) one.rows.push_back(measuredRow(i, -23.004));
    one.rows.push_back(measuredRow(6, -23.004 + rules.loudness.maxDeviationLu + 0.003));
    applySetRules(one, rules);
    rankRows(one.rows);
    ASSERT_EQ(one.rows.front().suspects.size(), 1u);

    test::TempDir dir;
    std::ofstream(dir.file("part.csv"), std::ios::binary) << reportToCsv(one);
    const ScanReport merged = mergeReports({readReport(dir.file("part.csv"))}, rules);
    ASSERT_EQ(merged.rows.size(), one.rows.size());
    EXPECT_EQ(*merged.setMedianLufs, *one.setMedianLufs);
    for (std::size_t i = 0; i < one.rows.size(); ++i) {
        EXPECT_EQ(merged.rows[i].id, one.rows[i].id);
        EXPECT_EQ(merged.rows[i].score, one.rows[i].score);
        EXPECT_EQ(merged.rows[i].takeScore, one.rows[i].takeScore);
        EXPECT_EQ(merged.rows[i].suspects.size(), one.rows[i].suspects.size());
        EXPECT_EQ(merged.rows[i].measures->durationS, one.rows[i].measures->durationS);
    }
}

TEST(ScanHostileInput, NamesThatAreNotUtf8RoundTripThroughCsvAndJson) {
    ScanReport report;
    report.rows.push_back(measuredRow(0, -20.0));
    report.rows[0].id = "b\xFF";
    report.rows[0].file = "dir/b\xFF.wav";
    report.rows.push_back(measuredRow(1, -20.0));
    report.rows[1].id = "c\nd";
    report.rows[1].file = "dir/c\nd.wav";
    report.rows[1].status = "ok; timings ignored: dir/c\nd.json: \xFE";
    test::TempDir dir;
    std::ofstream(dir.file("r.csv"), std::ios::binary) << reportToCsv(report);
    std::ofstream(dir.file("r.json"), std::ios::binary) << reportToJson(report, {});
    for (const char* name : {"r.csv", "r.json"}) {
        const ScanReport back = readReport(dir.file(name));
        ASSERT_EQ(back.rows.size(), 2u) << name;
        EXPECT_EQ(back.rows[0].id, "b\xFF") << name;
        EXPECT_EQ(back.rows[0].file, "dir/b\xFF.wav") << name;
        EXPECT_EQ(back.rows[1].id, "c\nd") << name;
        EXPECT_EQ(back.rows[1].file, "dir/c\nd.wav") << name;
    }
}

TEST(ScanHostileInput, PositionsThatCannotBeIndicesAreRefused) {
    test::TempDir dir;
    ScanReport report;
    report.rows.push_back(measuredRow(0, -20.0));
    std::string csv = reportToCsv(report);
    const auto at = csv.rfind(",1,no");  // position 1, partial no
    ASSERT_NE(at, std::string::npos);
    for (const char* position : {"1e300", "-5", "2.5"}) {
        const std::string bad = csv.substr(0, at + 1) + position + csv.substr(at + 2);
        std::ofstream(dir.file("bad.csv"), std::ios::binary) << bad;
        EXPECT_THROW(readReport(dir.file("bad.csv")), InputError) << position;
    }
    std::ofstream(dir.file("bad.json"), std::ios::binary)
        << R"({"format": "earmark-scan", "takes": [{"position": 1e300, "id": "a", "file": "a", "status": "ok",
              "score_take": 0, "suspects": []}]})";
    EXPECT_THROW(readReport(dir.file("bad.json")), InputError);
}

TEST(ScanHostileInput, PerWordMeasuresWithoutTimesAreRefusedNamingTheFileAndTake) {
    test::TempDir dir;
    for (const char* words : {R"("not a list")", R"([{"word": "a", "start_s": "x", "end_s": 1}])", R"([7])"}) {
        std::ofstream(dir.file("bad.json"), std::ios::binary)
            << R"({"format": "earmark-scan", "takes": [{"position": 1, "id": "take-7", "file": "a", "status": "ok",
                  "score_take": 0, "suspects": [], "word_measures": )"
            << words << "}]}";
        try {
            readReport(dir.file("bad.json"));
            ADD_FAILURE() << words;
        } catch (const InputError& e) {
            EXPECT_NE(std::string(e.what()).find("bad.json"), std::string::npos) << e.what();
            EXPECT_NE(std::string(e.what()).find("take-7"), std::string::npos) << e.what();
        }
    }
}

}  // namespace
}  // namespace earmark
