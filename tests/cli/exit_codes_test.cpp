// Every row of README's exit-code table, each by a command that must give it.
#include "cli_takes.hpp"
#include "run_cli.hpp"

#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <signal.h>
#include <spawn.h>
#include <sys/stat.h>
#include <sys/wait.h>

#include <fcntl.h>
#include <unistd.h>

#include <fstream>

extern char** environ;

namespace earmark {
namespace {

using test::expectOneLineError;
using test::runCli;
using test::TempDir;
using test::writeSpeechLikeTake;


TEST(ExitCodes, ZeroWhenDone) {
    TempDir dir;
    EXPECT_EQ(runCli({"analyze", writeSpeechLikeTake(dir, "a.wav")}).exitCode, 0);
}

TEST(ExitCodes, FourWhenAnOutputCannotBeWritten) {
    TempDir dir;
    const std::string take = writeSpeechLikeTake(dir, "a.wav");
    auto r = runCli({"analyze", take, "--json", dir.file("no-such-folder/a.json")});
    EXPECT_EQ(r.exitCode, 4);
    expectOneLineError(r, dir.file("no-such-folder/a.json"));
    r = test::runCliRedirected({"analyze", take}, "/dev/null", "/dev/full");
    EXPECT_EQ(r.exitCode, 4);
    expectOneLineError(r, "standard output");
}

TEST(ExitCodes, TwoForBadUsageAndBadRulesFiles) {
    TempDir dir;
    const std::string take = writeSpeechLikeTake(dir, "a.wav");
    EXPECT_EQ(runCli({"analyze", take, "--no-such-option"}).exitCode, 2);
    EXPECT_EQ(runCli({"analyze", take, "--f0-min", "abc"}).exitCode, 2);
    std::ofstream(dir.file("rules.json")) << "this is not JSON";
    const auto r = runCli({"scan", dir.path().string(), "--rules", dir.file("rules.json")});
    EXPECT_EQ(r.exitCode, 2);  // docs/scan.md: "2 bad command line or rules file"
    expectOneLineError(r, dir.file("rules.json"));
}

TEST(ExitCodes, ThreeForBadInputNamingTheFile) {
    TempDir dir;
    const auto r = runCli({"analyze", dir.file("missing.wav")});
    EXPECT_EQ(r.exitCode, 3);
    expectOneLineError(r, dir.file("missing.wav"));
}

TEST(ExitCodes, OneHundredThirtyWhenInterrupted) {
    // Deterministic: the scan blocks reading its manifest from a FIFO; once our
    // end is open, earmark-cli runs (its Ctrl-C handler is set up first), so
    // SIGINT is sent before any take is scanned.
    TempDir dir;
    for (const char* name : {"a.wav", "b.wav", "c.wav"}) writeSpeechLikeTake(dir, name);
    const std::string fifo = dir.file("list.csv");
    ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
    const std::string out = dir.file("ranked.csv");
    std::vector<std::string> args = {EARMARK_CLI_PATH, "scan", fifo, "--out", out};
    std::vector<char*> argv;
    for (auto& a : args) argv.push_back(a.data());
    argv.push_back(nullptr);
    posix_spawn_file_actions_t actions;
    posix_spawn_file_actions_init(&actions);
    posix_spawn_file_actions_addopen(&actions, 2, dir.file("err").c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0600);
    pid_t pid = 0;
    ASSERT_EQ(posix_spawn(&pid, EARMARK_CLI_PATH, &actions, nullptr, argv.data(), environ), 0);
    posix_spawn_file_actions_destroy(&actions);
    {
        std::ofstream manifest(fifo, std::ios::binary);  // returns once earmark-cli has opened the FIFO
        ASSERT_EQ(::kill(pid, SIGINT), 0);
        manifest << "id,audio\na,a.wav\nb,b.wav\nc,c.wav\n";
    }
    int status = 0;
    ASSERT_EQ(::waitpid(pid, &status, 0), pid);
    ASSERT_TRUE(WIFEXITED(status));
    EXPECT_EQ(WEXITSTATUS(status), 130) << test::slurp(dir.file("err"));
    EXPECT_NE(test::slurp(out).find("partial"), std::string::npos);
}

}  // namespace
}  // namespace earmark
