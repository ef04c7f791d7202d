// Every artefact event of a take is its own suspect: a take with three planted
// clicks reports three click suspects, at the planted times, in the scan's
// rows, in the JSON report read back (the CSV: three named with their reasons) and in the session the scan writes.
#include "earmark/io/audio_file.hpp"
#include "earmark/scan/scan_report.hpp"
#include "earmark/scan/scan_session.hpp"
#include "earmark/store/session.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <fstream>

namespace earmark {
namespace {

constexpr double kRate = 22050.0;
constexpr double kClickTimes[] = {0.55, 1.05, 1.45};

std::vector<double> clickCentres(const std::vector<TakeSuspect>& suspects) {
    std::vector<double> t;
    for (const auto& s : suspects)
        if (s.kind == SuspectKind::Click) t.push_back(0.5 * (s.startS + s.endS));
    return t;
}

void expectThePlantedClicks(const std::vector<TakeSuspect>& suspects, const std::string& where) {
    const auto t = clickCentres(suspects);
    ASSERT_EQ(t.size(), 3u) << where;
    for (std::size_t k = 0; k < 3; ++k) EXPECT_NEAR(t[k], kClickTimes[k], 0.02) << where << " click " << k;
}

TEST(ArtefactEvents, ThreeClicksAreThreeSuspectsInEveryOutput) {
    test::TempDir dir;
    // 2 s of speech-like sound at −12 dB with single-sample clicks of +0.2 (−14 dBFS)
    // planted at three times (a float WAV keeps them exact).
    Signal s = test::speechLike(2.0, kRate, 7);
    for (auto& v : s.samples) v *= 0.25f;
    for (double t : kClickTimes) s.samples[static_cast<std::size_t>(t * kRate)] += 0.2f;
    const std::string wav = (dir.path() / "clicked.wav").string();
    writeWav(wav, s, WavEncoding::Float32);
    ScanItem item;
    item.id = "clicked";
    item.audioPath = wav;
    const std::vector<ScanItem> items{item};

    ScanSettings settings;
    settings.jobs = 1;
    const ScanReport report = makeReport(runScan(items, settings), settings.rules);
    ASSERT_EQ(report.rows.size(), 1u);
    const ScanRow& row = report.rows.front();
    expectThePlantedClicks(row.suspects, "scan");
    // Each reason says which of the three it is.
    for (const auto& x : row.suspects) {
        if (x.kind == SuspectKind::Click) {
            EXPECT_NE(x.reason.find(" of 3 in the take"), std::string::npos) << x.reason;
        }
    }
    // Each click adds its own score.
    double clickScore = 0;
    for (const auto& x : row.suspects)
        if (x.kind == SuspectKind::Click) clickScore += suspectScore(x, settings.rules);
    EXPECT_GE(clickScore, 3 * settings.rules.click.weight);

    std::ofstream(dir.path() / "r.csv", std::ios::binary) << reportToCsv(report);
    std::ofstream(dir.path() / "r.json", std::ios::binary) << reportToJson(report, settings.rules);
    // The JSON keeps every span; the CSV names each suspect with its reason.
    expectThePlantedClicks(readReport((dir.path() / "r.json").string()).rows.front().suspects, "json");
    const auto fromCsv = readReport((dir.path() / "r.csv").string()).rows.front().suspects;
    EXPECT_EQ(std::count_if(fromCsv.begin(), fromCsv.end(),
                            [](const TakeSuspect& x) {
                                return x.kind == SuspectKind::Click && x.reason.find(" of 3 in the take") != std::string::npos;
                            }),
              3);

    const std::string sessionPath = (dir.path() / "s.earmark").string();
    writeScanSession(sessionPath, report, items);
    Session session = Session::open(sessionPath);
    const auto takes = session.takes();
    ASSERT_EQ(takes.size(), 1u);
    std::vector<TakeSuspect> stored;
    for (const auto& x : session.suspects(takes[0].id))
        if (x.name == "click") {
            TakeSuspect click;
            click.kind = SuspectKind::Click;
            click.startS = x.startSeconds;
            click.endS = x.endSeconds;
            stored.push_back(click);
        }
    expectThePlantedClicks(stored, "session");
}

}  // namespace
}  // namespace earmark
