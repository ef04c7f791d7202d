// The playback stream: what a block-by-block reader hears equals the whole
// WSOLA stretch (Verhelst & Roelands 1993) and the cross-faded loop of
// loop.hpp, and the playhead it reports lands on the sound being heard at
// any rate — checked on tone pips placed at known times.
#include "earmark/core/error.hpp"
#include "earmark/playback/loop.hpp"
#include "earmark/playback/playback_stream.hpp"
#include "earmark/playback/time_stretch.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <vector>

namespace earmark {
namespace {

constexpr double sr = 16000.0;

// 4 s of quiet noise-free silence with 30 ms pips of 440 Hz at `at` seconds.
Signal pips(const std::vector<double>& at) {
    Signal s;
    s.sampleRate = sr;
    s.samples.assign(static_cast<std::size_t>(4 * sr), 0.0f);
    for (double t0 : at)
        for (std::size_t i = 0; i < static_cast<std::size_t>(0.03 * sr); ++i)
            s.samples[static_cast<std::size_t>(t0 * sr) + i] =
                static_cast<float>(0.5 * std::sin(2 * std::numbers::pi * 440.0 * static_cast<double>(i) / sr));
    return s;
}

// Reads `total` samples in blocks of uneven sizes (as a sound device asks).
std::vector<float> readAll(PlaybackStream& stream, std::size_t total) {
    std::vector<float> out(total);
    std::size_t n = 0, block = 1;
    while (n < total) {
        const std::size_t got = stream.read(out.data() + n, std::min(block, total - n));
        if (got == 0) break;
        n += got;
        block = block * 7 % 1013 + 1;
    }
    out.resize(n);
    return out;
}

Signal voiced() {
    Signal s;
    s.sampleRate = sr;
    s.samples.resize(static_cast<std::size_t>(1.5 * sr));
    for (std::size_t i = 0; i < s.samples.size(); ++i) {
        const double t = static_cast<double>(i) / sr;
        s.samples[i] = static_cast<float>(0.3 * std::sin(2 * std::numbers::pi * 130 * t) + 0.1 * std::sin(2 * std::numbers::pi * 390 * t + 1));
    }
    return s;
}

TEST(PlaybackStream, ReadInBlocksEqualsTheWholeStretch) {
    const Signal take = voiced();
    for (double rate : {0.25, 0.5, 1.0, 1.5, 2.0}) {
        PlaybackParams p;
        p.stretch.rate = rate;
        PlaybackStream stream(take, {0.2, 1.3, false}, p);
        Signal span;
        span.sampleRate = sr;
        span.samples.assign(take.samples.begin() + static_cast<std::ptrdiff_t>(0.2 * sr), take.samples.begin() + static_cast<std::ptrdiff_t>(1.3 * sr));
        const Signal whole = timeStretch(span, p.stretch);
        const auto heard = readAll(stream, whole.size() + 500);  // asks past the end: stops there
        ASSERT_EQ(heard.size(), whole.size()) << rate;
        EXPECT_EQ(heard, whole.samples) << rate;
        // Duration scales by 1/rate (issue 16: within 1 %).
        EXPECT_NEAR(static_cast<double>(heard.size()) / sr, 1.1 / rate, 0.01 * 1.1 / rate);
    }
}

TEST(PlaybackStream, ALoopEqualsTheCrossFadedLoopOfTheStretch) {
    const Signal take = voiced();
    PlaybackParams p;
    p.stretch.rate = 0.5;
    p.crossfadeSeconds = 0.01;
    PlaybackStream stream(take, {0.3, 0.7, true}, p);
    Signal span;
    span.sampleRate = sr;
    span.samples.assign(take.samples.begin() + static_cast<std::ptrdiff_t>(0.3 * sr), take.samples.begin() + static_cast<std::ptrdiff_t>(0.7 * sr));
    const Signal expected = renderLoop(timeStretch(span, p.stretch), p.crossfadeSeconds, 3);
    const auto heard = readAll(stream, expected.size());
    ASSERT_EQ(heard.size(), expected.size());
    for (std::size_t i = 0; i < heard.size(); ++i) ASSERT_NEAR(heard[i], expected.samples[i], 1e-6) << i;
    EXPECT_EQ(stream.passLength(), static_cast<std::int64_t>(std::llround(0.4 / 0.5 * sr)) - 160);
}

TEST(PlaybackStream, ThePlayheadIsWhereTheHeardSoundIsInTheTake) {
    const std::vector<double> truth = {0.5, 1.25, 2.0, 3.1};
    const Signal take = pips(truth);
    for (double rate : {0.25, 0.5, 1.0, 2.0}) {
        PlaybackParams p;
        p.stretch.rate = rate;
        PlaybackStream stream(take, {0.4, 3.9, false}, p);
        const auto heard = readAll(stream, static_cast<std::size_t>(4 * sr / rate));
        // Each pip's onset in the output, mapped back, is the pip's time in the take.
        std::size_t found = 0;
        for (std::size_t i = 1; i < heard.size(); ++i) {
            if (std::fabs(heard[i]) > 0.05 && std::fabs(heard[i - 1]) <= 0.05) {
                bool fresh = true;  // skip zero crossings inside a pip
                for (std::size_t j = i >= 400 ? i - 400 : 0; j + 1 < i; ++j) fresh = fresh && std::fabs(heard[j]) <= 0.05;
                if (!fresh) continue;
                const auto at = stream.takeSecondsAt(static_cast<std::int64_t>(i));
                ASSERT_TRUE(at);
                ASSERT_LT(found, truth.size());
                // Within WSOLA's search tolerance (10 ms) plus one frame's ramp (30 ms).
                EXPECT_NEAR(*at, truth[found], 0.04) << "rate " << rate;
                ++found;
            }
        }
        EXPECT_EQ(found, truth.size()) << rate;  // all four pips inside the span
        EXPECT_FALSE(stream.takeSecondsAt(static_cast<std::int64_t>(heard.size())));  // past the end
    }
}

TEST(PlaybackStream, ALoopsPlayheadWrapsToTheStartAtEachPass) {
    const Signal take = voiced();
    PlaybackParams p;
    p.stretch.rate = 0.5;
    PlaybackStream stream(take, {0.25, 0.75, true}, p);
    const std::int64_t pass = stream.passLength();
    EXPECT_DOUBLE_EQ(*stream.takeSecondsAt(0), 0.25);
    EXPECT_DOUBLE_EQ(*stream.takeSecondsAt(pass), 0.25);
    EXPECT_DOUBLE_EQ(*stream.takeSecondsAt(5 * pass + 1600), 0.25 + 1600 * 0.5 / sr);
    // The last sample of a pass plays just before the fade, short of the span's end by the fade × rate.
    EXPECT_NEAR(*stream.takeSecondsAt(pass - 1), 0.75 - p.crossfadeSeconds * 0.5, 1e-3);
}

TEST(PlaybackStream, BadSpansAndFadesAreParamErrors) {
    const Signal take = voiced();
    EXPECT_THROW(PlaybackStream(take, {1.0, 1.0, false}, {}), ParamError);
    EXPECT_THROW(PlaybackStream(take, {-0.1, 1.0, false}, {}), ParamError);
    EXPECT_THROW(PlaybackStream(take, {0.0, 2.0, false}, {}), ParamError);
    PlaybackParams p;
    p.crossfadeSeconds = -0.01;
    EXPECT_THROW(PlaybackStream(take, {0.0, 1.0, true}, p), ParamError);
    p = {};
    p.stretch.rate = 3.0;
    EXPECT_THROW(PlaybackStream(take, {0.0, 1.0, false}, p), ParamError);
}

}  // namespace
}  // namespace earmark
