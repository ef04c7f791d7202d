// earmark-cli words and align --method: exit codes, JSON contract, errors.
// The take is a real recording from Debian's pocketsphinx-testdata.
#include "run_cli.hpp"
#include "support/temp_dir.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <fstream>

namespace earmark::test {
namespace {

const std::string kTake = "/usr/share/pocketsphinx/test/data/librivox/sense_and_sensibility_01_austen_64kb-0880.wav";
const std::string kText = "he was not an ill disposed young man";

TEST(WordsCli, JsonHasEveryScriptWordAndNoCoverageFindingForACleanTake) {
    const CliResult r = runCli({"words", kTake, "--text", kText, "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j["method"], "model");
    ASSERT_EQ(j["words"].size(), 8u);
    EXPECT_EQ(j["words"][0]["word"], "he");
    EXPECT_TRUE(j["coverage"].empty());
    for (const auto& w : j["words"]) {
        EXPECT_TRUE(w["spoken"].get<bool>());
        EXPECT_LE(w["score"].get<double>(), 0.0);
        EXPECT_FALSE(w["phones"].empty());
    }
}

TEST(WordsCli, AMissingLastWordIsAnEarlyEndNamingIt) {
    const CliResult r = runCli({"words", kTake, "--text", kText + " tomorrow evening", "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    ASSERT_FALSE(j["coverage"].empty());
    const auto& last = j["coverage"].back();
    EXPECT_EQ(last["kind"], "early-end");
    EXPECT_EQ(last["words"], nlohmann::json::array({"tomorrow", "evening"}));
}

TEST(WordsCli, BadInputIsOneLineNamingTheFile) {
    TempDir dir;
    const std::string empty = dir.file("empty.txt");
    std::ofstream(empty) << "  ,,, \n";
    expectOneLineError(runCli({"words", kTake, "--text-file", empty}), empty);
    EXPECT_EQ(runCli({"words", kTake, "--text-file", empty}).exitCode, 3);
    expectOneLineError(runCli({"words", dir.file("missing.wav"), "--text", "hello"}), "missing.wav");
    EXPECT_EQ(runCli({"words", kTake}).exitCode, 2);
    EXPECT_EQ(runCli({"words", kTake, "--text", "hallo", "--voice", "de"}).exitCode, 2);
}

TEST(AlignCli, MethodIsChosenAndReported) {
    const CliResult model = runCli({"align", kTake, "--text", kText});
    ASSERT_EQ(model.exitCode, 0) << model.err;
    EXPECT_NE(model.out.find("method:    model"), std::string::npos) << model.out;
    const CliResult reference = runCli({"align", kTake, "--text", kText, "--method", "reference"});
    ASSERT_EQ(reference.exitCode, 0) << reference.err;
    EXPECT_NE(reference.out.find("method:    reference"), std::string::npos);
    EXPECT_EQ(runCli({"align", kTake, "--text", kText, "--method", "guess"}).exitCode, 2);
    EXPECT_EQ(runCli({"align", kTake, "--text", "hallo", "--voice", "de", "--method", "model"}).exitCode, 2);
}

}  // namespace
}  // namespace earmark::test
