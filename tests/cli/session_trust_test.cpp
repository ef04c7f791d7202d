// Session commands that must refuse rather than quietly lose or mislead
// (issue 11, items 2, 3, 8, 9, 10): a damaged session is not written to and
// can be salvaged; tiers are never deleted or replaced by accident; a bad
// label names its file; relocation never leaves tiers past the audio's end;
// a full disk exits 4 with a true message; a killed export's hidden folders
// are removed by the next export.
#include "run_cli.hpp"
#include "session_state.hpp"

#include "earmark/io/audio_file.hpp"
#include "engine/store/damage.hpp"
#include "engine/store/store_test_util.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <sys/wait.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using ::testing::HasSubstr;
using test::runCli;

struct OneTake {
    test::TempDir dir;
    std::string session = dir.file("s.earmark");
    std::string audio = dir.file("a.wav");
    std::string words = dir.file("words.json");
    OneTake() {
        test::writeTake(audio, 2.0);
        std::ofstream(words) << R"({"version": 1, "words": [{"text": "all", "start": 0.2, "end": 0.6},
                                   {"text": "aboard", "start": 0.6, "end": 1.8}]})";
        EXPECT_EQ(runCli({"session", "new", session}).exitCode, 0);
        const auto r = runCli({"session", "add", session, audio, "--timings", words});
        EXPECT_EQ(r.exitCode, 0) << r.err;
    }
    test::CliResult tiers(const std::string& timings, bool replace = false) {
        std::vector<std::string> args = {"session", "tiers", session, "--take", "1", timings};
        if (replace) args.push_back("--replace");
        return runCli(args);
    }
};

TEST(SessionTrust, TimingsWithoutTiersAreRefusedAndKeepTheTiers) {
    OneTake t;
    const std::string before = test::sessionState(t.session);
    const std::string empty = t.dir.file("empty.json");
    std::ofstream(empty) << R"({"version": 1})";
    for (bool replace : {false, true}) {
        const auto r = t.tiers(empty, replace);
        EXPECT_EQ(r.exitCode, 3) << r.err;
        test::expectOneLineError(r, empty + ": holds no tiers");
        EXPECT_EQ(test::sessionState(t.session), before);
    }
}

TEST(SessionTrust, ReplacingTiersMustBeAskedFor) {
    OneTake t;
    const std::string before = test::sessionState(t.session);
    const std::string other = t.dir.file("other.json");
    std::ofstream(other) << R"({"version": 1, "words": [{"text": "aboard", "start": 0.5, "end": 1.5}]})";
    auto r = t.tiers(other);
    EXPECT_EQ(r.exitCode, 2);
    test::expectOneLineError(r, "already has tiers");
    EXPECT_THAT(r.err, HasSubstr("--replace"));
    EXPECT_EQ(test::sessionState(t.session), before);
    r = t.tiers(other, true);
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_THAT(r.out, HasSubstr("stored 1 interval(s) in place of 2"));
    EXPECT_THAT(test::sessionState(t.session), HasSubstr("tier words 0.5 1.5 aboard"));
}

TEST(SessionTrust, ALabelTheSessionRefusesNamesTheTimingsFile) {
    OneTake t;
    const std::string before = test::sessionState(t.session);
    const std::string bell = t.dir.file("bell.json");
    std::ofstream(bell) << R"({"version": 1, "words": [{"text": "ding\u0007", "start": 0.5, "end": 1.5}]})";
    const auto r = t.tiers(bell, true);
    EXPECT_EQ(r.exitCode, 3) << r.err;
    test::expectOneLineError(r, bell + ": ");
    EXPECT_THAT(r.err, HasSubstr("control character"));
    EXPECT_EQ(test::sessionState(t.session), before);
}

TEST(SessionTrust, RelocatingNeedsAnExistingFolderAndAFileLongEnoughForTheTiers) {
    OneTake t;
    const std::string before = test::sessionState(t.session);
    const std::string missing = t.dir.file("no-such-folder");
    auto r = runCli({"session", "relocate", t.session, "--folder", missing});
    EXPECT_EQ(r.exitCode, 3);
    test::expectOneLineError(r, missing + ": is not a folder");
    // The words end at 1.8 s; a 1.0 s file cannot take them (refused, not clipped).
    const std::string shorter = t.dir.file("short.wav");
    test::writeTake(shorter, 1.0);
    r = runCli({"session", "relocate", t.session, "--take", "1", shorter});
    EXPECT_EQ(r.exitCode, 3);
    test::expectOneLineError(r, shorter + ": lasts 1");
    EXPECT_THAT(r.err, HasSubstr("shorter than the tiers of take 1"));
    EXPECT_EQ(test::sessionState(t.session), before);
    // Found by name in a folder: the same rule, and nothing relocated.
    fs::create_directories(t.dir.path() / "moved");
    test::writeTake(t.dir.file("moved/a.wav"), 1.0);
    fs::remove(t.audio);
    r = runCli({"session", "relocate", t.session, "--folder", t.dir.file("moved")});
    EXPECT_EQ(r.exitCode, 3);
    EXPECT_EQ(test::sessionState(t.session), before);
}

TEST(SessionTrust, ADamagedSessionIsNotWrittenToAndCanBeSalvaged) {
    OneTake t;
    {
        Session s = Session::open(t.session);
        s.inOneTransaction("filling", [&] {
            for (int i = 0; i < 200; ++i) {
                MarkDraft d = test::draftAt(0.005 * i, 0.005 * i + 0.3);
                d.note = std::string(150, 'n');
                s.addMark(1, d);
            }
        });
    }
    test::damageFirstLeafOf(t.session, "marks");
    const std::string bytes = test::slurp(t.session);
    auto r = runCli({"mark", "add", t.session, "--take", "1", "--start", "0.1", "--end", "0.5", "--category", "other"});
    EXPECT_EQ(r.exitCode, 3) << r.out;
    test::expectOneLineError(r, t.session + ": is damaged");
    EXPECT_THAT(r.err, HasSubstr("earmark-cli session salvage"));
    EXPECT_EQ(test::slurp(t.session), bytes);

    const std::string fresh = t.dir.file("salvaged.earmark");
    r = runCli({"session", "salvage", t.session, fresh});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_THAT(r.out, HasSubstr("1 take(s), 2 tier interval(s)"));
    EXPECT_THAT(r.err, HasSubstr("mark id(s) unreadable"));
    r = runCli({"mark", "add", fresh, "--take", "1", "--start", "0.1", "--end", "0.5", "--category", "other"});
    EXPECT_EQ(r.exitCode, 0) << r.err;
    r = runCli({"session", "salvage", t.session, fresh});
    EXPECT_EQ(r.exitCode, 3);
    test::expectOneLineError(r, fresh + ": already exists");
}

TEST(SessionTrust, AFullDiskExitsFourAndSaysNothingChanged) {
    OneTake t;
    // A file size limit of 512 bytes: SQLite cannot even size its shared
    // memory file (-shm), the first thing it writes.
    const std::string before = test::sessionState(t.session);
    const auto r = test::runCliAfter("trap '' XFSZ; ulimit -f 1; ", {"mark", "add", t.session, "--take", "1",
                                                                     "--start", "0.1", "--end", "0.5", "--category",
                                                                     "other"});
    EXPECT_EQ(r.exitCode, 4) << r.out << r.err;
    test::expectOneLineError(r, t.session + ": ");
    EXPECT_THAT(r.err, HasSubstr("nothing was changed"));
    EXPECT_EQ(test::sessionState(t.session), before);
}

pid_t deadProcessId() {
    const pid_t pid = fork();
    if (pid == 0) _exit(0);
    waitpid(pid, nullptr, 0);
    return pid;
}

TEST(SessionTrust, AnExportRemovesTheHiddenFoldersOfKilledExports) {
    OneTake t;
    ASSERT_EQ(runCli({"mark", "add", t.session, "--take", "1", "--start", "0.2", "--end", "0.6", "--category",
                      "other"}).exitCode, 0);
    const std::string dead = std::to_string(deadProcessId()), alive = std::to_string(getpid());
    const fs::path parent = t.dir.path() / "out";
    auto leftover = [&](const std::string& name, const std::string& file) {
        fs::create_directories(parent / name / "clips");
        std::ofstream(parent / name / file) << "x";
        return parent / name;
    };
    const fs::path killedHere = leftover(".bundle.partial-" + dead, "clips/mark-0001.wav");
    const fs::path killedElsewhere = leftover(".other.partial-" + dead, "manifest.json");
    const fs::path killedReplacing = leftover(".bundle.old-" + dead, "manifest.csv");
    const fs::path running = leftover(".bundle2.partial-" + alive, "clips/mark-0001.wav");
    const fs::path notOurs = leftover(".notes.partial-" + dead, "diary.txt");  // not a bundle's layout
    const auto r = runCli({"export", t.session, "--bundle", (parent / "bundle").string()});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_FALSE(fs::exists(killedHere));
    EXPECT_FALSE(fs::exists(killedElsewhere));
    EXPECT_FALSE(fs::exists(killedReplacing));
    EXPECT_TRUE(fs::exists(running));
    EXPECT_TRUE(fs::exists(notOurs));
    EXPECT_TRUE(fs::exists(parent / "bundle/manifest.json"));
}

}  // namespace
}  // namespace earmark
