// Long-form findings on built long reads (support/long_read.hpp): ≈ 6
// minutes of invented sentences rendered one by one by espeak-ng and joined
// with pauses, clean or with one planted fault. The truth is where the fault
// was planted; seams, the different voice and the monotone stretch must be
// found within ±0.5 s of it; so must the start of a drift (its knee is
// fitted between window centres, findings.hpp).
#include "earmark/longform/findings.hpp"

#include "support/long_read.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace earmark {
namespace {

using test::LongRead;
using test::LongReadPlan;
using test::makeLongRead;

const LongRead& cleanRead() {
    static const LongRead read = makeLongRead();
    return read;
}

double joinAt(int k) { return cleanRead().joins[static_cast<std::size_t>(k)]; }

std::vector<Finding> findingsOf(const LongRead& read, const std::vector<double>& joins = {}) {
    return analyseLongform(read.audio, joins, LongformRules{}).findings;
}

std::vector<Finding> ofKind(const std::vector<Finding>& all, FindingKind kind, const std::string& measure = "") {
    std::vector<Finding> out;
    for (const auto& f : all)
        if (f.kind == kind && (measure.empty() || f.measure == measure)) out.push_back(f);
    return out;
}

std::string describe(const std::vector<Finding>& all) {
    std::string s;
    for (const auto& f : all) s += f.reason + "\n";
    return s;
}

TEST(LongRead, CleanReadHasNoFinding) {
    const LongRead& read = cleanRead();
    ASSERT_GE(read.audio.durationSeconds(), 300.0);
    const auto findings = findingsOf(read);
    EXPECT_TRUE(findings.empty()) << describe(findings);
    // With the renderer's chunk list as known joins, too.
    const auto known = findingsOf(read, read.joins);
    EXPECT_TRUE(known.empty()) << describe(known);
}

TEST(LongRead, LevelStepAtAJoinIsASeam) {
    LongReadPlan plan;
    const double join = joinAt(30);
    plan.gainDb = [join](double t) { return t >= join ? 4.0 : 0.0; };
    const LongRead read = makeLongRead(plan);
    for (const auto& joins : {std::vector<double>{}, read.joins}) {
        const auto seams = ofKind(findingsOf(read, joins), FindingKind::Seam, "level_step_db");
        ASSERT_EQ(seams.size(), 1u) << describe(seams);
        EXPECT_NEAR(0.5 * (seams[0].startS + seams[0].endS), join, 0.5);
        EXPECT_NEAR(seams[0].value, 4.0, 0.5);
    }
}

TEST(LongRead, RoomToneChangeAtAJoinIsASeam) {
    LongReadPlan plan;
    const double join = joinAt(30);
    plan.floorStepDb = [join](double t) { return t >= join ? 15.0 : 0.0; };
    const auto all = findingsOf(makeLongRead(plan));
    const auto seams = ofKind(all, FindingKind::Seam, "room_tone_step_db");
    ASSERT_EQ(seams.size(), 1u) << describe(all);
    EXPECT_NEAR(0.5 * (seams[0].startS + seams[0].endS), join, 0.5);
    EXPECT_NEAR(seams[0].value, 15.0, 1.0);
}

TEST(LongRead, ClickAtAJoinIsASeam) {
    LongReadPlan plan;
    const double join = joinAt(40);
    plan.clicksS = {join};
    const auto all = findingsOf(makeLongRead(plan));
    const auto seams = ofKind(all, FindingKind::Seam, "click_db");
    ASSERT_EQ(seams.size(), 1u) << describe(all);
    EXPECT_NEAR(seams[0].startS, join, 0.01);
}

// A click off the middle of a pause reads as a short burst of speech. 0.15 s
// off, the silence after it is too short for a pause, so the click joins the
// next speech and the pause found ends before it; 0.07 s off, it lies inside
// the pause found. Both are measured, with or without the known joins.
TEST(LongRead, ClickInsideAPauseIsASeam) {
    for (const double offset : {0.07, 0.15}) {
        LongReadPlan plan;
        const double click = joinAt(40) + offset;
        plan.clicksS = {click};
        const LongRead read = makeLongRead(plan);
        for (const auto& joins : {std::vector<double>{}, read.joins}) {
            const auto all = findingsOf(read, joins);
            const auto seams = ofKind(all, FindingKind::Seam, "click_db");
            ASSERT_EQ(seams.size(), 1u) << "offset " << offset << "\n" << describe(all);
            EXPECT_NEAR(seams[0].startS, click, 0.01);
        }
    }
}

TEST(LongRead, StretchInAnotherVoiceIsATimbreShift) {
    LongReadPlan plan;
    plan.speech = [](int i) {
        SpeechParams p = test::livelySpeech();
        if (i >= 30 && i < 40) p.voice = "en+f3";
        return p;
    };
    const LongRead read = makeLongRead(plan);
    const auto all = findingsOf(read);
    const auto shifts = ofKind(all, FindingKind::TimbreShift);
    ASSERT_EQ(shifts.size(), 1u) << describe(all);
    EXPECT_NEAR(shifts[0].startS, read.sentenceStartS[30], 0.5);
    EXPECT_NEAR(shifts[0].endS, read.sentenceEndS[39], 0.5);
    // Its two ends are seams of the spectral envelope.
    const auto seams = ofKind(all, FindingKind::Seam, "envelope_jump");
    ASSERT_EQ(seams.size(), 2u) << describe(all);
    EXPECT_NEAR(seams[0].endS, read.sentenceStartS[30], 0.5);
    EXPECT_NEAR(seams[1].startS, read.sentenceEndS[39], 0.5);
    EXPECT_TRUE(ofKind(all, FindingKind::PitchDrift).empty()) << describe(all);
}

TEST(LongRead, MonotoneStretchIsFound) {
    LongReadPlan plan;
    plan.speech = [](int i) {
        SpeechParams p = test::livelySpeech();
        if (i >= 30 && i < 40) p.pitchRange = 0;
        return p;
    };
    const LongRead read = makeLongRead(plan);
    const auto all = findingsOf(read);
    const auto stretches = ofKind(all, FindingKind::MonotoneStretch);
    ASSERT_EQ(stretches.size(), 1u) << describe(all);
    EXPECT_NEAR(stretches[0].startS, read.sentenceStartS[30], 0.5);
    EXPECT_NEAR(stretches[0].endS, read.sentenceEndS[39], 0.5);
    EXPECT_LT(stretches[0].value, 4.0);
}

TEST(LongRead, GainRampOverTheLastHalfIsALevelDrift) {
    LongReadPlan plan;
    const double half = cleanRead().audio.durationSeconds() / 2;
    plan.gainDb = [half](double t) { return t < half ? 0.0 : -8.0 * (t - half) / half; };
    const auto all = findingsOf(makeLongRead(plan));
    const auto drifts = ofKind(all, FindingKind::LevelDrift);
    ASSERT_EQ(drifts.size(), 1u) << describe(all);
    EXPECT_NEAR(drifts[0].value, -8.0, 1.5);
    std::printf("[ figures  ] gain ramp from %.2f s: level drift %+.2f dB from %.2f s\n", half, drifts[0].value,
                drifts[0].startS);
    EXPECT_NEAR(drifts[0].startS, half, 0.5);  // the bar: within ±0.5 s of the truth
    EXPECT_TRUE(ofKind(all, FindingKind::Seam).empty()) << describe(all);
}

TEST(LongRead, RisingRateIsARateDrift) {
    // espeak-ng's rate rises 25 % (160 → 200 words per minute) over the read.
    // Energy-peak nuclei merge at the faster rates, so the articulation rate
    // measured rises less (≈ 15 %); the rule's default is 10 %.
    LongReadPlan plan;
    const int n = plan.sentences;
    plan.speech = [n](int i) {
        SpeechParams p = test::livelySpeech();
        p.rateWpm = static_cast<int>(std::lround(160.0 * (1.0 + 0.25 * i / (n - 1))));
        return p;
    };
    const auto all = findingsOf(makeLongRead(plan));
    const auto drifts = ofKind(all, FindingKind::RateDrift);
    ASSERT_EQ(drifts.size(), 1u) << describe(all);
    std::printf("[ figures  ] rate rising 25 %% from 0 s: rate drift %+.1f %% from %.2f s\n", drifts[0].value,
                drifts[0].startS);
    EXPECT_GT(drifts[0].value, 10.0);
    EXPECT_NEAR(drifts[0].startS, 0.0, 0.5);  // it rises from the first sentence
}

}  // namespace
}  // namespace earmark
