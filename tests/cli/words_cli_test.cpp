// earmark-cli words and align --method: exit codes, JSON contract, errors.
// The take is a real recording from Debian's pocketsphinx-testdata.
#include "run_cli.hpp"
#include "support/temp_dir.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include "earmark/core/signal.hpp"
#include "earmark/io/audio_file.hpp"

#include <algorithm>
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

// Bad text (issue 10): never a crash or a hang; a result whose confidence
// says so, or exit 3 with one line naming the file.
TEST(WordsCli, TextWithoutADictionaryWordGivesLowConfidence) {
    const CliResult r = runCli({"words", kTake, "--text", "Zorblat qwimfen drussock vintrapel", "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j["guessed_words"].size(), 4u);
    EXPECT_LT(j["mean_confidence"].get<double>(), 0.5);
}

TEST(WordsCli, DigitsAndAbbreviationsAreGuessedAndSaidSo) {
    const CliResult r = runCli({"words", kTake, "--text", "Dr. Vell paid 42 crowns at 9:30", "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    ASSERT_EQ(j["words"].size(), 7u);
    const auto& guessed = j["guessed_words"];
    EXPECT_NE(std::find(guessed.begin(), guessed.end(), "42"), guessed.end()) << guessed;
    EXPECT_NE(std::find(guessed.begin(), guessed.end(), "9:30"), guessed.end()) << guessed;
}

TEST(WordsCli, TextFarLongerThanTheAudioEndsEarly) {
    TempDir dir;
    const std::string text = dir.file("long.txt");
    {
        std::ofstream out(text);
        for (int i = 0; i < 60; ++i) out << kText << " and the ferry left the pier at noon. ";
    }
    const CliResult r = runCli({"words", kTake, "--text-file", text, "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    ASSERT_EQ(j["words"].size(), 60u * 16u);
    ASSERT_FALSE(j["coverage"].empty());
    EXPECT_EQ(j["coverage"].back()["kind"], "early-end");
    EXPECT_GT(j["coverage"].back()["words"].size(), 900u);
}

TEST(WordsCli, SilenceAndTooShortAudio) {
    TempDir dir;
    Signal silence;
    silence.sampleRate = 16000;
    silence.samples.assign(16000, 0.0f);
    writeWav(dir.file("silence.wav"), silence);
    const CliResult quiet = runCli({"words", dir.file("silence.wav"), "--text", "hello there", "--json", "-"});
    ASSERT_EQ(quiet.exitCode, 0) << quiet.err;
    const auto j = nlohmann::json::parse(quiet.out);
    EXPECT_EQ(j["mean_confidence"].get<double>(), 0.0);
    ASSERT_FALSE(j["coverage"].empty());
    EXPECT_EQ(j["coverage"].back()["kind"], "early-end");
    silence.samples.assign(16, 0.0f);
    writeWav(dir.file("tiny.wav"), silence);
    const CliResult tiny = runCli({"words", dir.file("tiny.wav"), "--text", "hello"});
    EXPECT_EQ(tiny.exitCode, 3);
    expectOneLineError(tiny, "tiny.wav");
}

TEST(ScanCli, TextWithoutAWordIsNotedAndTheScanGoesOn) {
    TempDir dir;
    const std::string manifest = dir.file("set.csv");
    std::ofstream(manifest, std::ios::binary) << "id,audio,text\r\n"
                                              << "a," << kTake << ",\"" << kText << "\"\r\n"
                                              << "b," << kTake << ",\" ... !! \"\r\n";
    const CliResult r = runCli({"scan", manifest, "--jobs", "1"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(r.out.find("ok; words not checked"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find(",model,"), std::string::npos) << r.out;
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
