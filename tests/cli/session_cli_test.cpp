// earmark-cli session / mark / export: marks made on the command line come
// out in the CSV, JSON and bundle exports with the right spans, words and
// measures; bad input gets one clear line and the right exit code.
#include "run_cli.hpp"

#include "earmark/io/audio_file.hpp"
#include "engine/export/json_schema_subset.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>
#include <sqlite3.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using ::testing::HasSubstr;
using ::testing::IsEmpty;
using ::testing::Not;
using test::runCli;
using test::slurp;
using K = test::VoiceSegment::Kind;

void expectOneLine(const test::CliResult& r) {
    EXPECT_EQ(std::count(r.err.begin(), r.err.end(), '\n'), 1) << r.err;
    EXPECT_THAT(r.err, Not(HasSubstr("terminate called")));
}

// A folder with spaces and non-ASCII letters holding two takes, a line list
// and word timings for the first take.
struct UnicodePathScenario {
    test::TempDir dir;
    fs::path root = dir.path() / "Sitzung für Ü-Tests";
    std::string session = (root / "Prüfung 1.earmark").string();
    UnicodePathScenario() {
        fs::create_directories(root / "Aufnahmen ä");
        // Take 1: 0.3 s silence, 1.4 s voiced at a steady 150 Hz, 0.3 s silence.
        const auto v = test::synthesiseVoice(
            {{K::Silence, 0.3, 0, 0, 0}, {K::Voiced, 1.4, 150, 150, 0.3}, {K::Silence, 0.3, 0, 0, 0}}, 22050);
        writeWav((root / "Aufnahmen ä/Ansage eins.wav").string(), v.signal);
        writeWav((root / "Aufnahmen ä/zwei.wav").string(), test::sine(200, 1.5, 16000, 0.2));
        std::ofstream(root / "Zeilen.csv") << "id,audio,text,fault\n"
                                              "eins,Aufnahmen ä/Ansage eins.wav,\"Bitte, alle einsteigen.\",\n"
                                              "zwei,Aufnahmen ä/zwei.wav,Gute Fahrt.,flat\n";
        std::ofstream(root / "eins.json") << R"({"words": [
            {"text": "Bitte,", "start": 0.30, "end": 0.70},
            {"text": "alle", "start": 0.70, "end": 1.05},
            {"text": "einsteigen.", "start": 1.05, "end": 1.70}]})";
    }
    void setUp() {
        ASSERT_EQ(runCli({"session", "new", session}).exitCode, 0);
        const auto add = runCli({"session", "add", session, "--text-file", (root / "Zeilen.csv").string(),
                                 "--build", "Stimme 7"});
        ASSERT_EQ(add.exitCode, 0) << add.err;
        const auto tiers = runCli({"session", "tiers", session, "--take", "eins", (root / "eins.json").string()});
        ASSERT_EQ(tiers.exitCode, 0) << tiers.err;
    }
    std::string addMark(std::vector<std::string> extra) {
        std::vector<std::string> args = {"mark", "add", session};
        args.insert(args.end(), extra.begin(), extra.end());
        const auto r = runCli(args);
        EXPECT_EQ(r.exitCode, 0) << r.err;
        return r.out;
    }
};

TEST(SessionCli, MarksRoundTripThroughCsvJsonAndBundle) {
    UnicodePathScenario s;
    s.setUp();
    const std::string id1 = s.addMark({"--take", "eins", "--start", "0.75", "--end", "1.6", "--category",
                                       "intonation", "--subtype", "flat", "--severity", "major", "--note",
                                       "klingt flach, \"monoton\"", "--rater", "Jörg"});
    EXPECT_EQ(id1, "1\n");
    s.addMark({"--take", "zwei.wav", "--start", "0.2", "--end", "0.5", "--category", "artifact", "--subtype",
               "click"});

    const auto list = runCli({"session", "list", s.session});
    ASSERT_EQ(list.exitCode, 0) << list.err;
    EXPECT_THAT(list.out, HasSubstr("eins             has-marks       1  ok       Aufnahmen ä/Ansage eins.wav"));
    const auto marks = runCli({"mark", "list", s.session, "--take", "eins"});
    EXPECT_THAT(marks.out, HasSubstr("0.750-1.600 s"));
    EXPECT_THAT(marks.out, HasSubstr("alle einsteigen."));

    // JSON: conforms to the schema, spans and words as made, measures of the voice.
    const fs::path json = s.root / "Liste.json";
    const auto exported = runCli({"export", s.session, "--json", json.string()});
    ASSERT_EQ(exported.exitCode, 0) << exported.err;
    const auto doc = nlohmann::json::parse(slurp(json));
    const test::SchemaSubset schema(
        nlohmann::json::parse(slurp(fs::path(EARMARK_SOURCE_DIR) / "docs/defect-list.schema.json")));
    EXPECT_THAT(schema.validate(doc), IsEmpty());
    ASSERT_EQ(doc["marks"].size(), 2u);
    const auto& m = doc["marks"][0];
    EXPECT_EQ(m["start_s"], 0.75);
    EXPECT_EQ(m["end_s"], 1.6);
    EXPECT_EQ(m["words"], "alle einsteigen.");  // word middles 0.875 and 1.375 lie in the span
    EXPECT_EQ(m["audio"], "Aufnahmen ä/Ansage eins.wav");
    EXPECT_EQ(m["build"], "Stimme 7");
    EXPECT_EQ(m["text"], "Bitte, alle einsteigen.");
    EXPECT_EQ(m["note"], "klingt flach, \"monoton\"");
    EXPECT_EQ(m["rater"], "Jörg");
    EXPECT_DOUBLE_EQ(m["measures"]["duration_s"].get<double>(), 1.6 - 0.75);
    EXPECT_NEAR(m["measures"]["f0_mean_hz"].get<double>(), 150.0, 1.5);  // the synthetic truth
    EXPECT_LT(m["measures"]["f0_range_st"].get<double>(), 0.3);           // a steady F0 spans no range
    EXPECT_TRUE(m["measures"]["energy_mean_db"].is_number());

    // CSV: the same marks, same numbers.
    const auto csv = runCli({"export", s.session, "--csv", "-"});
    ASSERT_EQ(csv.exitCode, 0) << csv.err;
    EXPECT_THAT(csv.out, HasSubstr(",0.75,1.6,0.8500000000000001,alle einsteigen.,intonation,flat,major,"
                                   "\"klingt flach, \"\"monoton\"\"\",Jörg,"));
    EXPECT_EQ(csv.out.substr(csv.out.size() - 2), "\r\n");
    EXPECT_EQ(csv.out.find("\r\n\n"), std::string::npos);

    // Bundle: one clip per mark, span ± 300 ms clamped, at the take's rate.
    const fs::path bundle = s.root / "Beispiele";
    const auto b = runCli({"export", s.session, "--bundle", bundle.string(), "--progress"});
    ASSERT_EQ(b.exitCode, 0) << b.err;
    EXPECT_THAT(b.err, HasSubstr("100 %"));
    const auto manifest = nlohmann::json::parse(slurp(bundle / "manifest.json"));
    EXPECT_THAT(schema.validate(manifest), IsEmpty());
    const LoadedAudio clip1 = loadAudio((bundle / manifest["marks"][0]["clip"]["file"].get<std::string>()).string());
    EXPECT_EQ(clip1.info.sampleRate, 22050);
    EXPECT_EQ(clip1.signal.size(), static_cast<std::size_t>(std::lround(1.9 * 22050) - std::lround(0.45 * 22050)));
    const LoadedAudio clip2 = loadAudio((bundle / manifest["marks"][1]["clip"]["file"].get<std::string>()).string());
    EXPECT_EQ(clip2.info.sampleRate, 16000);
    EXPECT_EQ(clip2.signal.size(), 12800u);  // [0, 0.8] s at 16 kHz: clamped at the start

    // Re-running into the bundle is refused without --force, allowed with it.
    const auto again = runCli({"export", s.session, "--bundle", bundle.string()});
    EXPECT_EQ(again.exitCode, 3);
    EXPECT_THAT(again.err, HasSubstr("already exists and is not empty"));
    expectOneLine(again);
    EXPECT_EQ(runCli({"export", s.session, "--bundle", bundle.string(), "--force", "--pad-ms", "0"}).exitCode, 0);
    const auto padless = nlohmann::json::parse(slurp(bundle / "manifest.json"));
    EXPECT_EQ(padless["marks"][0]["clip"]["frames"], std::lround(1.6 * 22050) - std::lround(0.75 * 22050));

    // Delete by id; the take goes back to in-review.
    const auto del = runCli({"mark", "delete", s.session, "--id", "1"});
    ASSERT_EQ(del.exitCode, 0) << del.err;
    EXPECT_THAT(runCli({"session", "list", s.session}).out, HasSubstr("in-review       0"));
}

TEST(SessionCli, BadMarksAreRefusedWithOneClearLine) {
    UnicodePathScenario s;
    s.setUp();
    auto attempt = [&](std::vector<std::string> extra) {
        std::vector<std::string> args = {"mark", "add", s.session, "--take", "eins"};
        args.insert(args.end(), extra.begin(), extra.end());
        return runCli(args);
    };
    auto r = attempt({"--start", "1", "--end", "1.5", "--category", "tone"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_THAT(r.err, HasSubstr("unknown category 'tone' (known: emphasis, intonation, timing"));
    expectOneLine(r);
    r = attempt({"--start", "1.2", "--end", "0.4", "--category", "timing"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_THAT(r.err, HasSubstr("end 0.400 s is before the start 1.200 s"));
    expectOneLine(r);
    r = attempt({"--start", "1.5", "--end", "2.5", "--category", "timing"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_THAT(r.err, HasSubstr("runs past the end of the take (2.000 s)"));
    r = attempt({"--start", "0.1", "--end", "0.5", "--category", "timing", "--note", "caf\xE9"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_THAT(r.err, HasSubstr("Mark.note: is not valid UTF-8"));
    expectOneLine(r);
    r = attempt({"--start", "0.1", "--end", "0.5", "--category", "timing", "--subtype", "flat"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_THAT(r.err, HasSubstr("'flat' is not a subtype of timing"));
    r = runCli({"mark", "add", s.session, "--take", "drei", "--start", "0", "--end", "1", "--category", "other"});
    EXPECT_EQ(r.exitCode, 3);
    EXPECT_THAT(r.err, HasSubstr("has no take 'drei'"));
    EXPECT_THAT(runCli({"mark", "list", s.session}).err, HasSubstr("0 mark(s)"));
}

TEST(SessionCli, BadSessionFilesAreNamedAndLeftAlone) {
    UnicodePathScenario s;
    const fs::path garbage = s.root / "kaputt.earmark";
    std::ofstream(garbage) << "not a database";
    auto r = runCli({"session", "list", garbage.string()});
    EXPECT_EQ(r.exitCode, 3);
    EXPECT_EQ(r.err, "earmark-cli session: " + garbage.string() +
                         ": is not an Earmark session (not an SQLite database)\n");
    EXPECT_EQ(slurp(garbage), "not a database");

    s.setUp();
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(s.session.c_str(), &db), SQLITE_OK);
    sqlite3_exec(db, "PRAGMA user_version = 9", nullptr, nullptr, nullptr);
    sqlite3_close(db);
    r = runCli({"mark", "add", s.session, "--take", "1", "--start", "0", "--end", "1", "--category", "other"});
    EXPECT_EQ(r.exitCode, 3);
    EXPECT_THAT(r.err, HasSubstr(s.session + ": was written by a newer Earmark (session schema 9"));
    expectOneLine(r);
    r = runCli({"session", "new", s.session});
    EXPECT_EQ(r.exitCode, 3);
    EXPECT_THAT(r.err, HasSubstr("already exists"));
}

TEST(SessionCli, MissingAudioShowsAndCanBeRelocated) {
    UnicodePathScenario s;
    s.setUp();
    fs::create_directories(s.root / "verschoben");
    fs::rename(s.root / "Aufnahmen ä/zwei.wav", s.root / "verschoben/zwei.wav");
    EXPECT_THAT(runCli({"session", "list", s.session}).out, HasSubstr("MISSING  Aufnahmen ä/zwei.wav"));
    // A mark on a missing take is kept, with only its duration measured.
    const auto r = runCli({"mark", "add", s.session, "--take", "zwei", "--start", "0.1", "--end", "0.4",
                           "--category", "other"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_THAT(r.err, HasSubstr("is missing; the mark keeps only its duration"));
    // A bundle needs the audio: refused, naming the file.
    const auto b = runCli({"export", s.session, "--bundle", (s.root / "b").string()});
    EXPECT_EQ(b.exitCode, 3);
    EXPECT_THAT(b.err, HasSubstr("zwei.wav: audio of take 2 is missing"));
    const auto moved = runCli({"session", "relocate", s.session, "--folder", (s.root / "verschoben").string()});
    ASSERT_EQ(moved.exitCode, 0) << moved.err;
    EXPECT_THAT(moved.out, HasSubstr("relocated 1 take(s)"));
    EXPECT_THAT(runCli({"session", "list", s.session}).out, HasSubstr("ok       verschoben/zwei.wav"));
    EXPECT_EQ(runCli({"export", s.session, "--bundle", (s.root / "b").string()}).exitCode, 0);
}

}  // namespace
}  // namespace earmark
