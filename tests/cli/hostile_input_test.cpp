// earmark-cli against hostile and messy inputs: output that cannot be
// written, outputs that would replace inputs, file names that are not UTF-8
// or hold a line break, pipes, endless devices and folders in place of files.
#include "cli_takes.hpp"
#include "run_cli.hpp"

#include "earmark/export/npy.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/store/session.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>
#include <sys/wait.h>

#include <filesystem>
#include <set>
#include <fstream>
#include <cstdio>

namespace earmark {
namespace {

using test::expectOneLineError;
using test::runCli;
using test::runCliRedirected;
using test::TempDir;
using test::writeSpeechLikeTake;
using ::testing::HasSubstr;


TEST(HostileInputCli, WriteErrorsOnStdoutFail) {
    TempDir dir;
    const std::string take = writeSpeechLikeTake(dir, "a.wav");
    for (const std::vector<std::string>& args :
         {std::vector<std::string>{"analyze", take}, {"analyze", take, "--json", "-"}, {"scan", dir.path().string()}}) {
        const auto r = runCliRedirected(args, "/dev/null", "/dev/full");
        EXPECT_EQ(r.exitCode, 4) << args[0];
        expectOneLineError(r, "standard output: write failed");
    }
}

TEST(HostileInputCli, AnOutputMayNotReplaceAnotherOutputOrAnInput) {
    TempDir dir;
    const std::string take = writeSpeechLikeTake(dir, "a.wav");
    auto r = runCli({"scan", dir.path().string(), "--out", dir.file("x.csv"), "--json", dir.file("x.csv")});
    EXPECT_EQ(r.exitCode, 2);
    expectOneLineError(r, "--out and --json name the same file");
    EXPECT_FALSE(std::filesystem::exists(dir.file("x.csv")));

    ASSERT_EQ(runCli({"scan", dir.path().string(), "--out", dir.file("part.csv")}).exitCode, 0);
    const std::string before = test::slurp(dir.file("part.csv"));
    r = runCli({"merge", dir.file("part.csv"), dir.file("part.csv")});
    EXPECT_EQ(r.exitCode, 2);
    expectOneLineError(r, "is one of the inputs");
    EXPECT_EQ(test::slurp(dir.file("part.csv")), before);

    r = runCli({"analyze", take, "--json", take});
    EXPECT_EQ(r.exitCode, 2);
    expectOneLineError(r, "is one of the inputs");
}

TEST(HostileInputCli, NamesThatAreNotUtf8OrHoldALineBreakRoundTrip) {
    TempDir dir;
    const std::string odd = writeSpeechLikeTake(dir, "b\xFF.wav");
    writeSpeechLikeTake(dir, "c\nd.wav");

    auto r = runCli({"analyze", odd, "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j["file"], dir.file("b\xEF\xBF\xBD.wav"));
    std::string hex;
    for (unsigned char c : odd) {
        static const char* digits = "0123456789abcdef";
        hex += digits[c >> 4];
        hex += digits[c & 15];
    }
    EXPECT_EQ(j["file_bytes"], hex);

    r = runCli({"compare", odd, dir.file("c\nd.wav"), "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_EQ(nlohmann::json::parse(r.out)["a"]["file_bytes"], hex);

    const std::string session = dir.file("s.earmark");
    r = runCli({"scan", dir.path().string(), "--out", dir.file("r.csv"), "--json", dir.file("r.json"), "--session",
                session});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(test::slurp(dir.file("r.csv")).find("\"" + dir.file("c\nd.wav") + "\""), std::string::npos);
    const auto takes = nlohmann::json::parse(test::slurp(dir.file("r.json")))["takes"];
    ASSERT_EQ(takes.size(), 2u);
    // The session keeps the raw paths, so the takes' audio is found again.
    const Session s = Session::open(session, OpenMode::ReadOnly);
    std::set<std::string> paths;
    for (const auto& t : s.takes()) paths.insert(std::filesystem::path(t.audioPath).filename().string());
    EXPECT_EQ(paths, (std::set<std::string>{"b\xFF.wav", "c\nd.wav"}));
    // Merging the JSON output gives back the same ids and files.
    r = runCli({"merge", dir.file("m.csv"), dir.file("r.json")});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_EQ(test::slurp(dir.file("m.csv")), test::slurp(dir.file("r.csv")));
}

TEST(HostileInputCli, AnErrorNamingAFileWithALineBreakStaysOneLine) {
    TempDir dir;
    std::ofstream(dir.file("bad\nname.wav")) << "not audio";
    const auto r = runCli({"analyze", dir.file("bad\nname.wav")});
    EXPECT_EQ(r.exitCode, 3);
    expectOneLineError(r, "bad\\nname.wav");
}

TEST(HostileInputCli, AudioFromAPipeOnStdin) {
    // `cat take.wav | earmark-cli analyze /dev/stdin`: the pipe can be read once.
    TempDir dir;
    const std::string bytes = test::slurp(writeSpeechLikeTake(dir, "a.wav"));
    const std::string command = std::string("'") + EARMARK_CLI_PATH + "' analyze /dev/stdin --json '" +
                                dir.file("a.json") + "' >/dev/null 2>'" + dir.file("err") + "'";
    FILE* pipe = ::popen(command.c_str(), "w");
    ASSERT_NE(pipe, nullptr);
    std::fwrite(bytes.data(), 1, bytes.size(), pipe);
    const int status = ::pclose(pipe);
    ASSERT_TRUE(WIFEXITED(status));
    ASSERT_EQ(WEXITSTATUS(status), 0) << test::slurp(dir.file("err"));
    EXPECT_NEAR(nlohmann::json::parse(test::slurp(dir.file("a.json")))["duration_s"].get<double>(), 1.0, 1e-6);
}

TEST(HostileInputCli, EndlessDevicesAndFoldersAreRefusedByName) {
    TempDir dir;
    const std::string take = writeSpeechLikeTake(dir, "a.wav");
    const std::string folder = dir.path().string();
    writeNpyFloat32(dir.file("p.npy"), std::vector<float>(80 * 10, -5.0f), {80, 10});
    // Every text input goes through one reader (tests/engine/io/text_file_test.cpp
    // checks the limit with a small one); one full-size case here, as it takes seconds.
    const auto r = runCli({"merge", dir.file("m.csv"), "/dev/zero"});
    EXPECT_EQ(r.exitCode, 3);
    expectOneLineError(r, "/dev/zero: is larger than 256 MiB, the limit for a text input");
    const std::vector<std::vector<std::string>> folders = {
        {"compare", take, take, "--text-file", folder},
        {"align", take, "--text-file", folder},
        {"model", "mel-diff", take, dir.file("p.npy"), "--sidecar", folder},
    };
    for (const auto& args : folders) {
        const auto r = runCli(args);
        EXPECT_EQ(r.exitCode, 3) << args[0];
        expectOneLineError(r, folder + ": is a folder");
    }
}

TEST(HostileInputCli, LoudnessBelowTheKWeightingRateIsNull) {
    TempDir dir;
    const std::string take = writeSpeechLikeTake(dir, "low.wav", 3000.0);
    const auto r = runCli({"analyze", take, "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_TRUE(nlohmann::json::parse(r.out)["summary"]["loudness_lufs"].is_null());
}

}  // namespace
}  // namespace earmark
