// earmark-cli compare and earmark-cli model: JSON contracts, exit codes and
// one-line messages.
#include "run_cli.hpp"

#include "earmark/align/speech_render.hpp"
#include "earmark/export/npy.hpp"
#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <fstream>

namespace earmark {
namespace {

using test::runCli;
using test::TempDir;
using ::testing::HasSubstr;
using ::testing::Not;

const std::string kLine = "The lighthouse keeper counted seven gulls before breakfast.";

std::string modelData(const std::string& name) { return std::string(EARMARK_TEST_DATA_DIR) + "/model/" + name; }

std::string writeRenderedTake(const TempDir& dir, const std::string& name, int rateWpm) {
    const std::string path = dir.file(name);
    writeWav(path, renderSpeech(kLine, SpeechParams{"en-us", rateWpm, 50}).audio);
    return path;
}

TEST(CompareCli, JsonContractWithWordsFromTheText) {
    TempDir dir;
    const std::string a = writeRenderedTake(dir, "a.wav", 175), b = writeRenderedTake(dir, "b.wav", 140);
    const auto r = runCli({"compare", a, b, "--text", kLine, "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j["a"]["file"], a);
    EXPECT_EQ(j["a"]["words_from"], "text");
    EXPECT_EQ(j["alignment"]["method"], "word-by-word");
    EXPECT_NEAR(j["overall"]["duration_ratio"].get<double>(), 1.25, 0.05);
    EXPECT_NEAR(j["overall"]["f0_mean_diff_st"].get<double>(), 0.0, 1.0);
    EXPECT_TRUE(j["overall"]["mcd_db"].is_number());
    EXPECT_GT(j["overall"]["voiced_frames"].get<int>(), 0);
    ASSERT_EQ(j["words"].size(), 8u);
    const auto& w = j["words"][1];
    EXPECT_EQ(w["text"], "lighthouse");
    EXPECT_NEAR(w["duration_ratio"].get<double>(), 1.25, 0.07);
    EXPECT_TRUE(w["a"]["f0_mean_hz"].is_number());
    EXPECT_TRUE(w["flags"].is_array());
    EXPECT_TRUE(w["largest"].is_array());
}

TEST(CompareCli, WithoutWordsItSaysThereIsNoTable) {
    TempDir dir;
    const std::string a = writeRenderedTake(dir, "a.wav", 175), b = writeRenderedTake(dir, "b.wav", 140);
    const auto r = runCli({"compare", a, b});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_THAT(r.out, HasSubstr("mel-cepstral distortion"));
    EXPECT_THAT(r.out, HasSubstr("Kubichek 1993"));
    EXPECT_THAT(r.out, HasSubstr("no per-word table"));
    const auto j = runCli({"compare", a, b, "--json", "-"});
    EXPECT_TRUE(nlohmann::json::parse(j.out)["words"].is_null());
}

TEST(CompareCli, WordsThatDifferAreBadInputNamingTheFile) {
    TempDir dir;
    const std::string a = writeRenderedTake(dir, "a.wav", 175), b = writeRenderedTake(dir, "b.wav", 175);
    const std::string wordsB = dir.file("b.csv");
    std::ofstream(wordsB) << "0.1,0.5,lighthouse\n0.6,0.9,keeper\n";
    const auto r = runCli({"compare", a, b, "--text", kLine, "--words-b", wordsB});
    EXPECT_EQ(r.exitCode, 3);
    test::expectOneLineError(r, wordsB);
    EXPECT_THAT(r.err, HasSubstr("has 2 words, take A has 8"));
    EXPECT_EQ(runCli({"compare", a}).exitCode, 2);
    EXPECT_EQ(runCli({"compare", a, b, "--text", "x", "--text-file", wordsB}).exitCode, 2);
    const auto missing = runCli({"compare", a, dir.file("none.wav")});
    EXPECT_EQ(missing.exitCode, 3);
    test::expectOneLineError(missing, "none.wav");
}

TEST(ModelCli, MelDiffFindsThePlantedPatch) {
    TempDir dir;
    const NpyArray signal = readNpy(std::string(EARMARK_TEST_DATA_DIR) + "/mel/signal.npy");
    const std::string audio = dir.file("signal.wav");
    writeWav(audio, Signal{signal.data, 22050.0}, WavEncoding::Float32);
    const auto r = runCli({"model", "mel-diff", audio, modelData("pred_planted_f8_frames_bands.npy"), "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j["prediction"]["layout"], "frames-bands");
    EXPECT_EQ(j["prediction"]["layout_from"], "sidecar");
    EXPECT_EQ(j["difference"]["compared_frames"], 87);
    ASSERT_EQ(j["difference"]["regions"].size(), 1u);
    const auto& region = j["difference"]["regions"][0];
    EXPECT_EQ(region["first_frame"], 30);
    EXPECT_EQ(region["last_frame"], 39);
    EXPECT_EQ(region["first_band"], 20);
    EXPECT_EQ(region["last_band"], 29);
    EXPECT_NEAR(region["mean_db"].get<double>(), 12.0, 0.01);
    EXPECT_TRUE(j["warnings"].empty());

    // A square array asks for the layout (exit 2) and works once told.
    const auto ambiguous = runCli({"model", "mel-diff", audio, modelData("pred_square_f4.npy")});
    EXPECT_EQ(ambiguous.exitCode, 2);
    test::expectOneLineError(ambiguous, "--layout bands-frames or --layout frames-bands");
    const auto told = runCli({"model", "mel-diff", audio, modelData("pred_square_f4.npy"), "--layout", "frames-bands"});
    EXPECT_EQ(told.exitCode, 0) << told.err;
    EXPECT_THAT(told.out, HasSubstr("warning: assumed sample_rate 22050"));
    EXPECT_THAT(told.out, HasSubstr("the prediction has 80 frames"));

    const auto wrongBands =
        runCli({"model", "mel-diff", audio, modelData("pred_f16_bands_frames.npy"), "--bands", "64"});
    EXPECT_EQ(wrongBands.exitCode, 3);
    test::expectOneLineError(wrongBands, "no axis of 64 bands");
}

TEST(ModelCli, AttentionReportsFaultsAndWritesTheTokenTier) {
    const std::string matrix = modelData("attention_faulty.npy"), tokens = modelData("attention_tokens.txt");
    const auto r = runCli({"model", "attention", matrix, "--tokens", tokens, "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    ASSERT_EQ(j["faults"].size(), 2u);
    EXPECT_EQ(j["faults"][0]["kind"], "skip");
    EXPECT_EQ(j["faults"][0]["first_frame"], 45);
    EXPECT_EQ(j["faults"][0]["tokens"], nlohmann::json::array({"the"}));
    EXPECT_EQ(j["faults"][1]["kind"], "repeat");
    EXPECT_EQ(j["faults"][1]["first_frame"], 85);
    EXPECT_EQ(j["tokens"].size(), 24u);

    const auto t = runCli({"model", "attention", matrix, "--tokens", tokens, "--timings", "-"});
    ASSERT_EQ(t.exitCode, 0) << t.err;
    const auto timings = nlohmann::json::parse(t.out);
    ASSERT_TRUE(timings.contains("tokens"));
    EXPECT_EQ(timings["tokens"].size(), 24u);

    const auto text = runCli({"model", "attention", matrix, "--tokens", tokens});
    EXPECT_THAT(text.out, HasSubstr("skip    frame 45 (0.522 s): token 9 'the' never attended"));
    EXPECT_THAT(text.out, HasSubstr("repeat  frames 85-88"));

    EXPECT_EQ(runCli({"model", "attention", matrix}).exitCode, 2);  // no --tokens
    EXPECT_EQ(runCli({"model", "guess"}).exitCode, 2);
    const auto wrong = runCli({"model", "attention", modelData("pred_square_f4.npy"), "--tokens", tokens});
    EXPECT_EQ(wrong.exitCode, 3);
    test::expectOneLineError(wrong, "has no axis of 24 entries");
}

}  // namespace
}  // namespace earmark
