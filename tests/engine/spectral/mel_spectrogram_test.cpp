// Mel spectrograms against numpy's own computation (np.pad + np.fft.rfft in
// float64 and the filterbank from the published formulas, written by
// tests/data/make_reference_data.py) of a chirp plus two sines, for the
// default (neural-TTS) settings in both frame layouts and for an HTK power/dB
// setting with a window shorter than the FFT.
#include "earmark/core/error.hpp"
#include "earmark/export/npy.hpp"
#include "earmark/spectral/mel.hpp"
#include "reference_data.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

namespace earmark {
namespace {

Signal referenceSignal(const nlohmann::json& ref) {
    const NpyArray a = readNpy(test::melDataPath(ref.at("signal").at("file")));
    return Signal{a.data, ref.at("signal").at("sampleRate").get<double>()};
}

const nlohmann::json& spectrogramEntry(const nlohmann::json& ref, const std::string& name) {
    for (const auto& e : ref.at("spectrograms"))
        if (e.at("name") == name) return e;
    throw std::runtime_error("no reference spectrogram " + name);
}

// Max |ours − numpy| over all values; fails on a shape mismatch.
double compareWithNumpy(const Spectrogram& ours, const nlohmann::json& entry) {
    const NpyArray expected = readNpy(test::melDataPath(entry.at("values")));
    EXPECT_EQ(expected.shape, (std::vector<std::int64_t>{ours.frames, ours.bins}));
    if (expected.data.size() != ours.values.size()) return INFINITY;
    double worst = 0.0;
    for (std::size_t i = 0; i < ours.values.size(); ++i)
        worst = std::max(worst, static_cast<double>(std::abs(ours.values[i] - expected.data[i])));
    ::testing::Test::RecordProperty(entry.at("name").get<std::string>() + "_max_abs_dev", test::formatG(worst));
    return worst;
}

TEST(MelSpectrogram, DefaultsAreTheCommonTtsSettingsAndMatchNumpy) {
    const nlohmann::json ref = test::melReference();
    const nlohmann::json& entry = spectrogramEntry(ref, "tts_centred");
    const MelParams defaults;
    const MelParams fromRef = test::melParamsFrom(entry);
    EXPECT_EQ(defaults.stft.fftSize, fromRef.stft.fftSize);
    EXPECT_EQ(defaults.stft.windowSize, fromRef.stft.windowSize);
    EXPECT_EQ(defaults.stft.hopSize, fromRef.stft.hopSize);
    EXPECT_EQ(defaults.bands, fromRef.bands);
    EXPECT_EQ(defaults.fminHz, fromRef.fminHz);
    EXPECT_EQ(defaults.fmaxHz, fromRef.fmaxHz);
    EXPECT_EQ(defaults.scale, fromRef.scale);
    EXPECT_EQ(defaults.normalisation, fromRef.normalisation);
    EXPECT_EQ(defaults.kind, fromRef.kind);
    EXPECT_EQ(defaults.log, fromRef.log);
    EXPECT_EQ(defaults.floor, fromRef.floor);

    const Spectrogram mel = computeMelSpectrogram(referenceSignal(ref));  // defaults
    EXPECT_EQ(mel.frames, 87);  // 22050/256 + 1
    EXPECT_TRUE(mel.timesSeconds.empty());
    // ln-magnitudes, float32 FFT against float64 numpy: the largest gaps sit in
    // near-silent bands (ln ≈ −8), where 5e-4 is ~1e-8 of the frame's peak.
    EXPECT_LT(compareWithNumpy(mel, entry), 5e-4);
}

TEST(MelSpectrogram, VocoderPaddedFramesMatchNumpy) {
    const nlohmann::json ref = test::melReference();
    const nlohmann::json& entry = spectrogramEntry(ref, "tts_vocoder");
    const Spectrogram mel = computeMelSpectrogram(referenceSignal(ref), test::melParamsFrom(entry));
    EXPECT_EQ(mel.frames, 86);  // 1 + (22050 + 2·384 − 1024)/256
    ASSERT_EQ(mel.timesSeconds.size(), 86u);
    EXPECT_DOUBLE_EQ(mel.timesSeconds[0], 128 / 22050.0);
    EXPECT_LT(compareWithNumpy(mel, entry), 5e-4);
}

TEST(MelSpectrogram, HtkPowerDecibelShortWindowMatchesNumpy) {
    const nlohmann::json ref = test::melReference();
    const nlohmann::json& entry = spectrogramEntry(ref, "htk_power_db");
    const MelParams params = test::melParamsFrom(entry);
    const Spectrogram mel = computeMelSpectrogram(referenceSignal(ref), params);
    EXPECT_EQ(mel.kind, SpectrumKind::Power);
    EXPECT_EQ(mel.log, LogScale::Decibel);
    EXPECT_LT(compareWithNumpy(mel, entry), 2e-3);  // dB
    const MelFilterbank fb = makeMelFilterbank(params, 22050);
    ASSERT_EQ(mel.binCentresHz.size(), 40u);
    for (int b = 0; b < 40; ++b)
        EXPECT_DOUBLE_EQ(mel.binCentresHz[static_cast<std::size_t>(b)], fb.edgesHz[static_cast<std::size_t>(b + 1)]);
}

TEST(MelSpectrogram, SparsePathEqualsDenseFilterbankOnTheLinearSpectrogram) {
    const Signal s = test::speechLike(1.0, 16000);
    MelParams params;
    params.fmaxHz = 7000;
    params.log = LogScale::None;
    const Spectrogram mel = computeMelSpectrogram(s, params);
    StftParams stft = params.stft;
    stft.kind = SpectrumKind::Magnitude;
    stft.log = LogScale::None;
    const Spectrogram lin = computeSpectrogram(s, stft);
    const MelFilterbank fb = makeMelFilterbank(params, s.sampleRate);
    ASSERT_EQ(mel.frames, lin.frames);
    for (int f = 0; f < mel.frames; ++f)
        for (int b = 0; b < fb.bands; ++b) {
            double dense = 0.0;
            for (int k = 0; k < fb.bins; ++k)
                dense += static_cast<double>(fb.weights[static_cast<std::size_t>(b * fb.bins + k)]) * lin.at(f, k);
            ASSERT_NEAR(mel.at(f, b), dense, 1e-5 * std::max(1e-3, dense)) << f << " " << b;
        }
}

TEST(MelSpectrogram, EmptyAndOneSampleSignals) {
    Signal s;
    s.sampleRate = 22050;
    Spectrogram mel = computeMelSpectrogram(s);
    EXPECT_EQ(mel.frames, 0);
    EXPECT_EQ(mel.bins, 80);
    EXPECT_EQ(mel.binCentresHz.size(), 80u);
    EXPECT_TRUE(mel.values.empty());
    s.samples = {0.25f};
    mel = computeMelSpectrogram(s);
    ASSERT_EQ(mel.frames, 1);
    for (float v : mel.values) EXPECT_TRUE(std::isfinite(v));
    MelParams vocoder;
    vocoder.stft.alignment = FrameAlignment::VocoderPadded;
    EXPECT_EQ(computeMelSpectrogram(s, vocoder).frames, 0);  // shorter than one frame
}

TEST(MelSpectrogram, SilenceSitsOnTheLogFloor) {
    const Spectrogram mel = computeMelSpectrogram(test::silence(0.2, 22050));
    ASSERT_GT(mel.frames, 0);
    for (float v : mel.values) ASSERT_FLOAT_EQ(v, std::log(1e-5f));
}

TEST(MelSpectrogram, ProgressAndCancel) {
    const Signal s = test::whiteNoise(4.0, 22050, 0.1);
    double last = -1;
    bool monotone = true;
    computeMelSpectrogram(s, {}, Progress([&](double f) {
        monotone = monotone && f >= last;
        last = f;
        return true;
    }));
    EXPECT_TRUE(monotone);
    EXPECT_DOUBLE_EQ(last, 1.0);
    int calls = 0;
    EXPECT_THROW(computeMelSpectrogram(s, {}, Progress([&](double) { return ++calls < 2; })), Cancelled);
}

TEST(MelSpectrogram, InvalidSignalRate) {
    Signal s = test::silence(0.1, 22050);
    s.sampleRate = -1;
    EXPECT_THROW(computeMelSpectrogram(s), ParamError);
}

}  // namespace
}  // namespace earmark
