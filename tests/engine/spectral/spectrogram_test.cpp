// STFT spectrograms against a naive DFT oracle written here (direct summation
// of the DFT definition over frames padded by an independent np.pad-style
// helper), against the closed-form DFT of a periodic Hann window, and for the
// time convention, frame counts, log scales, edge cases and parameter checks.
#include "earmark/core/error.hpp"
#include "earmark/spectral/spectrogram.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <cstdio>
#include <numbers>
#include <vector>

namespace earmark {
namespace {

// Sample i of `x` extended by padding: reflection about the end samples
// (x[-1] = x[1]), as numpy's np.pad(mode="reflect") for pads shorter than x.
double padded(const std::vector<float>& x, long i, FramePadding padding) {
    const long n = static_cast<long>(x.size());
    if (i >= 0 && i < n) return x[static_cast<std::size_t>(i)];
    if (padding == FramePadding::Zeros) return 0.0;
    const long j = i < 0 ? -i : 2 * (n - 1) - i;
    return x[static_cast<std::size_t>(j)];
}

// |X[k]| of every frame by direct summation, frame-major.
std::vector<double> oracleMagnitudes(const std::vector<float>& x, const StftParams& p, long frames) {
    const int n = p.fftSize, bins = n / 2 + 1, off = (n - p.windowSize) / 2;
    const long padLeft = p.alignment == FrameAlignment::Centred ? n / 2 : (n - p.hopSize) / 2;
    std::vector<double> window(static_cast<std::size_t>(p.windowSize));
    for (int j = 0; j < p.windowSize; ++j) {
        const double c = std::cos(2.0 * std::numbers::pi * j / p.windowSize);  // periodic form
        window[static_cast<std::size_t>(j)] = p.window == WindowShape::Hann ? 0.5 - 0.5 * c : 0.54 - 0.46 * c;
    }
    std::vector<double> out;
    std::vector<double> buf(static_cast<std::size_t>(n));
    for (long f = 0; f < frames; ++f) {
        std::fill(buf.begin(), buf.end(), 0.0);
        for (int j = 0; j < p.windowSize; ++j)
            buf[static_cast<std::size_t>(off + j)] =
                window[static_cast<std::size_t>(j)] * padded(x, f * p.hopSize - padLeft + off + j, p.padding);
        for (int k = 0; k < bins; ++k) {
            std::complex<double> acc = 0;
            for (int t = 0; t < n; ++t) {
                const double angle = -2.0 * std::numbers::pi * static_cast<double>((static_cast<long>(k) * t) % n) / n;
                acc += buf[static_cast<std::size_t>(t)] * std::complex<double>(std::cos(angle), std::sin(angle));
            }
            out.push_back(std::abs(acc));
        }
    }
    return out;
}

Signal toneAndNoise(double seconds, double rate) {
    Signal s = test::sine(523.0, seconds, rate, 0.4);
    const Signal noise = test::whiteNoise(seconds, rate, 0.05, 9);
    for (std::size_t i = 0; i < s.size(); ++i) s.samples[i] += noise.samples[i];
    return s;
}

void expectMatchesOracle(const Signal& s, const StftParams& p) {
    const Spectrogram spec = computeSpectrogram(s, p);
    const std::vector<double> oracle = oracleMagnitudes(s.samples, p, spec.frames);
    ASSERT_EQ(spec.values.size(), oracle.size());
    const double peak = *std::max_element(oracle.begin(), oracle.end());
    double worst = 0.0;
    for (std::size_t i = 0; i < oracle.size(); ++i) worst = std::max(worst, std::abs(spec.values[i] - oracle[i]));
    // float32 FFT against a float64 sum: errors of a few float epsilons of the peak.
    EXPECT_LT(worst / peak, 2e-6) << "worst " << worst << " of peak " << peak;
    char text[32];
    std::snprintf(text, sizeof text, "%.3g", worst / peak);
    ::testing::Test::RecordProperty("max_abs_dev_over_peak", text);
}

StftParams linearMagnitude(int fft, int win, int hop) {
    StftParams p;
    p.fftSize = fft;
    p.windowSize = win;
    p.hopSize = hop;
    p.kind = SpectrumKind::Magnitude;
    p.log = LogScale::None;
    return p;
}

TEST(Spectrogram, CentredReflectMatchesNaiveDft) {
    expectMatchesOracle(toneAndNoise(0.2, 16000), linearMagnitude(512, 400, 160));
}

TEST(Spectrogram, VocoderPaddedZerosMatchesNaiveDft) {
    StftParams p = linearMagnitude(256, 256, 64);
    p.alignment = FrameAlignment::VocoderPadded;
    p.padding = FramePadding::Zeros;
    expectMatchesOracle(toneAndNoise(0.1, 16000), p);
}

TEST(Spectrogram, OddHammingWindowCentredInFftMatchesNaiveDft) {
    StftParams p = linearMagnitude(512, 301, 128);
    p.window = WindowShape::Hamming;
    expectMatchesOracle(toneAndNoise(0.1, 16000), p);
}

TEST(Spectrogram, BinCentredSineHasClosedFormHannPeak) {
    // The DFT of a length-N periodic Hann window is N/2 at bin 0 and −N/4 at
    // bins ±1, zero elsewhere; a sine of amplitude A on bin k therefore reads
    // A·N/4 at k and A·N/8 at k ± 1 (DFT algebra).
    const double rate = 16000, amplitude = 0.5;
    const int n = 512, k = 32;  // 1000 Hz
    StftParams p = linearMagnitude(n, n, 128);
    const Spectrogram spec = computeSpectrogram(test::sine(k * rate / n, 0.5, rate, amplitude), p);
    const int frame = spec.frames / 2;
    EXPECT_NEAR(spec.at(frame, k), amplitude * n / 4, 1e-3);
    EXPECT_NEAR(spec.at(frame, k - 1), amplitude * n / 8, 1e-3);
    EXPECT_NEAR(spec.at(frame, k + 1), amplitude * n / 8, 1e-3);
    EXPECT_NEAR(spec.at(frame, k + 5), 0.0, 1e-3);
    EXPECT_DOUBLE_EQ(spec.binCentresHz[static_cast<std::size_t>(k)], 1000.0);
    EXPECT_DOUBLE_EQ(spec.binCentresHz.back(), rate / 2);
}

TEST(Spectrogram, FrameCountsFollowTheDocumentedConventions) {
    for (std::size_t n : {1u, 255u, 256u, 257u, 22050u}) {
        Signal s;
        s.sampleRate = 22050;
        s.samples.assign(n, 0.1f);
        StftParams p;  // 1024 / 256
        EXPECT_EQ(computeSpectrogram(s, p).frames, static_cast<int>(n / 256 + 1)) << n;
        p.alignment = FrameAlignment::VocoderPadded;
        const long padded = static_cast<long>(n) + 2 * 384;
        EXPECT_EQ(computeSpectrogram(s, p).frames, padded >= 1024 ? static_cast<int>(1 + (padded - 1024) / 256) : 0)
            << n;
    }
}

// Frame with the most energy: where a click sits.
int loudestFrame(const Spectrogram& spec) {
    int best = 0;
    double bestEnergy = -1;
    for (int f = 0; f < spec.frames; ++f) {
        double e = 0;
        for (int k = 0; k < spec.bins; ++k) e += spec.at(f, k);
        if (e > bestEnergy) {
            bestEnergy = e;
            best = f;
        }
    }
    return best;
}

TEST(Spectrogram, ClickAtHalfSecondPeaksInFrameHalfSecondOverHop) {
    Signal s = test::silence(1.0, 16000);
    s.samples[8000] = 1.0f;  // t = 0.5 s
    StftParams p = linearMagnitude(512, 512, 160);
    p.kind = SpectrumKind::Power;
    const Spectrogram spec = computeSpectrogram(s, p);
    EXPECT_TRUE(spec.timesSeconds.empty());
    EXPECT_DOUBLE_EQ(spec.hopSeconds, 0.01);
    EXPECT_EQ(loudestFrame(spec), 50);  // 0.5 · 16000 / 160
    EXPECT_DOUBLE_EQ(spec.frameTime(50), 0.5);
}

TEST(Spectrogram, VocoderPaddedFramesReportTheirCentres) {
    Signal s = test::silence(1.0, 22050);
    StftParams p;  // 1024 / 256: frame i starts at i·256 − 384, centred at i·256 + 128
    p.alignment = FrameAlignment::VocoderPadded;
    p.padding = FramePadding::Zeros;
    const int clickFrame = 40;
    s.samples[static_cast<std::size_t>(clickFrame * 256 + 128)] = 1.0f;
    const Spectrogram spec = computeSpectrogram(s, p);
    ASSERT_EQ(spec.timesSeconds.size(), static_cast<std::size_t>(spec.frames));
    for (int f = 0; f < spec.frames; ++f) EXPECT_DOUBLE_EQ(spec.timesSeconds[static_cast<std::size_t>(f)], (f * 256 + 128) / 22050.0);
    EXPECT_EQ(loudestFrame(spec), clickFrame);
}

TEST(Spectrogram, DecibelAndNaturalLogAgreeWithLinearValues) {
    const Signal s = toneAndNoise(0.2, 16000);
    StftParams p = linearMagnitude(512, 512, 160);
    const Spectrogram mag = computeSpectrogram(s, p);
    p.kind = SpectrumKind::Power;
    const Spectrogram pow = computeSpectrogram(s, p);
    p.log = LogScale::Decibel;
    p.floor = 0.0;  // |X| < 1 (noise-only bins) floored, the tone's bins not
    const Spectrogram powDb = computeSpectrogram(s, p);
    p.kind = SpectrumKind::Magnitude;
    const Spectrogram magDb = computeSpectrogram(s, p);
    p.log = LogScale::Natural;
    p.floor = 1.0;
    const Spectrogram magLn = computeSpectrogram(s, p);
    int floored = 0, above = 0;
    for (std::size_t i = 0; i < mag.values.size(); ++i) {
        const double m = mag.values[i];
        EXPECT_NEAR(pow.values[i], m * m, 1e-5 * std::max(1.0, m * m));
        const double db = std::max(0.0, 20.0 * std::log10(std::max(m, 1e-30)));
        EXPECT_NEAR(magDb.values[i], db, 1e-3);
        EXPECT_NEAR(powDb.values[i], db, 1e-3);  // 10·log10(|X|²) = 20·log10|X|
        EXPECT_NEAR(magLn.values[i], std::log(std::max(m, 1.0)), 1e-4);
        (magDb.values[i] == 0.0f ? floored : above) += 1;
    }
    EXPECT_GT(floored, 0);
    EXPECT_GT(above, 0);
    EXPECT_EQ(magDb.log, LogScale::Decibel);
}

TEST(Spectrogram, SilenceSitsExactlyOnTheDecibelFloor) {
    StftParams p;
    p.floor = -90.0;
    const Spectrogram spec = computeSpectrogram(test::silence(0.1, 16000), p);
    ASSERT_GT(spec.frames, 0);
    for (float v : spec.values) ASSERT_EQ(v, -90.0f);
}

TEST(Spectrogram, EmptySignalGivesNoFramesButDescribesBins) {
    Signal s;
    s.sampleRate = 16000;
    const Spectrogram spec = computeSpectrogram(s);
    EXPECT_EQ(spec.frames, 0);
    EXPECT_EQ(spec.bins, 513);
    EXPECT_EQ(spec.binCentresHz.size(), 513u);
    EXPECT_TRUE(spec.values.empty());
}

TEST(Spectrogram, OneSampleSignalGivesOneFiniteFrame) {
    Signal s;
    s.sampleRate = 16000;
    s.samples = {0.5f};
    for (FramePadding padding : {FramePadding::Reflect, FramePadding::Zeros}) {
        StftParams p = linearMagnitude(64, 64, 16);
        p.padding = padding;
        const Spectrogram spec = computeSpectrogram(s, p);
        ASSERT_EQ(spec.frames, 1);
        // Reflecting one sample repeats it over the whole frame (a DC of 0.5
        // under the window, sum = 0.5·32); zero padding keeps one windowed
        // sample at the window's peak.
        EXPECT_NEAR(spec.at(0, 0), padding == FramePadding::Reflect ? 16.0 : 0.5, 1e-5);
    }
}

TEST(Spectrogram, ProgressRisesToOneAndCancelStops) {
    const Signal s = test::whiteNoise(3.0, 16000, 0.1);
    std::vector<double> seen;
    computeSpectrogram(s, {}, Progress([&](double f) { seen.push_back(f); return true; }));
    ASSERT_GE(seen.size(), 2u);
    EXPECT_TRUE(std::is_sorted(seen.begin(), seen.end()));
    EXPECT_DOUBLE_EQ(seen.back(), 1.0);
    int calls = 0;
    EXPECT_THROW(computeSpectrogram(s, {}, Progress([&](double) { return ++calls < 2; })), Cancelled);
}

void expectParamError(const StftParams& p, const std::string& field, double rate = 16000) {
    Signal s = test::silence(0.1, 16000);
    s.sampleRate = rate;
    try {
        computeSpectrogram(s, p);
        ADD_FAILURE() << "no error for " << field;
    } catch (const ParamError& e) {
        EXPECT_EQ(e.subject(), field) << e.what();
    }
}

TEST(Spectrogram, InvalidParamsNameTheField) {
    StftParams p;
    p.fftSize = 1;
    expectParamError(p, "StftParams.fftSize");
    p = {};
    p.windowSize = 2048;
    expectParamError(p, "StftParams.windowSize");
    p = {};
    p.windowSize = 0;
    expectParamError(p, "StftParams.windowSize");
    p = {};
    p.hopSize = 0;
    expectParamError(p, "StftParams.hopSize");
    p = {};
    p.alignment = FrameAlignment::VocoderPadded;
    p.hopSize = 2048;
    expectParamError(p, "StftParams.hopSize");
    p = {};
    p.log = LogScale::Natural;
    p.floor = 0.0;
    expectParamError(p, "StftParams.floor");
    p = {};
    p.floor = std::nan("");
    expectParamError(p, "StftParams.floor");
    expectParamError(StftParams{}, "Signal.sampleRate", 0.0);
}

}  // namespace
}  // namespace earmark
