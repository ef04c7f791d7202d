// The scan runner and its output: input order kept across threads, bad files
// reported in their row, Ctrl-C-style stops leaving valid partial output,
// CSV/JSON written and read back, shards merged into the same ranking as one
// run (with the set-median loudness rule re-applied), and the session queue.
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/scan/scan_report.hpp"
#include "earmark/scan/scan_session.hpp"
#include "earmark/store/session.hpp"
#include "scan_rows.hpp"
#include "support/pg_test_server.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <fstream>
#include <thread>

namespace earmark {
namespace {

// 9 takes of 2 s speech-like audio at 16 kHz; "t4" is 12 dB louder; "broken" is not audio.
struct SmallSet {
    test::TempDir dir;
    std::vector<ScanItem> items;
    SmallSet() {
        std::ofstream manifest(dir.path() / "set.csv", std::ios::binary);
        manifest << "id,audio,text\r\n";
        for (int i = 0; i < 9; ++i) {
            const std::string id = i == 6 ? "broken" : "t" + std::to_string(i);
            if (i == 6) {
                std::ofstream(dir.path() / (id + ".wav")) << "not a wave file";
            } else {
                Signal s = test::speechLike(2.0, 16000.0, 100 + static_cast<std::uint32_t>(i));
                // All at a quarter of the generator's level, "t4" at full level (+12.04 dB, no clipping).
                if (i != 4)
                    for (auto& v : s.samples) v *= 0.25f;
                writeWav((dir.path() / (id + ".wav")).string(), s);
            }
            manifest << id << "," << id << ".wav,\"A line, of text.\"\r\n";
        }
        manifest.close();
        items = listScanInput((dir.path() / "set.csv").string());
    }
};

// The takes are synthetic, not speech: what the word rules hear in them
// (extra speech, an early end of "A line, of text.") changes with every
// detail of the generator and would decide the ranking; the ranking tests
// are about the take rules and loudness against the set, so the word rules are off.
ScanSettings withoutWordRules() {
    ScanSettings settings;
    for (RuleSwitch* r : std::initializer_list<RuleSwitch*>{&settings.rules.pronunciation, &settings.rules.skippedWord,
                                                            &settings.rules.repeatedWord, &settings.rules.extraSpeech,
                                                            &settings.rules.substitutedWord, &settings.rules.earlyEnd})
        r->enabled = false;
    return settings;
}

using test::rowOf;

TEST(ScanRun, KeepsInputOrderAndReportsBadFilesInTheirRow) {
    SmallSet set;
    ScanSettings settings = withoutWordRules();
    settings.jobs = 3;
    const ScanRun run = runScan(set.items, settings);
    ASSERT_EQ(run.rows.size(), 9u);
    EXPECT_FALSE(run.partial);
    for (std::size_t i = 0; i < run.rows.size(); ++i) EXPECT_EQ(run.rows[i].index, i);
    const ScanRow& broken = run.rows[6];
    EXPECT_TRUE(broken.failed);
    EXPECT_EQ(broken.status.rfind("error: ", 0), 0u) << broken.status;
    EXPECT_NE(broken.status.find("broken.wav"), std::string::npos) << broken.status;
    ASSERT_TRUE(run.rows[0].measures.has_value());
    EXPECT_NEAR(run.rows[0].measures->durationS, 2.0, 1e-3);
    // The generator's segment joins are continuous: the click rule (on by default) finds nothing.
    for (const auto& row : run.rows)
        for (const auto& s : row.suspects) EXPECT_NE(s.kind, SuspectKind::Click) << row.id << ": " << s.reason;

    // Same rows with one thread.
    settings.jobs = 1;
    const ScanRun single = runScan(set.items, settings);
    for (std::size_t i = 0; i < 9; ++i) EXPECT_EQ(single.rows[i].takeScore, run.rows[i].takeScore);

    const ScanReport report = makeReport(run, settings.rules);
    EXPECT_EQ(report.rows.back().id, "broken");  // failed rows last
    EXPECT_EQ(report.rows.front().id, "t4");     // the loud one first
    const ScanRow& loud = rowOf(report, "t4");
    ASSERT_FALSE(loud.suspects.empty());
    EXPECT_EQ(loud.suspects.back().kind, SuspectKind::Loud);
    EXPECT_NEAR(loud.suspects.back().value, 12.0, 1.0);  // the median take differs by its content
    ASSERT_TRUE(report.setMedianLufs.has_value());
    for (std::size_t i = 1; i + 1 < report.rows.size(); ++i) EXPECT_GE(report.rows[i - 1].score, report.rows[i].score);
}

TEST(ScanRun, StopLeavesValidPartialOutput) {
    SmallSet set;
    ScanSettings settings;
    settings.jobs = 1;
    // Ask to stop once two takes are done: the take in hand is dropped, rows done so far are kept.
    const ScanRun run = runScan(set.items, settings, [&](const ScanProgress& p) {
        EXPECT_EQ(p.total, 9u);
        return p.done < 2;
    }, 0.001);
    EXPECT_TRUE(run.partial);
    EXPECT_GE(run.rows.size(), 2u);
    EXPECT_LT(run.rows.size(), 9u);
    const ScanReport report = makeReport(run, settings.rules);
    const std::string csv = reportToCsv(report);
    test::TempDir dir;
    std::ofstream(dir.path() / "p.csv", std::ios::binary) << csv;
    const ScanReport back = readReport((dir.path() / "p.csv").string());
    EXPECT_TRUE(back.partial);
    EXPECT_EQ(back.rows.size(), run.rows.size());
}

TEST(ScanReport, CsvAndJsonReadBack) {
    SmallSet set;
    ScanSettings settings;
    const ScanReport report = makeReport(runScan(set.items, settings), settings.rules);
    std::ofstream(set.dir.path() / "out.csv", std::ios::binary) << reportToCsv(report);
    std::ofstream(set.dir.path() / "out.json", std::ios::binary) << reportToJson(report, settings.rules);
    for (const char* name : {"out.csv", "out.json"}) {
        const ScanReport back = readReport((set.dir.path() / name).string());
        ASSERT_EQ(back.rows.size(), report.rows.size()) << name;
        for (std::size_t i = 0; i < back.rows.size(); ++i) {
            const auto& a = report.rows[i];
            const auto& b = back.rows[i];
            EXPECT_EQ(a.id, b.id);
            EXPECT_EQ(a.index, b.index);
            EXPECT_EQ(a.status, b.status);
            EXPECT_NEAR(a.takeScore, b.takeScore, 1e-3);
            ASSERT_EQ(a.suspects.size(), b.suspects.size()) << name << " " << a.id;
            for (std::size_t k = 0; k < a.suspects.size(); ++k) {
                EXPECT_EQ(a.suspects[k].kind, b.suspects[k].kind);
                EXPECT_EQ(a.suspects[k].reason, b.suspects[k].reason);
            }
            if (a.measures) {
                EXPECT_NEAR(*a.measures->level.loudnessLufs, *b.measures->level.loudnessLufs, 0.01);
            }
        }
    }
    // The CSV header starts with the identifying columns.
    const std::string csv = reportToCsv(report);
    EXPECT_EQ(csv.rfind("rank,id,file,status,duration_s,", 0), 0u);
    EXPECT_NE(csv.find("\r\n"), std::string::npos);
}

TEST(ScanReport, MergedShardsEqualOneRun) {
    SmallSet set;
    ScanSettings settings;
    const ScanReport whole = makeReport(runScan(set.items, settings), settings.rules);
    std::vector<ScanReport> parts;
    for (int k = 1; k <= 3; ++k) {
        const auto shard = selectShard(set.items, Shard{k, 3});
        const ScanReport part = makeReport(runScan(shard, settings), settings.rules);
        // Through the CSV, as the command line does.
        const auto path = set.dir.path() / ("part" + std::to_string(k) + ".csv");
        std::ofstream(path, std::ios::binary) << reportToCsv(part);
        parts.push_back(readReport(path.string()));
    }
    const ScanReport merged = mergeReports(parts, settings.rules);
    ASSERT_EQ(merged.rows.size(), whole.rows.size());
    EXPECT_NEAR(*merged.setMedianLufs, *whole.setMedianLufs, 0.01);
    for (std::size_t i = 0; i < whole.rows.size(); ++i) {
        EXPECT_EQ(merged.rows[i].id, whole.rows[i].id) << "rank " << i + 1;
        EXPECT_NEAR(merged.rows[i].score, whole.rows[i].score, 0.01);
        EXPECT_EQ(merged.rows[i].suspects.size(), whole.rows[i].suspects.size());
    }
    EXPECT_THROW(mergeReports({parts[0], parts[0]}, settings.rules), InputError);
}

TEST(ScanSession, WritesTheRankedQueueAndSuspects) {
    SmallSet set;
    ScanSettings settings = withoutWordRules();
    const ScanReport report = makeReport(runScan(set.items, settings), settings.rules);
    const std::string path = (set.dir.path() / "review.earmark").string();
    const auto summary = writeScanSession(path, report, set.items);
    EXPECT_EQ(summary.added, 8);
    EXPECT_EQ(summary.skipped, 1);
    Session session = Session::open(path);
    const auto takes = session.takes();
    ASSERT_EQ(takes.size(), 8u);
    for (std::size_t i = 0; i < takes.size(); ++i) EXPECT_EQ(takes[i].lineId, report.rows[i].id);
    EXPECT_EQ(takes[0].text, "A line, of text.");
    const auto stored = session.suspects(takes[0].id);
    ASSERT_EQ(stored.size(), report.rows[0].suspects.size());
    EXPECT_TRUE(std::any_of(stored.begin(), stored.end(), [](const Suspect& x) { return x.name == "loud"; }));
    // A second write updates in place.
    const auto again = writeScanSession(path, report, set.items);
    EXPECT_EQ(again.added, 0);
    EXPECT_EQ(again.updated, 8);
    EXPECT_EQ(Session::open(path).takes().size(), 8u);
}

// A team session on a server: the scan writes into one that exists (made by
// `session new` or an earlier scan), and two shards that write at once into
// an empty database both land — the one that comes second writes into the
// session the first made.
TEST(ScanSession, WritesIntoAServerSessionAlsoFromTwoShardsAtOnce) {
    std::string why;
    test::PgTestServer* server = test::PgTestServer::shared(&why);
    if (!server) GTEST_SKIP() << why;
    SmallSet set;
    ScanSettings settings = withoutWordRules();
    const ScanReport report = makeReport(runScan(set.items, settings), settings.rules);

    const std::string existing = server->newDatabase();
    Session::create(existing);
    EXPECT_EQ(writeScanSession(existing, report, set.items).added, 8);
    EXPECT_EQ(writeScanSession(existing, report, set.items).updated, 8);
    EXPECT_EQ(Session::open(existing).takes().size(), 8u);

    const std::string empty = server->newDatabase();
    std::vector<ScanReport> parts;
    for (int k = 1; k <= 2; ++k)
        parts.push_back(makeReport(runScan(selectShard(set.items, Shard{k, 2}), settings), settings.rules));
    std::vector<std::string> problems(2);
    std::vector<std::thread> shards;
    for (std::size_t k = 0; k < 2; ++k)
        shards.emplace_back([&, k] {
            try {
                writeScanSession(empty, parts[k], set.items);
            } catch (const std::exception& e) {
                problems[k] = e.what();
            }
        });
    for (auto& t : shards) t.join();
    EXPECT_EQ(problems[0], "");
    EXPECT_EQ(problems[1], "");
    EXPECT_EQ(Session::open(empty).takes().size(), 8u);
}

}  // namespace
}  // namespace earmark
