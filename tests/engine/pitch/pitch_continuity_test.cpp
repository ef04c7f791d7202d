// The continuity step on hand-made candidate lists: it must remove isolated
// octave jumps and voiced blips, bridge short voicing holes, and keep real F0
// movement (a 1-semitone-per-frame glide, an octave step across a gap).
// The rules themselves are Earmark's (pitch_continuity.hpp); the octave and
// semitone relations (2:1, 2^(1/12)) are the musical definitions.
#include "earmark/core/error.hpp"
#include "earmark/pitch/pitch_continuity.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <vector>

namespace earmark {
namespace {

// A frame whose YIN pick is (lag, ap) with further candidates.
PitchCandidates frame(std::initializer_list<YinDip> dips) {
    PitchCandidates c;
    for (const auto& d : dips) c.dips[static_cast<std::size_t>(c.count++)] = d;
    return c;
}

float chosenLag(const std::vector<PitchCandidates>& c, const std::vector<std::uint8_t>& choice, std::size_t i) {
    return choice[i] == kUnvoiced ? 0.0f : c[i].dips[choice[i]].lag;
}

TEST(PitchContinuity, RemovesAnIsolatedOctaveJump) {
    std::vector<PitchCandidates> c;
    for (int i = 0; i < 40; ++i) {
        if (i >= 20 && i < 23)  // YIN picked the half period (F0 an octave up) for 3 frames
            c.push_back(frame({{50.0f, 0.10f}, {100.0f, 0.12f}, {200.0f, 0.13f}}));
        else
            c.push_back(frame({{100.0f, 0.05f}, {50.0f, 0.30f}, {200.0f, 0.06f}}));
    }
    const std::vector<std::uint8_t> allowed(c.size(), 1);
    const auto choice = trackCandidates(c, allowed);
    for (std::size_t i = 0; i < c.size(); ++i) EXPECT_FLOAT_EQ(chosenLag(c, choice, i), 100.0f) << i;
}

TEST(PitchContinuity, KeepsAOneSemitonePerFrameGlide) {
    std::vector<PitchCandidates> c;
    double lag = 200.0;
    for (int i = 0; i < 30; ++i, lag /= std::pow(2.0, 1.0 / 12.0))  // F0 up one semitone per frame
        c.push_back(frame({{static_cast<float>(lag), 0.08f}, {static_cast<float>(2 * lag), 0.07f}}));
    const std::vector<std::uint8_t> allowed(c.size(), 1);
    const auto choice = trackCandidates(c, allowed);
    for (std::size_t i = 0; i < c.size(); ++i) EXPECT_EQ(choice[i], 0) << i;
}

TEST(PitchContinuity, KeepsAnOctaveStepAcrossAGap) {
    std::vector<PitchCandidates> c;
    std::vector<std::uint8_t> allowed;
    for (int i = 0; i < 20; ++i) c.push_back(frame({{100.0f, 0.05f}, {200.0f, 0.06f}})), allowed.push_back(1);
    for (int i = 0; i < 4; ++i) c.push_back(frame({{137.0f, 0.90f}})), allowed.push_back(1);  // noise gap
    for (int i = 0; i < 20; ++i) c.push_back(frame({{50.0f, 0.05f}, {100.0f, 0.06f}})), allowed.push_back(1);
    const auto choice = trackCandidates(c, allowed);
    for (std::size_t i = 0; i < 20; ++i) EXPECT_FLOAT_EQ(chosenLag(c, choice, i), 100.0f) << i;
    for (std::size_t i = 20; i < 24; ++i) EXPECT_EQ(choice[i], kUnvoiced) << i;
    for (std::size_t i = 24; i < 44; ++i) EXPECT_FLOAT_EQ(chosenLag(c, choice, i), 50.0f) << i;
}

TEST(PitchContinuity, BridgesAShortHoleAndDropsABlipInNoise) {
    std::vector<PitchCandidates> c;
    for (int i = 0; i < 30; ++i) c.push_back(frame({{80.0f, i == 10 ? 0.45f : 0.05f}}));  // one flickering frame
    for (int i = 0; i < 30; ++i) c.push_back(frame({{63.0f, i == 15 ? 0.30f : 0.85f}}));  // noise, one lucky frame
    const std::vector<std::uint8_t> allowed(c.size(), 1);
    const auto choice = trackCandidates(c, allowed);
    EXPECT_NE(choice[10], kUnvoiced);
    EXPECT_EQ(choice[45], kUnvoiced);
    // Without switch costs, the plain per-frame rule: voiced iff d′ < 0.35.
    ContinuityCosts plain;
    plain.switchCost = 0.0;
    const auto perFrame = trackCandidates(c, allowed, plain);
    EXPECT_EQ(perFrame[10], kUnvoiced);
    EXPECT_NE(perFrame[45], kUnvoiced);
}

TEST(PitchContinuity, EnergyGateForcesUnvoiced) {
    const std::vector<PitchCandidates> c(10, frame({{100.0f, 0.01f}}));
    std::vector<std::uint8_t> allowed(10, 1);
    allowed[4] = allowed[5] = 0;
    const auto choice = trackCandidates(c, allowed);
    EXPECT_EQ(choice[4], kUnvoiced);
    EXPECT_EQ(choice[5], kUnvoiced);
    EXPECT_EQ(choice[3], 0);
    EXPECT_EQ(choice[6], 0);
}

TEST(PitchContinuity, DropsShortVoicedRuns) {
    std::vector<std::uint8_t> choice = {kUnvoiced, 0, 0, kUnvoiced, 1, 0, 2, 0, kUnvoiced, 0};
    dropShortVoicedRuns(choice, 3);
    const std::vector<std::uint8_t> expected = {kUnvoiced, kUnvoiced, kUnvoiced, kUnvoiced, 1, 0, 2, 0,
                                                kUnvoiced, kUnvoiced};
    EXPECT_EQ(choice, expected);
}

TEST(PitchContinuity, RejectsMismatchedSizesAndHandlesEmpty) {
    const std::vector<PitchCandidates> c(3, frame({{100.0f, 0.1f}}));
    const std::vector<std::uint8_t> allowed(2, 1);
    EXPECT_THROW(trackCandidates(c, allowed), ParamError);
    EXPECT_TRUE(trackCandidates({}, {}).empty());
}

// In a frame whose energy the noise floor explains to a share ρ, the cost of
// "unvoiced" is barInNoise(ρ, 0.35, 0.6) (noise_floor.hpp): a quiet voiced run
// reading d′ = 0.45 is voiced at ρ = 0.3 (bar 0.545) but not in a clean take,
// and noise reading 0.7 stays unvoiced even at ρ = 0.9 (bar capped at 0.6).
TEST(PitchContinuity, NoiseShareRaisesTheCostOfUnvoiced) {
    std::vector<PitchCandidates> c;
    for (int i = 0; i < 20; ++i) c.push_back(frame({{90.0f, 0.45f}}));
    for (int i = 0; i < 20; ++i) c.push_back(frame({{140.0f, 0.70f}}));
    const std::vector<std::uint8_t> allowed(c.size(), 1);
    std::vector<float> share(c.size(), 0.3f);
    for (std::size_t i = 20; i < share.size(); ++i) share[i] = 0.9f;
    const auto noisy = trackCandidates(c, allowed, share, ContinuityCosts{});
    const auto clean = trackCandidates(c, allowed, ContinuityCosts{});
    for (std::size_t i = 0; i < 20; ++i) {
        EXPECT_EQ(noisy[i], 0) << i;
        EXPECT_EQ(clean[i], kUnvoiced) << i;
    }
    for (std::size_t i = 20; i < c.size(); ++i) EXPECT_EQ(noisy[i], kUnvoiced) << i;
    const std::vector<float> wrongSize(3, 0.0f);
    EXPECT_THROW(trackCandidates(c, allowed, wrongSize, ContinuityCosts{}), ParamError);
}

}  // namespace
}  // namespace earmark
