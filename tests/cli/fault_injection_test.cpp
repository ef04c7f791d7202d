// kill -9 at every step of a command's writing (issue 11): `scan --session`
// (into an existing and into a new session), `mark add`, `session tiers` and
// `export --bundle` are each stopped at many points, chosen at random among
// the calls that change files (counted by the kill switch, see
// tests/support/kill_switch.cpp). After each kill the session passes SQLite's
// integrity check and holds exactly the state before the command or after it,
// and the bundle folder is the old bundle or the whole new one. The next
// export removes the killed exports' hidden folders.
//
// Kills per command: EARMARK_FAULT_KILLS, else 50 (12 in the slower
// sanitizer build); never fewer than 2: the first and the last step.
#include "run_cli.hpp"
#include "session_state.hpp"

#include "earmark/io/audio_file.hpp"
#include "engine/store/store_test_util.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <functional>
#include <map>
#include <random>
#include <sstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;

int killsPerCommand() {
    if (const char* v = std::getenv("EARMARK_FAULT_KILLS")) return std::max(2, std::atoi(v));
#ifdef NDEBUG
    return 50;
#else
    return 12;
#endif
}

// Environment that loads the kill switch (a sanitized earmark-cli must be
// told that a preloaded library comes before its runtime).
std::string withKillSwitch(const std::string& settings) {
    return "ASAN_OPTIONS=\"${ASAN_OPTIONS:+$ASAN_OPTIONS:}verify_asan_link_order=0\" LD_PRELOAD='" +
           std::string(EARMARK_KILL_SWITCH_PATH) + "' " + settings + " ";
}

void removeSession(const std::string& file) {
    for (const char* suffix : {"", "-wal", "-shm"}) fs::remove(file + suffix);
}

void restoreSession(const std::string& pristine, const std::string& file) {
    removeSession(file);
    fs::copy_file(pristine, file);
}

// A bundle folder as text: every file with its size, and the CSV manifest.
std::string bundleState(const fs::path& dir) {
    if (!fs::exists(dir)) return "absent";
    std::map<std::string, std::uintmax_t> files;
    for (const auto& e : fs::recursive_directory_iterator(dir))
        if (e.is_regular_file()) files[fs::relative(e.path(), dir).generic_string()] = e.file_size();
    std::ostringstream out;
    for (const auto& [name, size] : files) out << name << " " << size << "\n";
    return out.str() + test::slurp(dir / "manifest.csv");
}

struct Command {
    std::string name;
    std::function<void()> restore;  // puts the state before the command in place
    std::vector<std::string> args;
    std::function<std::string()> state;
};

struct Outcome {
    int kills = 0, oldState = 0, newState = 0;
};

Outcome killAtRandomSteps(const Command& c, test::TempDir& dir) {
    Outcome o;
    c.restore();
    const std::string before = c.state();
    const std::string countFile = dir.file(c.name + ".count");
    const auto full = test::runCliAfter(withKillSwitch("EARMARK_KILL_COUNT_FILE='" + countFile + "'"), c.args);
    EXPECT_EQ(full.exitCode, 0) << c.name << ": " << full.err;
    const std::string after = c.state();
    EXPECT_NE(before, after) << c.name << ": the command changed nothing";
    const long steps = std::atol(test::slurp(countFile).c_str());
    EXPECT_GT(steps, 2) << c.name;
    if (steps <= 2) return o;

    std::mt19937 rng(static_cast<unsigned>(std::hash<std::string>{}(c.name)));
    std::uniform_int_distribution<long> anyStep(1, steps);
    const int kills = killsPerCommand();
    for (int i = 0; i < kills; ++i) {
        const long at = i == 0 ? 1 : i == 1 ? steps : anyStep(rng);
        c.restore();
        const auto r = test::runCliAfter(withKillSwitch("EARMARK_KILL_AT=" + std::to_string(at)), c.args);
        const std::string state = c.state();
        if (r.exitCode == 137) {
            ++o.kills;
        } else {
            // A run may make a step or two fewer (a log already folded back…):
            // then it finishes, and must have done all of its work.
            EXPECT_EQ(r.exitCode, 0) << c.name << " step " << at << ": " << r.err;
            EXPECT_EQ(state, after) << c.name << " step " << at;
        }
        EXPECT_TRUE(state == before || state == after)
            << c.name << " killed at step " << at << " of " << steps << " left:\n"
            << state << "\nbefore:\n" << before << "\nafter:\n" << after;
        o.oldState += state == before;
        o.newState += state == after;
    }
    ::testing::Test::RecordProperty(c.name + "_steps", static_cast<int>(steps));
    ::testing::Test::RecordProperty(c.name + "_kills", o.kills);
    return o;
}

struct FaultScenario {
    test::TempDir dir;
    std::string pristine = dir.file("pristine.earmark");
    std::string session = dir.file("s.earmark");
    FaultScenario() {
        fs::create_directories(dir.path() / "takes");
        std::ofstream oldList(dir.file("old.csv")), allList(dir.file("all.csv"));
        oldList << "id,audio\n";
        allList << "id,audio\n";
        for (int i = 0; i < 8; ++i) {
            Signal s = test::sine(120.0 + 20.0 * i, 0.4 + 0.05 * i, 16000, i % 2 ? 0.3 : 1.3);
            for (float& x : s.samples) x = std::clamp(x, -1.0f, 1.0f);  // every other take clipped
            const std::string name = "takes/t" + std::to_string(i) + ".wav";
            writeWav(dir.file(name), s);
            if (i < 4) oldList << "t" << i << "," << name << "\n";
            allList << "t" << i << "," << name << "\n";
        }
    }
    std::vector<std::string> scanArgs(const std::string& list, const std::string& file) const {
        return {"scan", dir.file(list), "--out", "/dev/null", "--jobs", "1", "--session", file};
    }
};

void expectBothOutcomes(const Outcome& o, const std::string& name) {
    EXPECT_GT(o.kills, 0) << name;
    EXPECT_GT(o.oldState, 0) << name << ": no kill left the state before";
    EXPECT_GT(o.newState, 0) << name << ": no kill left the state after";
}

TEST(FaultInjection, ScanIntoAnExistingSession) {
    FaultScenario s;
    ASSERT_EQ(test::runCli(s.scanArgs("old.csv", s.pristine)).exitCode, 0);
    const Command c{"scan", [&] { restoreSession(s.pristine, s.session); }, s.scanArgs("all.csv", s.session),
                    [&] { return test::sessionState(s.session); }};
    expectBothOutcomes(killAtRandomSteps(c, s.dir), c.name);
}

TEST(FaultInjection, ScanIntoANewSession) {
    FaultScenario s;
    const Command c{"scan_new", [&] { removeSession(s.session); }, s.scanArgs("all.csv", s.session),
                    [&] { return test::sessionState(s.session); }};
    expectBothOutcomes(killAtRandomSteps(c, s.dir), c.name);
    // The killed runs' hidden files are gone after a run that finished.
    removeSession(s.session);
    ASSERT_EQ(test::runCli(s.scanArgs("all.csv", s.session)).exitCode, 0);
    for (const auto& e : fs::directory_iterator(s.dir.path()))
        EXPECT_EQ(e.path().filename().string().find(".new-"), std::string::npos) << e.path();
}

TEST(FaultInjection, MarkAddAndSessionTiers) {
    FaultScenario s;
    ASSERT_EQ(test::runCli(s.scanArgs("all.csv", s.pristine)).exitCode, 0);
    const std::string words = s.dir.file("words.json");
    std::ofstream(words) << R"({"version": 1, "words": [{"text": "all", "start": 0.05, "end": 0.2},
                               {"text": "aboard", "start": 0.2, "end": 0.38}]})";
    const Command mark{"mark_add", [&] { restoreSession(s.pristine, s.session); },
                       {"mark", "add", s.session, "--take", "t3", "--start", "0.1", "--end", "0.3", "--category",
                        "timing", "--subtype", "rushed", "--severity", "major", "--note", "too fast"},
                       [&] { return test::sessionState(s.session); }};
    expectBothOutcomes(killAtRandomSteps(mark, s.dir), mark.name);
    const Command tiers{"session_tiers", [&] { restoreSession(s.pristine, s.session); },
                        {"session", "tiers", s.session, "--take", "t2", words},
                        [&] { return test::sessionState(s.session); }};
    expectBothOutcomes(killAtRandomSteps(tiers, s.dir), tiers.name);
}

TEST(FaultInjection, BundleExport) {
    FaultScenario s;
    ASSERT_EQ(test::runCli({"session", "new", s.pristine}).exitCode, 0);
    ASSERT_EQ(test::runCli({"session", "add", s.pristine, s.dir.file("takes/t0.wav")}).exitCode, 0);
    auto addMark = [&](const std::string& start) {
        const auto r = test::runCli({"mark", "add", s.pristine, "--take", "1", "--start", start, "--end", "0.35",
                                     "--category", "artifact", "--subtype", "clipping"});
        ASSERT_EQ(r.exitCode, 0) << r.err;
    };
    const fs::path out = s.dir.path() / "out", target = out / "bundle", oldBundle = s.dir.path() / "old-bundle";
    addMark("0.1");
    ASSERT_EQ(test::runCli({"export", s.pristine, "--bundle", oldBundle.string()}).exitCode, 0);
    addMark("0.2");
    const Command c{"bundle",
                    [&] {
                        fs::remove_all(target);
                        fs::create_directories(out);
                        fs::copy(oldBundle, target, fs::copy_options::recursive);
                    },
                    {"export", s.pristine, "--bundle", target.string(), "--force", "--image-size", "400x300"},
                    [&] { return bundleState(target); }};
    expectBothOutcomes(killAtRandomSteps(c, s.dir), c.name);
    // Killed exports left hidden folders with voice clips; the next export
    // into the same folder removes them all.
    ASSERT_EQ(test::runCli({"export", s.pristine, "--bundle", (out / "again").string()}).exitCode, 0);
    for (const auto& e : fs::directory_iterator(out)) {
        const std::string name = e.path().filename().string();
        EXPECT_TRUE(name == "bundle" || name == "again") << "left over: " << name;
    }
}

}  // namespace
}  // namespace earmark
