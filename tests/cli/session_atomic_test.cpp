// A command's writes to a session land whole or not at all (issue 11, item 1):
// `scan --session` on a full disk leaves the old session (or no new file)
// and says so truly; when it succeeds the session holds the whole new scan.
// The full disk is a file size limit (ulimit -f): writes past it fail with
// EFBIG, as writes fail with ENOSPC on a full disk.
#include "run_cli.hpp"
#include "session_state.hpp"

#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using ::testing::HasSubstr;

// Takes of varied pitch, length and level (some clipped) so the scan raises
// different suspects on different takes; a manifest of the first `oldCount`
// takes and one of all of them.
struct ScanScenario {
    test::TempDir dir;
    static constexpr int kTakes = 40, kOld = 20;
    ScanScenario() {
        fs::create_directories(dir.path() / "takes");
        std::ofstream oldList(dir.file("old.csv")), allList(dir.file("all.csv"));
        oldList << "id,audio\n";
        allList << "id,audio\n";
        for (int i = 0; i < kTakes; ++i) {
            Signal s = test::sine(110.0 + 7.0 * i, 0.5 + 0.02 * (i % 7), 16000, i % 3 == 0 ? 1.4 : 0.3);
            for (float& x : s.samples) x = std::clamp(x, -1.0f, 1.0f);
            const std::string name = "take-" + std::to_string(i) + ".wav";
            writeWav(dir.file("takes/" + name), s);
            (i < kOld ? oldList : allList) << "t" << i << ",takes/" << name << "\n";
            if (i < kOld) allList << "t" << i << ",takes/" << name << "\n";
        }
    }
    test::CliResult scan(const std::string& list, const std::string& session, const std::string& prefix = "") {
        return test::runCliAfter(prefix, {"scan", dir.file(list), "--out", "/dev/null", "--jobs", "1", "--session",
                                          session});
    }
};

// The limits sweep from "a few pages of the log fit" to "all fits"; ulimit -f
// counts 512-byte blocks in the POSIX shell. Below 64 blocks (32 KiB) SQLite
// cannot size its shared-memory file and fails before writing anything.
const int kLimitsBlocks[] = {64, 72, 80, 88, 96, 112, 128, 160, 192, 256, 384, 1024};

// Built by appending: GCC 12 raises a false -Wrestrict on chained temporaries.
std::string withLimit(const std::string& stem, int limit) {
    std::string name = stem;
    return name.append(std::to_string(limit)).append(".earmark");
}

std::string limitPrefix(int limit) {
    std::string prefix = "trap '' XFSZ; ulimit -f ";
    return prefix.append(std::to_string(limit)).append("; ");
}

TEST(SessionAtomic, ScanIntoAnExistingSessionOnAFullDiskLeavesTheOldStateAndSaysSo) {
    ScanScenario s;
    const std::string pristine = s.dir.file("pristine.earmark"), done = s.dir.file("done.earmark");
    ASSERT_EQ(s.scan("old.csv", pristine).exitCode, 0);
    fs::copy_file(pristine, done);
    ASSERT_EQ(s.scan("all.csv", done).exitCode, 0);
    const std::string oldState = test::sessionState(pristine), newState = test::sessionState(done);
    ASSERT_NE(oldState, newState);
    int failures = 0, successes = 0;
    for (int limit : kLimitsBlocks) {
        const std::string file = s.dir.file(withLimit("s", limit));
        fs::copy_file(pristine, file);
        const auto r = s.scan("all.csv", file, limitPrefix(limit));
        const std::string state = test::sessionState(file);
        if (r.exitCode == 0) {
            EXPECT_EQ(state, newState) << "limit " << limit;
            ++successes;
        } else {
            EXPECT_EQ(r.exitCode, 4) << "limit " << limit << ": " << r.err;
            EXPECT_EQ(state, oldState) << "limit " << limit << ": " << r.err;
            EXPECT_THAT(r.err, HasSubstr(file));
            EXPECT_THAT(r.err, HasSubstr("nothing was changed"));
            ++failures;
        }
    }
    EXPECT_GT(failures, 0);  // the sweep reaches both outcomes
    EXPECT_GT(successes, 0);
}

TEST(SessionAtomic, ScanIntoANewSessionOnAFullDiskLeavesNoFile) {
    ScanScenario s;
    const std::string done = s.dir.file("done.earmark");
    ASSERT_EQ(s.scan("all.csv", done).exitCode, 0);
    const std::string newState = test::sessionState(done);
    int failures = 0;
    for (int limit : kLimitsBlocks) {
        const std::string file = s.dir.file(withLimit("fresh", limit));
        const auto r = s.scan("all.csv", file, limitPrefix(limit));
        if (r.exitCode == 0) {
            EXPECT_EQ(test::sessionState(file), newState) << "limit " << limit;
        } else {
            EXPECT_EQ(r.exitCode, 4) << "limit " << limit << ": " << r.err;
            EXPECT_FALSE(fs::exists(file)) << "limit " << limit << ": " << r.err;
            EXPECT_THAT(r.err, HasSubstr(file));
            ++failures;
        }
    }
    EXPECT_GT(failures, 0);
    // No hidden half-made session is left beside it either.
    for (const auto& e : fs::directory_iterator(s.dir.path()))
        EXPECT_THAT(e.path().filename().string(), ::testing::Not(HasSubstr(".new-"))) << e.path();
}

}  // namespace
}  // namespace earmark
