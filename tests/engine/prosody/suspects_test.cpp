// Each suspect on a synthetic take built to cross exactly its threshold, its
// absence on a take that stays inside, and the score formula.
#include "earmark/prosody/suspects.hpp"

#include "prosody_test_util.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

namespace earmark {
namespace {

using test::kProsodyHop;
using test::iv;

// A take of `seconds` with speech (−15 dB) in the given spans, F0 from `f0(t)` (0 = unvoiced).
template <typename F0>
ProsodyContext take(double seconds, const std::vector<std::pair<double, double>>& speech, F0 f0, Transcript tr = {}) {
    const auto frames = static_cast<std::size_t>(seconds / kProsodyHop) + 1;
    PitchTrack p;
    EnergyTrack e;
    p.hopSeconds = e.hopSeconds = kProsodyHop;
    p.f0Hz.assign(frames, 0.0f);
    e.db.assign(frames, -120.0f);
    for (std::size_t i = 0; i < frames; ++i) {
        const double t = static_cast<double>(i) * kProsodyHop;
        for (const auto& [a, b] : speech)
            if (t >= a && t < b) {
                e.db[i] = -15.0f;
                p.f0Hz[i] = static_cast<float>(f0(t));
            }
    }
    return ProsodyContext(std::move(p), std::move(e), seconds, std::move(tr));
}

// A lively contour: ±4 st around 120 Hz at 1.5 Hz (p5–p95 ≈ 7.9 st).
double lively(double t) { return 120.0 * std::pow(2.0, 4.0 / 12.0 * std::sin(2 * M_PI * 1.5 * t)); }

std::vector<std::string> names(const std::vector<TakeSuspect>& s) {
    std::vector<std::string> out;
    for (const auto& x : s) out.push_back(suspectName(x.kind));
    return out;
}

std::vector<TakeSuspect> suspectsOf(const ProsodyContext& c, LevelMeasures level = {}, const ScanRules& rules = {}) {
    return findSuspects(c, measureTake(c, level), rules);
}

const TakeSuspect* find(const std::vector<TakeSuspect>& s, SuspectKind k) {
    auto it = std::find_if(s.begin(), s.end(), [&](const TakeSuspect& x) { return x.kind == k; });
    return it == s.end() ? nullptr : &*it;
}

TEST(Suspects, CleanTakeRaisesNone) {
    Transcript tr;
    tr.text = "A plain line of about a dozen syllables, read at ease.";
    const auto c = take(3.0, {{0.3, 1.4}, {1.6, 2.7}}, lively, tr);
    EXPECT_TRUE(suspectsOf(c).empty()) << ::testing::PrintToString(names(suspectsOf(c)));
}

TEST(Suspects, FlatWithoutWordsUsesPhrasesBetweenPauses) {
    const auto c = take(3.0, {{0.3, 2.7}}, [](double t) { return 120.0 * std::pow(2.0, 0.5 / 12.0 * t / 3.0); });
    const auto s = suspectsOf(c);
    const auto* flat = find(s, SuspectKind::Flat);
    ASSERT_NE(flat, nullptr);
    EXPECT_NEAR(flat->value, 0.9 * 0.5 * 2.4 / 3.0, 0.01);  // p5–p95 of a 0.4 st ramp
    EXPECT_DOUBLE_EQ(flat->threshold, 2.0);
    EXPECT_NEAR(flat->startS, 0.3, kProsodyHop);
    EXPECT_NEAR(flat->endS, 2.7, kProsodyHop);
    EXPECT_NE(flat->reason.find("flat: 0.4 st over 0.3–2.7 s (< 2 st)"), std::string::npos) << flat->reason;
}

TEST(Suspects, FlatWithWordsNamesThePhrase) {
    Transcript tr;
    tr.text = "Come back soon, open until late on Tuesday.";
    tr.words = {iv(0.3, 0.5, "come"),  iv(0.5, 0.7, "back"),  iv(0.7, 1.0, "soon"),  iv(1.3, 1.6, "open"),
                iv(1.6, 1.9, "until"), iv(1.9, 2.1, "late"), iv(2.1, 2.2, "on"), iv(2.2, 2.7, "Tuesday")};
    // Lively first phrase, flat second (after the comma).
    const auto c = take(3.0, {{0.3, 1.0}, {1.3, 2.7}}, [](double t) { return t < 1.2 ? lively(t) * 1.3 : 110.0 + t; }, tr);
    const auto flatAll = suspectsOf(c);
    const auto* flat = find(flatAll, SuspectKind::Flat);
    ASSERT_NE(flat, nullptr);
    EXPECT_NE(flat->reason.find("over 'open until late on Tuesday.'"), std::string::npos) << flat->reason;
    EXPECT_NEAR(flat->startS, 1.3, 1e-9);
}

TEST(Suspects, PitchJumpInsideAVoicedRun) {
    const auto c = take(2.0, {{0.3, 1.7}}, [](double t) { return lively(t) * (t > 1.0 ? 2.0 : 1.0); });
    const auto jumpAll = suspectsOf(c);
    const auto* jump = find(jumpAll, SuspectKind::PitchJump);
    ASSERT_NE(jump, nullptr);
    EXPECT_NEAR(jump->value, 12.0, 0.25);  // an octave, plus the contour's own step (≤ 0.19 st per frame)
    EXPECT_NEAR(jump->endS, 1.0, kProsodyHop + 1e-9);
}

TEST(Suspects, LongPauseButNotAfterASentenceEnd) {
    const auto c = take(4.0, {{0.3, 1.5}, {2.8, 3.7}}, lively);
    const auto pauseAll = suspectsOf(c);
    const auto* pause = find(pauseAll, SuspectKind::PauseTooLong);
    ASSERT_NE(pause, nullptr);
    EXPECT_NEAR(pause->value, 1.3, 2 * kProsodyHop);
    Transcript tr;
    tr.text = "First part done. Then more.";
    tr.words = {iv(0.3, 0.7, "First"), iv(0.7, 1.1, "part"), iv(1.1, 1.5, "done"), iv(2.8, 3.2, "Then"), iv(3.2, 3.7, "more")};
    const auto c2 = take(4.0, {{0.3, 1.5}, {2.8, 3.7}}, lively, tr);
    const auto s2 = suspectsOf(c2);
    EXPECT_EQ(find(s2, SuspectKind::PauseTooLong), nullptr);
}

TEST(Suspects, MissingPauseAtAComma) {
    Transcript tr;
    tr.text = "Stop here, then go on.";
    tr.words = {iv(0.3, 0.6, "Stop"), iv(0.6, 1.0, "here"), iv(1.0, 1.3, "then"), iv(1.3, 1.5, "go"), iv(1.5, 1.8, "on")};
    const auto c = take(2.2, {{0.3, 1.8}}, lively, tr);
    const auto missingAll = suspectsOf(c);
    const auto* missing = find(missingAll, SuspectKind::PauseMissing);
    ASSERT_NE(missing, nullptr);
    EXPECT_NEAR(missing->value, 0.0, 1e-9);
    EXPECT_NE(missing->reason.find("after 'here,'"), std::string::npos) << missing->reason;
}

TEST(Suspects, RushedAndDraggedFromTheArticulationRate) {
    Transcript fast;
    fast.text = "Twenty syllables squeezed into a tiny little stretch of sound right here";  // 18 syllables
    const auto rushed = suspectsOf(take(2.0, {{0.3, 1.8}}, lively, fast));
    ASSERT_NE(find(rushed, SuspectKind::Rushed), nullptr);
    EXPECT_NEAR(find(rushed, SuspectKind::Rushed)->value, 18.0 / 1.5, 0.05);
    Transcript slow;
    slow.text = "Slow words";
    const auto dragged = suspectsOf(take(3.0, {{0.3, 2.7}}, lively, slow));
    EXPECT_NE(find(dragged, SuspectKind::Dragged), nullptr);
}

TEST(Suspects, LevelsSilencesAndTruncation) {
    LevelMeasures level;
    level.clippedSamples = 50;
    level.firstClipS = 0.5;
    level.lastClipS = 0.9;
    level.dcOffset = -0.03;
    const auto c = take(5.0, {{2.0, 4.0}}, lively);
    const auto s = suspectsOf(c, level);
    ASSERT_NE(find(s, SuspectKind::Clipping), nullptr);
    EXPECT_DOUBLE_EQ(find(s, SuspectKind::Clipping)->value, 50.0);
    ASSERT_NE(find(s, SuspectKind::LeadingSilence), nullptr);
    EXPECT_NEAR(find(s, SuspectKind::LeadingSilence)->value, 2.0, kProsodyHop);
    EXPECT_EQ(find(s, SuspectKind::TrailingSilence), nullptr);  // 1.0 s ≤ 1.5 s
    ASSERT_NE(find(s, SuspectKind::DcOffset), nullptr);
    EXPECT_EQ(find(s, SuspectKind::Truncation), nullptr);
    // Speech up to the last frame: cut off.
    const auto cut = suspectsOf(take(2.0, {{0.3, 2.01}}, lively));
    ASSERT_NE(find(cut, SuspectKind::Truncation), nullptr);
    EXPECT_NEAR(find(cut, SuspectKind::Truncation)->value, 0.0, 1e-6);
}

TEST(Suspects, DisabledRulesStaySilent) {
    ScanRules rules;
    rules.leadingSilence.enabled = false;
    const auto s = suspectsOf(take(5.0, {{2.0, 4.0}}, lively), {}, rules);
    EXPECT_EQ(find(s, SuspectKind::LeadingSilence), nullptr);
}

TEST(Suspects, LoudnessAgainstTheSetMedian) {
    const ScanRules rules;
    EXPECT_FALSE(loudnessSuspect(-20.0, -23.0, 3.0, rules).has_value());
    const auto loud = loudnessSuspect(-11.0, -23.0, 3.0, rules);
    ASSERT_TRUE(loud.has_value());
    EXPECT_EQ(loud->kind, SuspectKind::Loud);
    EXPECT_DOUBLE_EQ(loud->value, 12.0);
    const auto quiet = loudnessSuspect(-43.0, -23.0, 3.0, rules);
    ASSERT_TRUE(quiet.has_value());
    EXPECT_EQ(quiet->kind, SuspectKind::Quiet);
    EXPECT_TRUE(isSetLevel(SuspectKind::Quiet));
    EXPECT_EQ(suspectKindFromName("pitch-jump"), SuspectKind::PitchJump);
    EXPECT_FALSE(suspectKindFromName("wobbly").has_value());
}

TEST(Score, WeightTimesDistancePastTheThresholdCapped) {
    ScanRules rules;
    TakeSuspect s;
    s.kind = SuspectKind::PauseTooLong;  // weight 1
    s.threshold = 1.0;
    s.value = 1.5;
    EXPECT_DOUBLE_EQ(suspectScore(s, rules), 1.5);
    s.value = 10.0;
    EXPECT_DOUBLE_EQ(suspectScore(s, rules), 3.0);  // capped
    s.kind = SuspectKind::Clipping;  // weight 2
    s.threshold = 3;
    s.value = 6;
    EXPECT_DOUBLE_EQ(suspectScore(s, rules), 2.0 * 2.0);
    rules.scoreCapPerSuspect = 1.0;
    EXPECT_DOUBLE_EQ(suspectScore(s, rules), 2.0);
    EXPECT_DOUBLE_EQ(totalScore({s, s}, rules), 4.0);
}

}  // namespace
}  // namespace earmark
