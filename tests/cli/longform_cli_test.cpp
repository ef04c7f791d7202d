// earmark-cli longform: the JSON contract (docs/longform.md), exit codes and
// one-line messages for bad input.
#include "run_cli.hpp"

#include "earmark/io/audio_file.hpp"
#include "support/long_read.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <fstream>

namespace earmark {
namespace {

using test::runCli;
using test::TempDir;
using ::testing::HasSubstr;

// A 12-sentence read (≈ 1 minute) with a click planted at its fifth join.
struct ShortRead {
    test::LongRead read;
    std::string audio, chunks;
};

ShortRead writeRead(const TempDir& dir) {
    test::LongReadPlan plan;
    plan.sentences = 12;
    const test::LongRead clean = test::makeLongRead(plan);
    plan.clicksS = {clean.joins[4]};
    ShortRead r{test::makeLongRead(plan), dir.file("read.wav"), dir.file("chunks.txt")};
    writeWav(r.audio, r.read.audio, WavEncoding::Float32);
    std::ofstream out(r.chunks);
    out << "# join times of the renderer's chunks, s\n";
    for (double t : r.read.joins) out << t << "\n";
    return r;
}

TEST(LongformCli, JsonContract) {
    TempDir dir;
    const ShortRead r = writeRead(dir);
    const auto result = runCli({"longform", r.audio, "--chunks", r.chunks, "--json", "-"});
    ASSERT_EQ(result.exitCode, 0) << result.err;
    const auto j = nlohmann::json::parse(result.out);
    EXPECT_EQ(j["file"], r.audio);
    EXPECT_NEAR(j["duration_s"].get<double>(), r.read.audio.durationSeconds(), 0.001);
    EXPECT_EQ(j["settings"]["window_s"], 20.0);
    EXPECT_TRUE(j["settings"]["known_joins"].get<bool>());
    ASSERT_EQ(j["joins"].size(), r.read.joins.size());
    EXPECT_TRUE(j["joins"][0]["known"].get<bool>());
    ASSERT_GE(j["windows"].size(), 5u);
    for (const char* key : {"start_s", "end_s", "measured", "loudness_lufs", "speech_level_dbfs", "f0_median_hz",
                            "f0_range_st", "articulation_rate", "pauses", "pause_s", "timbre_distance", "speech_s"})
        EXPECT_TRUE(j["windows"][0].contains(key)) << key;
    ASSERT_EQ(j["trends"].size(), 5u);
    EXPECT_EQ(j["trends"][0]["measure"], "loudness_lufs");
    ASSERT_EQ(j["findings"].size(), 1u) << result.out;
    const auto& f = j["findings"][0];
    EXPECT_EQ(f["kind"], "seam");
    EXPECT_EQ(f["measure"], "click_db");
    EXPECT_NEAR(f["start_s"].get<double>(), r.read.joins[4], 0.01);
    EXPECT_GE(f["value"].get<double>(), f["threshold"].get<double>());
    for (const char* key : {"end_s", "unit", "reason"}) EXPECT_TRUE(f.contains(key)) << key;
}

TEST(LongformCli, SummaryListsFindings) {
    TempDir dir;
    const ShortRead r = writeRead(dir);
    const auto result = runCli({"longform", r.audio});
    ASSERT_EQ(result.exitCode, 0) << result.err;
    EXPECT_THAT(result.out, HasSubstr("findings:  1"));
    EXPECT_THAT(result.out, HasSubstr("seam: click"));
}

TEST(LongformCli, TextFileGivesParagraphsAndSentences) {
    TempDir dir;
    const ShortRead r = writeRead(dir);
    const std::string text = dir.file("chapter.txt"), tiers = dir.file("tiers.json");
    std::ofstream(text) << r.read.text;
    const auto result = runCli({"longform", r.audio, "--text-file", text, "--tiers", tiers, "--json", "-"});
    ASSERT_EQ(result.exitCode, 0) << result.err;
    const auto j = nlohmann::json::parse(result.out);
    ASSERT_EQ(j["text"]["paragraphs"].size(), 2u);
    ASSERT_EQ(j["text"]["sentences"].size(), 12u);
    EXPECT_NEAR(j["text"]["sentences"][3]["start_s"].get<double>(), r.read.sentenceStartS[3], 0.15);
    EXPECT_EQ(j["text"]["sentences"][3]["text"], test::longReadSentence(3));
    const auto t = nlohmann::json::parse(std::ifstream(tiers));
    EXPECT_FALSE(t.dump().empty());
    // auto with the default English voice: the acoustic model, the reference where it does not fit a chunk.
    EXPECT_EQ(j["text"]["method"].get<std::string>().rfind("model", 0), 0u) << j["text"]["method"];
}

TEST(LongformCli, MethodIsChosenAndRecorded) {
    TempDir dir;
    const ShortRead r = writeRead(dir);
    const std::string text = dir.file("chapter.txt");
    std::ofstream(text) << r.read.text;
    const auto reference = runCli({"longform", r.audio, "--text-file", text, "--method", "reference", "--json", "-"});
    ASSERT_EQ(reference.exitCode, 0) << reference.err;
    EXPECT_EQ(nlohmann::json::parse(reference.out)["text"]["method"], "reference");
    const auto unknown = runCli({"longform", r.audio, "--text-file", text, "--method", "guess"});
    EXPECT_EQ(unknown.exitCode, 2);
    EXPECT_THAT(unknown.err, HasSubstr("expects auto, model or reference"));
    const auto german = runCli({"longform", r.audio, "--text-file", text, "--method", "model", "--voice", "de"});
    EXPECT_EQ(german.exitCode, 2);
    EXPECT_THAT(german.err, HasSubstr("English only"));
}

TEST(LongformCli, TextCoveringHalfTheAudioIsBadInput) {
    TempDir dir;
    const ShortRead r = writeRead(dir);
    const std::string text = dir.file("half.txt");
    std::ofstream out(text);
    for (int i = 0; i < 6; ++i) out << test::longReadSentence(i) << "\n";
    out.close();
    const auto result = runCli({"longform", r.audio, "--text-file", text});
    EXPECT_EQ(result.exitCode, 3);
    test::expectOneLineError(result, text);
    EXPECT_THAT(result.err, HasSubstr("covers only"));
}

TEST(LongformCli, ThreeSecondTakeIsTooShort) {
    TempDir dir;
    const std::string path = dir.file("short.wav");
    writeWav(path, test::sine(180.0, 3.0, 16000.0, 0.3));
    const auto r = runCli({"longform", path});
    EXPECT_EQ(r.exitCode, 3);
    test::expectOneLineError(r, "too short");
}

TEST(LongformCli, ChunkListOutsideTheTake) {
    TempDir dir;
    const ShortRead r = writeRead(dir);
    const std::string chunks = dir.file("late.txt");
    std::ofstream(chunks) << "10.0\n5000.0\n";
    const auto result = runCli({"longform", r.audio, "--chunks", chunks});
    EXPECT_EQ(result.exitCode, 3);
    test::expectOneLineError(result, chunks);
    EXPECT_THAT(result.err, HasSubstr("outside the take"));
}

TEST(LongformCli, MalformedChunkListNamesTheLine) {
    TempDir dir;
    const std::string chunks = dir.file("bad.txt");
    std::ofstream(chunks) << "12.5\nabout 20 s\n";
    const ShortRead r = writeRead(dir);
    const auto result = runCli({"longform", r.audio, "--chunks", chunks});
    EXPECT_EQ(result.exitCode, 3);
    test::expectOneLineError(result, "line 2");
}

TEST(LongformCli, UnknownRuleKeyIsBadUsage) {
    TempDir dir;
    const ShortRead r = writeRead(dir);
    const std::string rules = dir.file("rules.json");
    std::ofstream(rules) << R"({"seam": {"click_level": 20}})";
    const auto result = runCli({"longform", r.audio, "--rules", rules});
    EXPECT_EQ(result.exitCode, 2);
    test::expectOneLineError(result, "rules.seam.click_level");
}

}  // namespace
}  // namespace earmark
