// Plans of listening tests: balanced positions, blind labels, the same plan
// from the same seed, line coverage, repeats and attention trials.
#include "earmark/core/error.hpp"
#include "earmark/listening/plan.hpp"
#include "listening_fixtures.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <map>
#include <set>

namespace earmark::listening {
namespace {

using fixtures::designOf;
using fixtures::mushraDesign;

// Max − min over positions of how often `system` sits at each position of
// main trials with `width` takes.
int positionSpread(const Plan& plan, int system, std::size_t width) {
    std::vector<int> count(width, 0);
    for (const RaterPlan& rp : plan.raters)
        for (const Trial& t : rp.trials)
            if (t.kind == TrialKind::Main && t.stimuli.size() == width)
                for (std::size_t k = 0; k < width; ++k)
                    if (t.stimuli[k].system == system) ++count[k];
    return *std::max_element(count.begin(), count.end()) - *std::min_element(count.begin(), count.end());
}

TestDesign generatedDesign(int i) {
    // Cycle through kinds, system counts, line counts, rater counts and subsets.
    const int kind = i % 3;
    const int lines = 3 + i % 7, raters = 1 + (i / 3) % 9;
    const auto seed = static_cast<std::uint64_t>(1000 + i);
    TestDesign d;
    if (kind == 0) {
        d = mushraDesign(lines, raters, seed);
        if (i % 2) d.systems.push_back({"build-c", SystemRole::Candidate, "", 0, 0});
    } else if (kind == 1) {
        d = designOf(TestKind::Cmos, {{"ref", SystemRole::Reference}, {"a", SystemRole::Candidate},
                                      {"b", SystemRole::Candidate}, {"c", SystemRole::Candidate}},
                     lines, raters, seed);
    } else {
        std::vector<std::pair<std::string, SystemRole>> systems;
        for (int s = 0; s < 2 + i % 4; ++s) systems.push_back({"s" + std::to_string(s), SystemRole::Candidate});
        d = designOf(TestKind::Ab, systems, lines, raters, seed);
    }
    for (Line& line : d.lines) line.audio.resize(d.systems.size(), "x.wav");
    d.plan.linesPerRater = i % 4 == 0 ? 0 : 1 + i % lines;
    return d;
}

TEST(Plan, EachSystemInEachPositionEquallyOftenOverAThousandPlans) {
    int checked = 0;
    for (int i = 0; i < 1000; ++i) {
        const TestDesign d = generatedDesign(i);
        const Plan plan = makePlan(d);
        const std::size_t width = d.kind == TestKind::Mushra ? d.systems.size() : 2;
        for (std::size_t s = 0; s < d.systems.size(); ++s) {
            ASSERT_LE(positionSpread(plan, static_cast<int>(s), width), 1)
                << "plan " << i << " (" << kindName(d.kind) << "), system " << d.systems[s].name;
            ++checked;
        }
    }
    EXPECT_GT(checked, 3000);
}

TEST(Plan, SameSeedSamePlanOtherSeedOtherOrder) {
    TestDesign d = mushraDesign(6, 4);
    d.plan.repeatsPerRater = 2;
    const auto flatten = [](const Plan& p) {
        std::vector<int> out;
        for (const auto& rp : p.raters)
            for (const auto& t : rp.trials) {
                out.push_back(t.line);
                for (const auto& s : t.stimuli) out.push_back(s.system);
            }
        return out;
    };
    EXPECT_EQ(flatten(makePlan(d)), flatten(makePlan(d)));
    TestDesign other = d;
    other.plan.seed = 8;
    EXPECT_NE(flatten(makePlan(d)), flatten(makePlan(other)));
}

TEST(Plan, BlindViewNamesNoSystemAndNoFile) {
    TestDesign d = designOf(TestKind::Cmos, {{"ref-voice", SystemRole::Reference}, {"nova-build", SystemRole::Candidate}},
                            5, 3);
    for (const RaterPlan& rp : makePlan(d).raters) {
        const std::string view = blindView(d, rp);
        EXPECT_EQ(view.find("ref-voice"), std::string::npos);
        EXPECT_EQ(view.find("nova-build"), std::string::npos);
        EXPECT_EQ(view.find(".wav"), std::string::npos);
        EXPECT_NE(view.find("A B"), std::string::npos);
    }
}

TEST(Plan, SubsetsOfLinesCoverEveryLineEquallyOften) {
    TestDesign d = designOf(TestKind::Mos, {{"a", SystemRole::Candidate}, {"b", SystemRole::Candidate}}, 10, 7);
    d.plan.linesPerRater = 4;
    std::map<int, int> heard;  // line → raters
    for (const RaterPlan& rp : makePlan(d).raters) {
        std::set<int> lines;
        for (const Trial& t : rp.trials) lines.insert(t.line);
        EXPECT_EQ(lines.size(), 4u);
        EXPECT_EQ(rp.trials.size(), 8u);  // every system on each of its lines
        for (int l : lines) ++heard[l];
    }
    ASSERT_EQ(heard.size(), 10u);
    int lo = 99, hi = 0;
    for (const auto& [line, n] : heard) lo = std::min(lo, n), hi = std::max(hi, n);
    EXPECT_LE(hi - lo, 1);  // 7 × 4 = 28 hearings over 10 lines: 2 or 3 each
}

TEST(Plan, RepeatsComeAfterTheirFirstHearing) {
    TestDesign d = mushraDesign(5, 3);
    d.plan.repeatsPerRater = 3;
    for (const RaterPlan& rp : makePlan(d).raters) {
        int repeats = 0;
        for (std::size_t i = 0; i < rp.trials.size(); ++i) {
            const Trial& t = rp.trials[i];
            if (t.kind != TrialKind::Repeat) continue;
            ++repeats;
            ASSERT_GE(t.repeatOf, 0);
            ASSERT_LT(static_cast<std::size_t>(t.repeatOf), i);
            EXPECT_EQ(rp.trials[static_cast<std::size_t>(t.repeatOf)].line, t.line);
            EXPECT_EQ(rp.trials[static_cast<std::size_t>(t.repeatOf)].kind, TrialKind::Main);
        }
        EXPECT_EQ(repeats, 3);
    }
}

TEST(Plan, AttentionTrialsUseTheAttentionSystem) {
    TestDesign d = designOf(TestKind::Mos, {{"a", SystemRole::Candidate}, {"noise", SystemRole::AttentionCheck}}, 4, 2);
    d.systems[1].acceptMin = 1;
    d.systems[1].acceptMax = 2;
    d.plan.attentionPerRater = 2;
    for (const RaterPlan& rp : makePlan(d).raters) {
        int attention = 0;
        for (const Trial& t : rp.trials) {
            const bool usesCheck = t.stimuli[0].system == 1;
            EXPECT_EQ(usesCheck, t.kind == TrialKind::Attention);
            attention += t.kind == TrialKind::Attention;
        }
        EXPECT_EQ(attention, 2);
        EXPECT_EQ(rp.trials.size(), 6u);
    }
}

TEST(Plan, RefusesDesignsThatCannotRun) {
    TestDesign d = mushraDesign(3, 2);
    d.lines[1].audio[3].clear();
    try {
        makePlan(d);
        FAIL() << "a line without a take of one system was accepted";
    } catch (const InputError& e) {
        EXPECT_NE(std::string(e.what()).find("line 'l02' has no take of system 'build-a'"), std::string::npos)
            << e.what();
    }
    TestDesign noAnchor = designOf(TestKind::Mushra, {{"ref", SystemRole::Reference}, {"a", SystemRole::Candidate}}, 2, 1);
    EXPECT_THROW(makePlan(noAnchor), ParamError);
    TestDesign tooManyRepeats = designOf(TestKind::Mos, {{"a", SystemRole::Candidate}}, 2, 1);
    tooManyRepeats.plan.repeatsPerRater = 3;
    EXPECT_THROW(makePlan(tooManyRepeats), ParamError);
}

}  // namespace
}  // namespace earmark::listening
