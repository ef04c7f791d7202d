// The artefact detectors on small synthetic signals: silence, a steady
// voice, one planted fault each, and invalid input.
#include "planting.hpp"

#include "support/test_signals.hpp"

#include "earmark/artefacts/buzz.hpp"
#include "earmark/artefacts/clicks.hpp"
#include "earmark/artefacts/dropouts.hpp"
#include "earmark/artefacts/noise_bursts.hpp"
#include "earmark/core/error.hpp"

#include <gtest/gtest.h>

namespace earmark {
namespace {

// 1.5 s of a steady synthetic vowel at 140 Hz, 22.05 kHz, with its tracks.
test::VoiceTake steadyVoice() {
    using K = test::VoiceSegment::Kind;
    test::VoiceTake t;
    t.signal = test::synthesiseVoice({{K::Voiced, 1.5, 140, 140, 0.3}}, 22050).signal;
    test::measure(t);
    return t;
}

TEST(ArtefactDetectors, SilenceAndEmptySignalsHaveNoEvents) {
    Signal silence{std::vector<float>(22050, 0.0f), 22050.0};
    const PitchTrack pitch = analysePitch(silence);
    EXPECT_TRUE(findClicks(silence, -120.0).empty());
    EXPECT_TRUE(findNoiseBursts(silence, pitch, -120.0).empty());
    EXPECT_TRUE(findBuzz(silence, pitch, -120.0).empty());
    EXPECT_TRUE(findDropouts(silence, pitch, -120.0).empty());
    Signal empty{{}, 22050.0};
    EXPECT_TRUE(findClicks(empty, -20.0).empty());
    EXPECT_TRUE(findDropouts(empty, pitch, -20.0).empty());
}

TEST(ArtefactDetectors, SteadyVoiceIsClean) {
    const auto t = steadyVoice();
    EXPECT_TRUE(findClicks(t.signal, t.speechLevelDb).empty());
    EXPECT_TRUE(findNoiseBursts(t.signal, t.pitch, t.speechLevelDb).empty());
    EXPECT_TRUE(findBuzz(t.signal, t.pitch, t.speechLevelDb).empty());
    EXPECT_TRUE(findDropouts(t.signal, t.pitch, t.speechLevelDb).empty());
}

// A band-limited vowel-like tone (220, 660 and 1320 Hz). The synthetic voice
// above has an unfiltered pulse source: every period is itself a click.
Signal smoothTone() {
    Signal s = test::sine(220, 1.5, 22050, 0.3);
    const Signal b = test::sine(660, 1.5, 22050, 0.15), c = test::sine(1320, 1.5, 22050, 0.05);
    for (std::size_t i = 0; i < s.size(); ++i) s.samples[i] += b.samples[i] + c.samples[i];
    return s;
}

TEST(ArtefactDetectors, OneClickIsFoundAtItsSampleWithItsSize) {
    test::VoiceTake t;
    t.signal = smoothTone();
    test::measure(t);
    EXPECT_TRUE(findClicks(t.signal, t.speechLevelDb).empty());
    test::plantClick(t.signal, 0.7, -14.0, false);
    const auto events = findClicks(t.signal, t.speechLevelDb);
    ASSERT_EQ(events.size(), 1u);
    EXPECT_NEAR(0.5 * (events[0].startS + events[0].endS), 0.7, 0.001);
    // The tone is predicted almost exactly, so the scale is its floor (speech
    // level − 30 dB) and the interpolation error reads the impulse's own size.
    const double floor = std::pow(10.0, (t.speechLevelDb - ClickParams{}.floorBelowSpeechDb) / 20.0);
    EXPECT_NEAR(events[0].value, std::pow(10.0, -14.0 / 20.0) / floor, 0.05 * events[0].value);
}

TEST(ArtefactDetectors, DropoutInsideTheVowelIsFoundWithItsSpan) {
    auto t = steadyVoice();
    test::plantDropout(t.signal, 0.7, 0.04);
    test::measure(t);
    const auto events = findDropouts(t.signal, t.pitch, t.speechLevelDb);
    ASSERT_EQ(events.size(), 1u);
    EXPECT_NEAR(events[0].startS, 0.7, 0.002);
    EXPECT_NEAR(events[0].endS, 0.74, 0.002);
    EXPECT_GT(events[0].value, 100.0);  // digital silence: far below any threshold
}

// Gaps shorter than DropoutParams::minSeconds (15 ms) are left out: the
// length of espeak-ng's shortest silent stop closures (dropouts.hpp).
TEST(ArtefactDetectors, GapsShorterThanTheShortestDropoutAreLeftOut) {
    auto t = steadyVoice();
    test::plantDropout(t.signal, 0.7, 0.01);
    test::measure(t);
    EXPECT_TRUE(findDropouts(t.signal, t.pitch, t.speechLevelDb).empty());
    EXPECT_EQ(findDropouts(t.signal, t.pitch, t.speechLevelDb, DropoutParams{.minSeconds = 0.004}).size(), 1u);
}

TEST(ArtefactDetectors, NoiseUnderTheVowelsEnvelopeIsBuzz) {
    auto t = steadyVoice();
    test::plantNoiseForHarmonics(t.signal, 0.6, 0.15, 7);
    test::measure(t);
    const auto events = findBuzz(t.signal, t.pitch, t.speechLevelDb);
    ASSERT_EQ(events.size(), 1u);
    EXPECT_LT(events[0].startS, 0.75);
    EXPECT_GT(events[0].endS, 0.6);
}

TEST(ArtefactDetectors, BadParametersAndRatesNameTheField) {
    const auto t = steadyVoice();
    try {
        findClicks(t.signal, t.speechLevelDb, ClickParams{.minRatio = 0.0});
        FAIL() << "no error";
    } catch (const ParamError& e) {
        EXPECT_EQ(e.subject(), "ClickParams.minRatio");
    }
    EXPECT_THROW(findNoiseBursts(t.signal, t.pitch, t.speechLevelDb, NoiseBurstParams{.bandHz = 10.0}), ParamError);
    EXPECT_THROW(findBuzz(t.signal, PitchTrack{}, t.speechLevelDb), ParamError);
    EXPECT_THROW(findDropouts(Signal{{0.0f}, 0.0}, t.pitch, -20.0), ParamError);
}

}  // namespace
}  // namespace earmark
