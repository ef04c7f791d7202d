// earmark-cli analyze: the JSON contract, exit codes and one-line messages.
#include "run_cli.hpp"

#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>
#include <sndfile.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <limits>

namespace earmark {
namespace {

using test::runCli;
using test::TempDir;
using ::testing::HasSubstr;
using ::testing::Not;

// A 2-second voice-like take: 0.3 s silence, 1.4 s voiced at 150 Hz, 0.3 s silence.
std::string writeVoiceTake(const TempDir& dir, const std::string& name = "take.wav") {
    using K = test::VoiceSegment::Kind;
    const auto v = test::synthesiseVoice({{K::Silence, 0.3, 0, 0, 0},
                                          {K::Voiced, 1.4, 150, 150, 0.3},
                                          {K::Silence, 0.3, 0, 0, 0}},
                                         22050);
    const std::string path = dir.file(name);
    writeWav(path, v.signal);
    return path;
}

TEST(AnalyzeCli, JsonContract) {
    TempDir dir;
    const std::string path = writeVoiceTake(dir);
    const auto r = runCli({"analyze", path, "--json", "-"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_NEAR(j["duration_s"].get<double>(), 2.0, 1e-3);
    EXPECT_EQ(j["sample_rate"].get<double>(), 22050);
    EXPECT_EQ(j["channels"].get<int>(), 1);
    const auto& s = j["summary"];
    EXPECT_NEAR(s["f0_median_hz"].get<double>(), 150.0, 1.5);
    EXPECT_NEAR(s["f0_p5_hz"].get<double>(), 150.0, 3.0);
    EXPECT_NEAR(s["f0_p95_hz"].get<double>(), 150.0, 3.0);
    EXPECT_NEAR(s["voiced_fraction"].get<double>(), 0.7, 0.05);
    EXPECT_TRUE(s["loudness_lufs"].is_number());
    EXPECT_TRUE(s["sample_peak_dbfs"].is_number());
    EXPECT_EQ(s["clipped_samples"].get<int>(), 0);
    EXPECT_NEAR(j["f0"]["hop_s"].get<double>(), 0.005, 1e-4);
    EXPECT_NEAR(j["energy"]["hop_s"].get<double>(), 0.005, 1e-4);
    const auto& hz = j["f0"]["hz"];
    ASSERT_EQ(hz.size(), j["energy"]["db"].size());
    EXPECT_TRUE(hz[10].is_null());           // t = 0.05 s: silence, unvoiced
    EXPECT_NEAR(hz[200].get<double>(), 150.0, 2.0);  // t = 1.0 s: voiced
}

TEST(AnalyzeCli, HumanSummaryAndTrackSelection) {
    TempDir dir;
    const std::string path = writeVoiceTake(dir);
    const auto r = runCli({"analyze", path, "--tracks", "f0,loudness"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_THAT(r.out, HasSubstr("F0:"));
    EXPECT_THAT(r.out, HasSubstr("LUFS"));
    EXPECT_THAT(r.out, Not(HasSubstr("mel:")));
}

TEST(AnalyzeCli, WritesMelNpyWithSidecar) {
    TempDir dir;
    const std::string path = writeVoiceTake(dir);
    const std::string npy = dir.file("mel.npy");
    const auto r = runCli({"analyze", path, "--tracks", "f0", "--mel-npy", npy});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    std::ifstream in(npy, std::ios::binary);
    char magic[6];
    in.read(magic, 6);
    EXPECT_EQ(std::string(magic + 1, 5), "NUMPY");
    std::ifstream side(npy + ".json");
    const auto meta = nlohmann::json::parse(side);
    EXPECT_EQ(meta["bands"].get<int>(), 80);
    EXPECT_EQ(meta["layout"].get<std::string>(), "bands x frames");
}

TEST(AnalyzeCli, HelpListsEveryOptionWithDefaults) {
    const auto r = runCli({"analyze", "--help"});
    EXPECT_EQ(r.exitCode, 0);
    for (const char* opt : {"--channel", "--tracks", "--f0-min", "--f0-max", "--hop-ms", "--json", "--mel-npy"})
        EXPECT_THAT(r.out, HasSubstr(opt));
    EXPECT_THAT(r.out, HasSubstr("[default: 60]"));
    EXPECT_THAT(r.out, HasSubstr("[default: 500]"));
}

TEST(AnalyzeCli, BadUsageExitsTwo) {
    TempDir dir;
    const std::string path = writeVoiceTake(dir);
    EXPECT_EQ(runCli({"analyze"}).exitCode, 2);
    EXPECT_EQ(runCli({"analyze", path, "--bogus"}).exitCode, 2);
    EXPECT_EQ(runCli({"analyze", path, "--f0-min", "abc"}).exitCode, 2);
    EXPECT_EQ(runCli({"analyze", path, "--tracks", "f0,pitchiness"}).exitCode, 2);
    const auto r = runCli({"analyze", path, "--f0-min", "400", "--f0-max", "100"});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_THAT(r.err, HasSubstr("PitchParams"));
    EXPECT_EQ(runCli({"analyze", path, "--channel", "2"}).exitCode, 2);
    EXPECT_EQ(runCli({"frobnicate"}).exitCode, 2);
}

TEST(AnalyzeCli, BadInputExitsThreeWithOneLine) {
    TempDir dir;
    const std::string missing = dir.file("missing.wav");
    auto r = runCli({"analyze", missing});
    EXPECT_EQ(r.exitCode, 3);
    test::expectOneLineError(r, missing);

    const std::string text = dir.file("notes.wav");
    std::ofstream(text) << "not audio at all\n";
    r = runCli({"analyze", text});
    EXPECT_EQ(r.exitCode, 3);
    test::expectOneLineError(r, text);

    const std::string empty = dir.file("empty.wav");
    std::ofstream(empty).close();
    r = runCli({"analyze", empty});
    EXPECT_EQ(r.exitCode, 3);
    test::expectOneLineError(r, empty);

    Signal nan = test::sine(200, 0.5, 16000, 0.5);
    nan.samples[100] = std::numeric_limits<float>::quiet_NaN();
    const std::string nanPath = dir.file("nan.wav");
    writeWav(nanPath, nan, WavEncoding::Float32);
    r = runCli({"analyze", nanPath});
    EXPECT_EQ(r.exitCode, 3);
    test::expectOneLineError(r, nanPath);
}

TEST(AnalyzeCli, EdgeCaseFilesSucceed) {
    TempDir dir;
    // One sample, 8 kHz, 96 kHz and a 6-channel file all analyse without error.
    Signal one;
    one.sampleRate = 16000;
    one.samples = {0.25f};
    writeWav(dir.file("one.wav"), one);
    writeWav(dir.file("r8k.wav"), test::sine(200, 1.0, 8000, 0.5));
    writeWav(dir.file("r96k.wav"), test::sine(200, 1.0, 96000, 0.5));
    {
        SF_INFO info{};
        info.samplerate = 48000;
        info.channels = 6;
        info.format = SF_FORMAT_WAV | SF_FORMAT_PCM_16;
        const auto s = test::sine(220, 1.0, 48000, 0.3);
        std::vector<float> frames;
        for (float v : s.samples)
            for (int c = 0; c < 6; ++c) frames.push_back(v);
        SNDFILE* f = sf_open(dir.file("six.wav").c_str(), SFM_WRITE, &info);
        ASSERT_NE(f, nullptr);
        sf_writef_float(f, frames.data(), static_cast<sf_count_t>(s.size()));
        sf_close(f);
    }
    for (const char* name : {"one.wav", "r8k.wav", "r96k.wav", "six.wav"}) {
        const auto r = runCli({"analyze", dir.file(name), "--json", "-"});
        EXPECT_EQ(r.exitCode, 0) << name << ": " << r.err;
        if (r.exitCode != 0) continue;
        const auto j = nlohmann::json::parse(r.out);
        if (std::string(name) != "one.wav") {
            EXPECT_NEAR(j["summary"]["f0_median_hz"].get<double>(), 200.0 + (name[0] == 's' ? 20.0 : 0.0), 2.0) << name;
        }
    }
}

}  // namespace
}  // namespace earmark

namespace earmark {
namespace {

// Output to a device must go to the device: an atomic rename over /dev/null
// would replace it with a regular file for every program on the machine.
TEST(AnalyzeCli, JsonToADeviceLeavesTheDeviceInPlace) {
    TempDir dir;
    Signal s = test::sine(200, 0.5, 16000, 0.5);
    const std::string path = dir.file("tone.wav");
    writeWav(path, s);
    const auto r = test::runCli({"analyze", path, "--json", "/dev/null"});
    EXPECT_EQ(r.exitCode, 0) << r.err;
    EXPECT_TRUE(std::filesystem::is_character_file("/dev/null"));
}

}  // namespace
}  // namespace earmark
