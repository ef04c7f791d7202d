// earmark-cli artefacts: JSON of the events, exit codes and one-line messages.
#include "run_cli.hpp"

#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <fstream>

namespace earmark {
namespace {

using test::runCli;
using test::TempDir;

// 1.5 s of a band-limited tone (220 + 660 Hz) with one −14 dBFS
// single-sample click at 0.8 s (a float WAV keeps it exact).
std::string writeClickedTake(const TempDir& dir) {
    Signal s = test::sine(220, 1.5, 22050, 0.3);
    const Signal b = test::sine(660, 1.5, 22050, 0.15);
    for (std::size_t i = 0; i < s.size(); ++i) s.samples[i] += b.samples[i];
    s.samples[static_cast<std::size_t>(0.8 * 22050)] += 0.2f;
    const std::string path = dir.file("take.wav");
    writeWav(path, s, WavEncoding::Float32);
    return path;
}

TEST(ArtefactsCli, ListsTheClickAsJson) {
    TempDir dir;
    const auto r = runCli({"artefacts", writeClickedTake(dir), "--all", "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto doc = nlohmann::json::parse(r.out);
    int clicks = 0;
    for (const auto& e : doc["events"]) {
        if (e["kind"] != "click") continue;
        ++clicks;
        EXPECT_NEAR(0.5 * (e["start_s"].get<double>() + e["end_s"].get<double>()), 0.8, 0.001);
        EXPECT_EQ(e["unit"], "x");
    }
    EXPECT_EQ(clicks, 1);
}

TEST(ArtefactsCli, BadInputAndBadRules) {
    TempDir dir;
    const auto missing = runCli({"artefacts", dir.file("nothing.wav")});
    EXPECT_EQ(missing.exitCode, 3);
    test::expectOneLineError(missing, "nothing.wav");
    std::ofstream(dir.file("rules.json")) << R"({"click": {"min_ratio": -1}})";
    const auto rules = runCli({"artefacts", writeClickedTake(dir), "--rules", dir.file("rules.json")});
    EXPECT_EQ(rules.exitCode, 2);
    test::expectOneLineError(rules, "rules.click");
    EXPECT_EQ(runCli({"artefacts"}).exitCode, 2);
}

}  // namespace
}  // namespace earmark
