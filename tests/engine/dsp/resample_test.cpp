// Resampling with libsoxr: a sine keeps its frequency and level, and a tone
// above the new Nyquist frequency is removed (libsoxr's HQ recipe promises
// >= 100 dB stop-band rejection; we check a conservative 60 dB).
#include "earmark/core/error.hpp"
#include "earmark/dsp/resample.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace earmark {
namespace {

double rms(const Signal& s, std::size_t skip) {
    double acc = 0;
    std::size_t n = 0;
    for (std::size_t i = skip; i + skip < s.size(); ++i, ++n) acc += double(s.samples[i]) * s.samples[i];
    return std::sqrt(acc / static_cast<double>(n));
}

// Level of the component at `hz`, by correlation with a complex exponential.
double toneAmplitude(const Signal& s, double hz, std::size_t skip) {
    double re = 0, im = 0;
    std::size_t n = 0;
    for (std::size_t i = skip; i + skip < s.size(); ++i, ++n) {
        const double ph = 2 * std::numbers::pi * hz * static_cast<double>(i) / s.sampleRate;
        re += s.samples[i] * std::cos(ph);
        im += s.samples[i] * std::sin(ph);
    }
    return 2 * std::hypot(re, im) / static_cast<double>(n);
}

TEST(Resample, SineKeepsFrequencyAndLevel) {
    const Signal in = test::sine(440, 1.0, 44100, 0.5);
    const Signal out = resample(in, 16000);
    EXPECT_DOUBLE_EQ(out.sampleRate, 16000);
    EXPECT_EQ(out.size(), 16000u);
    EXPECT_NEAR(toneAmplitude(out, 440, 400), 0.5, 0.005);
    EXPECT_NEAR(rms(out, 400), 0.5 / std::sqrt(2.0), 0.005);
}

TEST(Resample, RemovesContentAboveNewNyquist) {
    const Signal in = test::sine(10000, 1.0, 44100, 0.5);  // above 8 kHz
    const Signal out = resample(in, 16000);
    EXPECT_LT(rms(out, 400), 0.5 * 1e-3);  // at least 60 dB down
}

TEST(Resample, SameRateIsACopyAndEmptyStaysEmpty) {
    const Signal in = test::sine(100, 0.1, 8000);
    EXPECT_EQ(resample(in, 8000).samples, in.samples);
    Signal empty;
    empty.sampleRate = 8000;
    EXPECT_TRUE(resample(empty, 16000).empty());
    EXPECT_THROW(resample(in, 0), ParamError);
}

}  // namespace
}  // namespace earmark

namespace earmark {
namespace {

// Streaming through libsoxr must not shift the signal in time: a click stays
// at its time (within one output sample) at the start, middle and end.
TEST(Resample, KeepsEventsInPlace) {
    Signal in = test::silence(3.0, 44100);
    for (double t : {0.05, 1.5, 2.95}) in.samples[static_cast<std::size_t>(t * 44100)] = 1.0f;
    const Signal out = resample(in, 16000);
    ASSERT_EQ(out.size(), 48000u);
    for (double t : {0.05, 1.5, 2.95}) {
        const auto centre = static_cast<std::size_t>(t * 16000);
        std::size_t best = centre - 20;
        for (std::size_t i = centre - 20; i <= centre + 20; ++i)
            if (std::fabs(out.samples[i]) > std::fabs(out.samples[best])) best = i;
        EXPECT_NEAR(static_cast<double>(best), t * 16000, 1.0) << "click at " << t << " s";
    }
}

}  // namespace
}  // namespace earmark
