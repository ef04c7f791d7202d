// Rater screening: ITU-R BS.1534-3 post-screening of MUSHRA raters, repeated
// trials and attention checks. Raters planted to fail are excluded, the
// others kept.
#include "earmark/listening/screening.hpp"
#include "listening_fixtures.hpp"

#include <gtest/gtest.h>

#include <cstdio>

namespace earmark::listening {
namespace {

using fixtures::designOf;
using fixtures::mushraDesign;

// One rater's MUSHRA answers on `lines` lines: a careful rater, except that
// the hidden reference gets `refLow` on the first `refFails` lines and the
// mid anchor gets `midHigh` on the first `midFails` lines.
void addMushraRater(std::vector<Answer>& out, const TestDesign& d, const std::string& rater, int refFails = 0,
                    double refLow = 85, int midFails = 0, double midHigh = 95) {
    for (int l = 0; l < static_cast<int>(d.lines.size()); ++l) {
        const std::string& line = d.lines[static_cast<std::size_t>(l)].id;
        const double jitter = (l * 7 + static_cast<int>(rater.size()) * 3) % 5;
        out.push_back({rater, line, "ref", "", l < refFails ? refLow : 96 + jitter * 0.8, TrialKind::Main, {}});
        out.push_back({rater, line, "anchor", "", 15 + jitter, TrialKind::Main, {}});
        out.push_back({rater, line, "mid", "", l < midFails ? midHigh : 45 + jitter, TrialKind::Main, {}});
        out.push_back({rater, line, "build-a", "", 70 + jitter, TrialKind::Main, {}});
        out.push_back({rater, line, "build-b", "", 62 + jitter, TrialKind::Main, {}});
    }
}

TEST(Screening, Bs1534PostScreeningExcludesPlantedRaters) {
    const TestDesign d = mushraDesign(20, 6);
    std::vector<Answer> a;
    addMushraRater(a, d, "careful");
    addMushraRater(a, d, "edge-15", 3);          // 3 of 20 = 15 %: not more than 15 %, kept
    addMushraRater(a, d, "exactly-90", 20, 90);  // 90 is not below 90: kept
    addMushraRater(a, d, "ref-low", 4);          // 4 of 20 = 20 %: excluded
    addMushraRater(a, d, "mid-high", 0, 85, 4);  // mid anchor above 90 on 20 %: excluded
    addMushraRater(a, d, "both", 5, 70, 5);      // both rules
    checkAnswers(d, a, "mushra.csv");
    const Screening s = screenRaters(d, a, {});
    EXPECT_EQ(s.kept, (std::vector<std::string>{"careful", "edge-15", "exactly-90"}));
    std::vector<std::string> reasons;
    for (const Exclusion& e : s.excluded) reasons.push_back(e.rater + ":" + e.rule);
    EXPECT_EQ(reasons, (std::vector<std::string>{"both:mushra-reference", "both:mushra-anchor",
                                                  "mid-high:mushra-anchor", "ref-low:mushra-reference"}));
    EXPECT_NE(s.excluded.back().reason.find("4 of 20 lines (20.0 % > 15.0 %"), std::string::npos)
        << s.excluded.back().reason;
}

TEST(Screening, LowAnchorRuleOnlyWithoutAMidAnchor) {
    TestDesign d = designOf(TestKind::Mushra, {{"ref", SystemRole::Reference}, {"anchor", SystemRole::LowAnchor},
                                               {"build-a", SystemRole::Candidate}},
                            4, 1);
    std::vector<Answer> a;
    for (const Line& line : d.lines) {
        a.push_back({"r", line.id, "ref", "", 100.0, TrialKind::Main, {}});
        a.push_back({"r", line.id, "anchor", "", 95.0, TrialKind::Main, {}});
        a.push_back({"r", line.id, "build-a", "", 80.0, TrialKind::Main, {}});
    }
    const Screening s = screenRaters(d, a, {});
    ASSERT_EQ(s.excluded.size(), 1u);
    EXPECT_NE(s.excluded[0].reason.find("low anchor"), std::string::npos);
    // With the rule switched off the rater stays.
    EXPECT_TRUE(screenRaters(d, a, {.mushraPostScreening = false}).excluded.empty());
}

TEST(Screening, InconsistentRepeatsAndFailedAttentionChecksExclude) {
    TestDesign d = designOf(TestKind::Mos, {{"a", SystemRole::Candidate}, {"hum", SystemRole::AttentionCheck}}, 4, 3);
    d.systems[1].acceptMin = 1;
    d.systems[1].acceptMax = 2;
    std::vector<Answer> a;
    for (const std::string rater : {"steady", "wobbly", "asleep"}) {
        for (const Line& line : d.lines) a.push_back({rater, line.id, "a", "", 4.0, TrialKind::Main, {}});
        const double repeat = rater == "wobbly" ? 1.0 : 5.0;  // wobbly: |4 − 1| = 3 > 1 (a quarter of 1…5)
        a.push_back({rater, "l01", "a", "", repeat, TrialKind::Repeat, {}});
        a.push_back({rater, "l02", "hum", "", rater == "asleep" ? 4.0 : 1.0, TrialKind::Main, {}});
    }
    checkAnswers(d, a, "x");
    const Screening s = screenRaters(d, a, {});
    EXPECT_EQ(s.kept, (std::vector<std::string>{"steady"}));
    ASSERT_EQ(s.excluded.size(), 2u);
    EXPECT_EQ(s.excluded[0].rater + ":" + s.excluded[0].rule, "asleep:attention");
    EXPECT_EQ(s.excluded[1].rater + ":" + s.excluded[1].rule, "wobbly:repeat-consistency");
}

}  // namespace
}  // namespace earmark::listening
