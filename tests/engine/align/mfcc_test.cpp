// MFCCs: the DCT-II of the log mel spectrogram (Davis & Mermelstein 1980),
// checked against a naive orthonormal DCT-II written here from its
// definition (Ahmed, Natarajan & Rao, "Discrete cosine transform", IEEE
// Trans. Computers C-23, 1974): c_k = s_k · Σ_b x_b · cos(π k (b + ½) / B),
// s_0 = √(1/B), s_k = √(2/B). Plus mean normalisation and the take/reference matching.
#include "earmark/align/mfcc.hpp"
#include "earmark/core/error.hpp"
#include "earmark/spectral/mel.hpp"
#include "earmark/dsp/resample.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace earmark {
namespace {

// The mel spectrogram mfcc.hpp documents: HTK scale, power, natural log, Hamming.
Spectrogram documentedLogMel(const Signal& x, const MfccParams& p) {
    MelParams mel;
    mel.stft.fftSize = p.fftSize;
    mel.stft.windowSize = static_cast<int>(std::lround(p.windowSeconds * p.sampleRateHz));
    mel.stft.hopSize = static_cast<int>(std::lround(p.hopSeconds * p.sampleRateHz));
    mel.stft.window = WindowShape::Hamming;
    mel.bands = p.bands;
    mel.fminHz = p.fminHz;
    mel.fmaxHz = p.fmaxHz;
    mel.scale = MelScale::Htk;
    mel.normalisation = MelNormalisation::None;
    mel.kind = SpectrumKind::Power;
    mel.log = LogScale::Natural;
    mel.floor = 1e-12;
    return computeMelSpectrogram(resample(x, p.sampleRateHz), mel);
}

Signal testSignal() {
    return test::concat({test::sine(440, 0.3, 16000, 0.5), test::whiteNoise(0.2, 16000, 0.1), test::sine(1200, 0.3, 16000, 0.2)});
}

TEST(Mfcc, MatchesANaiveDctOfTheLogMelSpectrogram) {
    MfccParams p;
    p.meanNormalise = false;
    p.dynamicRangeDb = 1000.0;  // no floor beyond the log's own
    const Signal x = testSignal();
    const FeatureMatrix f = computeMfcc(x, p);
    const Spectrogram mel = documentedLogMel(x, p);
    ASSERT_EQ(f.frames, mel.frames);
    ASSERT_EQ(f.dims, 13);
    EXPECT_DOUBLE_EQ(f.hopSeconds, 0.005);
    const int B = p.bands;
    for (int t = 0; t < f.frames; t += 7) {
        for (int k = 0; k < f.dims; ++k) {
            double c = 0.0;
            for (int b = 0; b < B; ++b) c += mel.at(t, b) * std::cos(std::numbers::pi * k * (b + 0.5) / B);
            c *= std::sqrt((k == 0 ? 1.0 : 2.0) / B);
            EXPECT_NEAR(f.row(t)[k], c, 1e-3 * (1.0 + std::fabs(c))) << "frame " << t << " c" << k;
        }
    }
}

TEST(Mfcc, AllCoefficientsKeepTheEnergy) {
    // An orthonormal DCT preserves the sum of squares (Parseval).
    MfccParams p;
    p.meanNormalise = false;
    p.dynamicRangeDb = 1000.0;
    p.coefficients = p.bands;
    const Signal x = testSignal();
    const FeatureMatrix f = computeMfcc(x, p);
    const Spectrogram mel = documentedLogMel(x, p);
    for (int t = 0; t < f.frames; t += 11) {
        double a = 0.0, b = 0.0;
        for (int k = 0; k < f.dims; ++k) a += double(f.row(t)[k]) * f.row(t)[k];
        for (int k = 0; k < p.bands; ++k) b += double(mel.at(t, k)) * mel.at(t, k);
        EXPECT_NEAR(a, b, 1e-4 * b);
    }
}

TEST(Mfcc, MeanNormalisationRemovesAFixedGain) {
    // A gain is a constant added to every log mel value: only c0 moves, and
    // mean normalisation removes it (the dynamic-range floor is relative too).
    const Signal x = testSignal();
    Signal louder = x;
    for (float& v : louder.samples) v *= 0.25f;
    const FeatureMatrix a = computeMfcc(x), b = computeMfcc(louder);
    ASSERT_EQ(a.frames, b.frames);
    for (int k = 0; k < a.dims; ++k) {
        double mean = 0.0;
        for (int t = 0; t < a.frames; ++t) mean += a.row(t)[k];
        EXPECT_NEAR(mean / a.frames, 0.0, 1e-3);
        for (int t = 0; t < a.frames; t += 13) EXPECT_NEAR(a.row(t)[k], b.row(t)[k], 2e-3) << t << " " << k;
    }
}

TEST(Mfcc, MatchingMakesTheReferencesSilenceLookLikeTheTakesNoise) {
    // Take: a tone in steady noise; reference: the same tone 20 dB louder in
    // digital silence. After matching, silence frames of both are close and
    // the tone frames agree much better than without matching.
    const double rate = 16000;
    Signal take = test::concat({test::silence(0.5, rate), test::sine(500, 0.5, rate, 0.05), test::silence(0.5, rate)});
    const Signal noise = test::whiteNoise(1.5, rate, 0.002, 4);
    for (std::size_t i = 0; i < take.size(); ++i) take.samples[i] += noise.samples[i];
    const Signal ref = test::concat({test::silence(0.5, rate), test::sine(500, 0.5, rate, 0.5), test::silence(0.5, rate)});
    const auto distance = [](const FeatureMatrix& a, int i, const FeatureMatrix& b, int j) {
        double acc = 0.0;
        for (int k = 0; k < a.dims; ++k) acc += (a.row(i)[k] - b.row(j)[k]) * (a.row(i)[k] - b.row(j)[k]);
        return std::sqrt(acc);
    };
    const MfccPair matched = computeMatchedMfcc(take, ref);
    const FeatureMatrix plainTake = computeMfcc(take), plainRef = computeMfcc(ref);
    const int silence = 40, tone = 150;  // frames at 5 ms: 0.2 s and 0.75 s
    EXPECT_LT(distance(matched.take, silence, matched.reference, silence),
              0.5 * distance(plainTake, silence, plainRef, silence));
    EXPECT_LT(distance(matched.take, tone, matched.reference, tone), distance(plainTake, tone, plainRef, tone));
}

TEST(Mfcc, EdgeCasesAndBadParams) {
    EXPECT_EQ(computeMfcc(Signal{{}, 16000}).frames, 0);
    MfccParams p;
    p.coefficients = 41;
    EXPECT_THROW(computeMfcc(testSignal(), p), ParamError);
    p = {};
    p.fmaxHz = 9000;
    EXPECT_THROW(computeMfcc(testSignal(), p), ParamError);
    p = {};
    p.windowSeconds = 0.05;  // 800 samples > fft 512
    EXPECT_THROW(computeMfcc(testSignal(), p), ParamError);
    EXPECT_THROW(computeMfcc(Signal{{0.0f}, 0.0}), ParamError);
}

}  // namespace
}  // namespace earmark
