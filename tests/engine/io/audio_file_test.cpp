// Audio input: formats libsndfile reads, channel handling, and every kind of
// bad input named in the foundation issue. Files are written with libsndfile
// itself (the reference library) in each format, then read back.
#include "earmark/core/error.hpp"
#include "earmark/analysis/take_analysis.hpp"
#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <sndfile.h>
#include <sys/stat.h>

#include <cmath>
#include <fstream>
#include <limits>
#include <thread>

namespace earmark {
namespace {

using test::TempDir;
using ::testing::HasSubstr;

// Writes interleaved float frames in any libsndfile format.
void writeFile(const std::string& path, int format, int rate, int channels, const std::vector<float>& interleaved) {
    SF_INFO info{};
    info.samplerate = rate;
    info.channels = channels;
    info.format = format;
    SNDFILE* f = sf_open(path.c_str(), SFM_WRITE, &info);
    ASSERT_NE(f, nullptr) << sf_strerror(nullptr);
    sf_writef_float(f, interleaved.data(), static_cast<sf_count_t>(interleaved.size() / channels));
    sf_close(f);
}

std::vector<float> sineFrames(int rate, double seconds, double amp = 0.5) {
    return test::sine(440.0, seconds, rate, amp).samples;
}

template <typename Fn>
void expectInputError(Fn fn, const std::string& path, const std::string& problem) {
    try {
        fn();
        FAIL() << "expected InputError for " << path;
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), path);
        EXPECT_THAT(e.what(), HasSubstr(problem));
    }
}

struct FormatCase {
    const char* name;
    int format;
    double tolerance;  // max |read − written|
};

class FormatTest : public ::testing::TestWithParam<FormatCase> {};

TEST_P(FormatTest, ReadsBackWhatLibsndfileWrote) {
    TempDir dir;
    const auto& c = GetParam();
    const std::string path = dir.file(std::string("take.") + c.name);
    const auto frames = sineFrames(22050, 0.5);
    writeFile(path, c.format, 22050, 1, frames);
    const LoadedAudio a = loadAudio(path);
    EXPECT_EQ(a.info.channels, 1);
    EXPECT_DOUBLE_EQ(a.info.sampleRate, 22050.0);
    ASSERT_EQ(a.signal.size(), frames.size());
    double maxErr = 0;
    for (std::size_t i = 0; i < frames.size(); ++i)
        maxErr = std::max(maxErr, std::fabs(static_cast<double>(a.signal.samples[i]) - frames[i]));
    EXPECT_LE(maxErr, c.tolerance) << c.name;
}

// Tolerances: one quantisation step of each integer format (full scale = 1.0);
// Vorbis is lossy, so only a loose bound (the signal still reads as audio).
INSTANTIATE_TEST_SUITE_P(
    Formats, FormatTest,
    ::testing::Values(FormatCase{"pcm16.wav", SF_FORMAT_WAV | SF_FORMAT_PCM_16, 1.0 / 32768},
                      FormatCase{"pcm24.wav", SF_FORMAT_WAV | SF_FORMAT_PCM_24, 1.0 / 8388608},
                      FormatCase{"pcm32.wav", SF_FORMAT_WAV | SF_FORMAT_PCM_32, 1e-7},
                      FormatCase{"float.wav", SF_FORMAT_WAV | SF_FORMAT_FLOAT, 0.0},
                      FormatCase{"flac", SF_FORMAT_FLAC | SF_FORMAT_PCM_16, 1.0 / 32768},
                      FormatCase{"aiff", SF_FORMAT_AIFF | SF_FORMAT_PCM_16, 1.0 / 32768},
                      FormatCase{"ogg", SF_FORMAT_OGG | SF_FORMAT_VORBIS, 0.1}),
    [](const auto& info) {
        std::string n = info.param.name;
        for (auto& ch : n)
            if (ch == '.') ch = '_';
        return n;
    });

TEST(AudioFile, MixesOrPicksChannels) {
    TempDir dir;
    const std::string path = dir.file("six.wav");
    // 6 channels, channel c holds the constant (c + 1) / 10.
    std::vector<float> frames;
    for (int i = 0; i < 1000; ++i)
        for (int c = 0; c < 6; ++c) frames.push_back(static_cast<float>(c + 1) / 10.0f);
    writeFile(path, SF_FORMAT_WAV | SF_FORMAT_FLOAT, 48000, 6, frames);
    const auto mixed = loadAudio(path);
    EXPECT_EQ(mixed.info.channels, 6);
    ASSERT_EQ(mixed.signal.size(), 1000u);
    EXPECT_NEAR(mixed.signal.samples[500], 0.35f, 1e-6);  // mean of 0.1…0.6
    const auto third = loadAudio(path, {ChannelMode::Pick, 2});
    EXPECT_NEAR(third.signal.samples[500], 0.3f, 1e-6);
    EXPECT_THROW(loadAudio(path, {ChannelMode::Pick, 6}), ParamError);
}

TEST(AudioFile, ObserverSeesEveryInterleavedSample) {
    TempDir dir;
    const std::string path = dir.file("stereo.wav");
    std::vector<float> frames(2 * 200000);
    for (std::size_t i = 0; i < frames.size(); ++i) frames[i] = (i % 2) ? 0.25f : -0.25f;
    writeFile(path, SF_FORMAT_WAV | SF_FORMAT_FLOAT, 44100, 2, frames);
    std::int64_t seen = 0;
    double sumRight = 0;
    loadAudio(path, {}, [&](const float* block, std::int64_t n, int ch) {
        EXPECT_EQ(ch, 2);
        for (std::int64_t i = 0; i < n; ++i) sumRight += block[i * 2 + 1];
        seen += n;
    });
    EXPECT_EQ(seen, 200000);
    EXPECT_DOUBLE_EQ(sumRight, 0.25 * 200000);
}

TEST(AudioFile, UnusualRatesLoad) {
    TempDir dir;
    for (int rate : {8000, 96000}) {
        const std::string path = dir.file("r" + std::to_string(rate) + ".wav");
        writeFile(path, SF_FORMAT_WAV | SF_FORMAT_PCM_16, rate, 1, sineFrames(rate, 0.25));
        const auto a = loadAudio(path);
        EXPECT_DOUBLE_EQ(a.info.sampleRate, rate);
        EXPECT_EQ(a.signal.size(), static_cast<std::size_t>(rate / 4));
    }
}

TEST(AudioFile, OneSampleFileLoads) {
    TempDir dir;
    const std::string path = dir.file("one.wav");
    writeFile(path, SF_FORMAT_WAV | SF_FORMAT_PCM_16, 16000, 1, {0.5f});
    const auto a = loadAudio(path);
    ASSERT_EQ(a.signal.size(), 1u);
    EXPECT_NEAR(a.signal.samples[0], 0.5f, 1e-4);
}

TEST(AudioFileErrors, MissingFile) {
    TempDir dir;
    const std::string path = dir.file("nope.wav");
    expectInputError([&] { loadAudio(path); }, path, "file not found");
}

TEST(AudioFileErrors, Folder) {
    TempDir dir;
    const std::string path = dir.path().string();
    expectInputError([&] { loadAudio(path); }, path, "folder");
}

TEST(AudioFileErrors, EmptyFile) {
    TempDir dir;
    const std::string path = dir.file("empty.wav");
    std::ofstream(path).close();
    expectInputError([&] { loadAudio(path); }, path, "empty");
}

TEST(AudioFileErrors, TextRenamedToWav) {
    TempDir dir;
    const std::string path = dir.file("notes.wav");
    std::ofstream(path) << "These are meeting notes, not audio.\nSecond line.\n";
    expectInputError([&] { loadAudio(path); }, path, "not a recognised audio format");
}

TEST(AudioFileErrors, TruncatedWavHeader) {
    TempDir dir;
    const std::string good = dir.file("good.wav");
    writeFile(good, SF_FORMAT_WAV | SF_FORMAT_PCM_16, 16000, 1, sineFrames(16000, 0.1));
    std::ifstream in(good, std::ios::binary);
    std::string bytes((std::istreambuf_iterator<char>(in)), {});
    const std::string path = dir.file("cut.wav");
    std::ofstream(path, std::ios::binary).write(bytes.data(), 20);  // inside the fmt chunk
    try {
        loadAudio(path);
        FAIL() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), path);
        EXPECT_FALSE(e.problem().empty());
    }
}

TEST(AudioFileErrors, HeaderWithoutData) {
    TempDir dir;
    const std::string good = dir.file("good.wav");
    writeFile(good, SF_FORMAT_WAV | SF_FORMAT_PCM_16, 16000, 1, sineFrames(16000, 0.1));
    std::ifstream in(good, std::ios::binary);
    std::string bytes((std::istreambuf_iterator<char>(in)), {});
    const std::string path = dir.file("nodata.wav");
    std::ofstream(path, std::ios::binary).write(bytes.data(), 44);  // canonical header only
    EXPECT_THROW(loadAudio(path), InputError);
}

TEST(AudioFileErrors, ZeroLengthWav) {
    TempDir dir;
    const std::string path = dir.file("zero.wav");
    writeFile(path, SF_FORMAT_WAV | SF_FORMAT_PCM_16, 16000, 1, {});
    expectInputError([&] { loadAudio(path); }, path, "no audio frames");
}

TEST(AudioFileErrors, NonFiniteSamples) {
    TempDir dir;
    for (float bad : {std::numeric_limits<float>::quiet_NaN(), std::numeric_limits<float>::infinity()}) {
        const std::string path = dir.file("bad.wav");
        auto frames = sineFrames(16000, 0.1);
        frames[777] = bad;
        writeFile(path, SF_FORMAT_WAV | SF_FORMAT_FLOAT, 16000, 1, frames);
        expectInputError([&] { loadAudio(path); }, path, "non-finite samples (NaN or Inf) at frame 777");
    }
}

TEST(AudioFile, WriteWavRoundTrip) {
    TempDir dir;
    Signal s = test::sine(300, 0.2, 16000, 0.5);
    const std::string path = dir.file("out.wav");
    writeWav(path, s, WavEncoding::Float32);
    const auto back = loadAudio(path);
    ASSERT_EQ(back.signal.size(), s.size());
    EXPECT_EQ(back.signal.samples, s.samples);
}

TEST(AudioFile, ReportsProgressAndCancels) {
    TempDir dir;
    const std::string path = dir.file("long.wav");
    writeFile(path, SF_FORMAT_WAV | SF_FORMAT_PCM_16, 16000, 1, sineFrames(16000, 30.0));
    double last = -1;
    int calls = 0;
    loadAudio(path, {}, {}, Progress([&](double f) {
                  EXPECT_GE(f, last);
                  last = f;
                  ++calls;
                  return true;
              }));
    EXPECT_GT(calls, 3);
    EXPECT_DOUBLE_EQ(last, 1.0);
    EXPECT_THROW(loadAudio(path, {}, {}, Progress([](double) { return false; })), Cancelled);
}

}  // namespace
}  // namespace earmark

namespace earmark {
namespace {

// A pipe can be read once: the header and the samples come from one open
// (a second open would wait for another writer, or find the header gone).
TEST(AudioFile, ReadsAPipeInOnePass) {
    test::TempDir dir;
    const std::string wav = dir.file("tone.wav");
    writeWav(wav, test::sine(220.0, 0.5, 16000.0, 0.5));
    const std::string bytes = test::slurp(wav);
    const std::string fifo = dir.file("pipe.wav");
    ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
    std::thread writer([&] { std::ofstream(fifo, std::ios::binary) << bytes; });
    AudioInfo seen;
    const LoadedAudio a = loadAudio(fifo, {}, [&](const AudioInfo& h) { seen = h; }, {}, {});
    writer.join();
    EXPECT_EQ(seen.sampleRate, 16000.0);
    EXPECT_EQ(a.signal.size(), 8000u);
}

TEST(AudioFile, AnalysisOpensAPipeOnce) {
    test::TempDir dir;
    const std::string wav = dir.file("tone.wav");
    writeWav(wav, test::sine(220.0, 1.0, 16000.0, 0.5));
    const std::string bytes = test::slurp(wav);
    const std::string fifo = dir.file("pipe.wav");
    ASSERT_EQ(::mkfifo(fifo.c_str(), 0600), 0);
    std::thread writer([&] { std::ofstream(fifo, std::ios::binary) << bytes; });
    const TakeAnalysis a = analyseFile(fifo);
    writer.join();
    EXPECT_EQ(a.info.frames, 16000);
    ASSERT_TRUE(a.pitchSummary.medianHz);
    EXPECT_NEAR(*a.pitchSummary.medianHz, 220.0, 1.0);  // the tone's own frequency
}

}  // namespace
}  // namespace earmark
