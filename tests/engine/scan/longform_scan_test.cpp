// The scan adds long-form findings to long takes (rules.longform.scan_min_take_s)
// and keeps them through its JSON; short takes get none.
#include "earmark/io/audio_file.hpp"
#include "earmark/scan/scan_report.hpp"
#include "support/long_read.hpp"
#include "support/temp_dir.hpp"

#include <gtest/gtest.h>

#include <fstream>

namespace earmark {
namespace {

TEST(ScanLongform, LongTakesGetFindingsThatSurviveTheJson) {
    test::TempDir dir;
    test::LongReadPlan plan;
    plan.sentences = 12;  // ≈ 1 minute
    const test::LongRead clean = test::makeLongRead(plan);
    plan.clicksS = {clean.joins[6]};
    writeWav(dir.file("long.wav"), test::makeLongRead(plan).audio, WavEncoding::Float32);
    test::LongReadPlan shortPlan;
    shortPlan.sentences = 2;
    shortPlan.clicksS = {test::makeLongRead(shortPlan).joins[0]};
    writeWav(dir.file("short.wav"), test::makeLongRead(shortPlan).audio, WavEncoding::Float32);
    std::ofstream(dir.path() / "set.csv") << "id,audio\nlong,long.wav\nshort,short.wav\n";

    ScanSettings settings;
    settings.jobs = 1;
    settings.rules.longform.scanMinTakeSeconds = 40.0;
    const ScanReport report = makeReport(runScan(listScanInput(dir.file("set.csv")), settings), settings.rules);
    ASSERT_EQ(report.rows.size(), 2u);
    for (const ScanRow& row : report.rows) {
        SCOPED_TRACE(row.id);
        EXPECT_EQ(row.status, "ok");
        if (row.id == "short") {
            EXPECT_TRUE(row.findings.empty());
            continue;
        }
        ASSERT_EQ(row.findings.size(), 1u);
        EXPECT_EQ(row.findings[0].kind, FindingKind::Seam);
        EXPECT_NEAR(row.findings[0].startS, clean.joins[6], 0.01);
    }
    const std::string json = dir.file("ranked.json");
    std::ofstream(json) << reportToJson(report, settings.rules);
    const ScanReport back = readReport(json);
    for (const ScanRow& row : back.rows)
        if (row.id == "long") {
            ASSERT_EQ(row.findings.size(), 1u);
            EXPECT_EQ(row.findings[0].measure, "click_db");
            EXPECT_NEAR(row.findings[0].startS, clean.joins[6], 0.01);
        }
}

}  // namespace
}  // namespace earmark
