// Analysis of whole rounds: a MOS round and an A/B round against scipy
// (tests/data/make_listening_reference.py), the bootstrap over raters and
// lines, and bad answers.
#include "earmark/core/error.hpp"
#include "earmark/listening/analysis.hpp"
#include "listening_fixtures.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdio>
#include <fstream>

namespace earmark::listening {
namespace {

using fixtures::designOf;

using fixtures::kTol;

TEST(Analysis, MosRoundMatchesScipy) {
    const auto round = fixtures::statsReference()["mos_round"];
    TestDesign d = designOf(TestKind::Mos, {{"north", SystemRole::Candidate}, {"south", SystemRole::Candidate},
                                            {"west", SystemRole::Candidate}},
                            5, 4);
    for (std::size_t i = 0; i < d.lines.size(); ++i) d.lines[i].id = round["lines"][i];
    std::vector<Answer> answers;
    for (const auto& a : round["answers"])
        answers.push_back({a["rater"], a["line"], a["system"], "", a["score"].get<double>(), TrialKind::Main, {}});
    checkAnswers(d, answers, "round.csv");
    const Report r = analyse(d, answers, {.bootstrapRounds = 200}, {});
    EXPECT_TRUE(r.balanced);
    EXPECT_EQ(r.answersUsed, 60);
    ASSERT_EQ(r.systems.size(), 3u);
    for (std::size_t s = 0; s < 3; ++s) {
        const auto& e = round["summaries"][s];
        EXPECT_EQ(r.systems[s].system, e["system"].get<std::string>());
        EXPECT_NEAR(r.systems[s].t.mean, e["mean"].get<double>(), kTol);
        EXPECT_NEAR(r.systems[s].t.low, e["low"].get<double>(), kTol);
        EXPECT_NEAR(r.systems[s].t.high, e["high"].get<double>(), kTol);
        EXPECT_EQ(r.systems[s].raters, 4);
        EXPECT_EQ(r.systems[s].lines, 5);
    }
    ASSERT_EQ(r.pairs.size(), 3u);
    for (std::size_t i = 0; i < 3; ++i) {
        const auto& e = round["pairs"][i];
        EXPECT_EQ(r.pairs[i].a, e["a"].get<std::string>());
        EXPECT_EQ(r.pairs[i].chosen, "paired-t");
        EXPECT_NEAR(r.pairs[i].pairedT.p, e["p_t"].get<double>(), kTol);
        EXPECT_NEAR(r.pairs[i].wilcoxon.p, e["p_wilcoxon"].get<double>(), kTol);
        EXPECT_NEAR(r.pairs[i].pHolm, e["p_holm"].get<double>(), kTol);
    }
    EXPECT_EQ(r.perLine.size(), 15u);
}

TEST(Analysis, AbRoundMatchesScipyBinomtest) {
    const auto round = fixtures::statsReference()["ab_round"];
    TestDesign d = designOf(TestKind::Ab, {{"a", SystemRole::Candidate}, {"b", SystemRole::Candidate},
                                           {"c", SystemRole::Candidate}},
                            1, 1);
    std::vector<Answer> answers;
    int rater = 0;
    for (const auto& pr : round) {
        // One answer per rater (on the single line), written in either order.
        auto add = [&](int n, double score, bool flip) {
            for (int i = 0; i < n; ++i) {
                const std::string a = pr["a"], b = pr["b"];
                char name[16];
                std::snprintf(name, sizeof name, "r%d", rater++);
                answers.push_back({name, "l01", flip ? b : a, flip ? a : b,
                                   flip ? -score : score, TrialKind::Main, {}});
            }
        };
        add(pr["a_preferred"], 1, false);
        add(pr["b_preferred"], -1, true);
        add(pr["none"], 0, false);
    }
    checkAnswers(d, answers, "ab.csv");
    const Report r = analyse(d, answers, {}, {});
    ASSERT_EQ(r.preferences.size(), 3u);
    for (std::size_t i = 0; i < 3; ++i) {
        const auto& e = round[i];
        EXPECT_EQ(r.preferences[i].aPreferred, e["a_preferred"].get<int>());
        EXPECT_EQ(r.preferences[i].bPreferred, e["b_preferred"].get<int>());
        EXPECT_EQ(r.preferences[i].none, e["none"].get<int>());
        EXPECT_NEAR(r.preferences[i].test.p, e["p"].get<double>(), kTol);
        EXPECT_NEAR(r.preferences[i].test.low, e["low"].get<double>(), kTol);
        EXPECT_NEAR(r.preferences[i].pHolm, e["p_holm"].get<double>(), kTol);
    }
}

// Raters × lines × 1 system where each rater gives the same score on every
// line: resampling lines changes nothing, so the bootstrap distribution of
// the mean is that of the mean of R raters drawn with replacement, whose
// standard deviation is exactly s_plugin / √R (Efron & Tibshirani 1993, "An
// Introduction to the Bootstrap", §5.2).
TEST(Bootstrap, MatchesThePluginStandardErrorWithinMonteCarloError) {
    const int raters = 40, lines = 6, rounds = 4000;
    std::vector<double> cells;
    std::vector<double> perRater;
    for (int r = 0; r < raters; ++r) {
        const double score = 1.0 + (r * 7 % 13) * 0.3;
        perRater.push_back(score);
        for (int l = 0; l < lines; ++l) cells.push_back(score);
    }
    double mean = 0, ss = 0;
    for (double x : perRater) mean += x / raters;
    for (double x : perRater) ss += (x - mean) * (x - mean);
    const double exactSd = std::sqrt(ss / raters) / std::sqrt(double(raters));
    const BootstrapResult b = bootstrapMeans(cells, raters, lines, 1, 0.05, rounds, 99);
    // Relative standard error of a sample sd from B draws ≈ 1/√(2B) ≈ 1.1 %; allow 4 of them.
    EXPECT_NEAR(b.sd[0], exactSd, 4.0 * exactSd / std::sqrt(2.0 * rounds));
    // The percentile interval of a near-normal mean: about mean ± 1.96 sd.
    EXPECT_NEAR(b.high[0] - b.low[0], 2 * 1.959964 * exactSd, 0.15 * exactSd * 2 * 1.96);
}

TEST(Bootstrap, ReproducibleFromTheSeed) {
    std::vector<double> cells;
    for (int i = 0; i < 5 * 4 * 2; ++i) cells.push_back(i % 3 == 0 ? std::nan("") : (i * 37 % 11) / 2.0);
    const auto a = bootstrapMeans(cells, 5, 4, 2, 0.05, 500, 3);
    const auto b = bootstrapMeans(cells, 5, 4, 2, 0.05, 500, 3);
    const auto c = bootstrapMeans(cells, 5, 4, 2, 0.05, 500, 4);
    EXPECT_EQ(a.low, b.low);
    EXPECT_EQ(a.high, b.high);
    EXPECT_NE(a.sd, c.sd);
}

TEST(Bootstrap, CancelsThroughProgress) {
    std::vector<double> cells(3 * 3, 1.0);
    EXPECT_THROW(bootstrapMeans(cells, 3, 3, 1, 0.05, 1000, 1, Progress([](double) { return false; })), Cancelled);
}

TEST(Answers, RefusesScoresOffTheScaleDuplicatesAndUnknownNames) {
    const TestDesign d = designOf(TestKind::Mos, {{"a", SystemRole::Candidate}, {"b", SystemRole::Candidate}}, 2, 1);
    auto refused = [&](std::vector<Answer> answers, const std::string& needle) {
        try {
            checkAnswers(d, answers, "ratings.csv");
        } catch (const InputError& e) {
            EXPECT_EQ(e.subject(), "ratings.csv");
            EXPECT_NE(std::string(e.what()).find(needle), std::string::npos) << e.what();
            return;
        }
        ADD_FAILURE() << "accepted: " << needle;
    };
    refused({{"ann", "l01", "a", "", 6.0, TrialKind::Main, "row 2"}}, "row 2: rater 'ann', line 'l01', system 'a': score 6 is not on the mos scale");
    refused({{"ann", "l01", "a", "", 2.5, TrialKind::Main, "row 2"}}, "whole numbers");
    refused({{"ann", "l01", "a", "", 3.0, TrialKind::Main, "row 2"}, {"ann", "l01", "a", "", 4.0, TrialKind::Main, "row 3"}},
            "row 3: rater 'ann', line 'l01', system 'a': duplicate answer (first at row 2)");
    refused({{"ann", "l09", "a", "", 3.0, TrialKind::Main, "row 2"}}, "no such line");
    refused({{"ann", "l01", "zz", "", 3.0, TrialKind::Main, "row 2"}}, "no such system");
    // A repeat of the same cell is not a duplicate.
    std::vector<Answer> ok = {{"ann", "l01", "a", "", 3.0, TrialKind::Main, "row 2"},
                              {"ann", "l01", "a", "", 4.0, TrialKind::Repeat, "row 3"}};
    EXPECT_NO_THROW(checkAnswers(d, ok, "ratings.csv"));
}

TEST(Answers, CmosAnswersWrittenEitherWayAgree) {
    const TestDesign d = designOf(TestKind::Cmos, {{"ref", SystemRole::Reference}, {"new", SystemRole::Candidate}}, 1, 1);
    std::vector<Answer> answers = {{"ann", "l01", "ref", "new", 2.0, TrialKind::Main, {}},
                                   {"bob", "l01", "new", "", 1.0, TrialKind::Main, {}}};
    checkAnswers(d, answers, "x");
    EXPECT_EQ(answers[0].system, "new");
    EXPECT_EQ(answers[0].versus, "ref");
    EXPECT_EQ(*answers[0].score, -2.0);
    EXPECT_EQ(answers[1].versus, "ref");
}

TEST(Answers, TrialRatingsBecomeCanonicalAnswers) {
    const TestDesign d = designOf(TestKind::Cmos, {{"ref", SystemRole::Reference}, {"new", SystemRole::Candidate}}, 1, 1);
    Trial t;
    t.stimuli = {{1, "A"}, {0, "B"}};  // heard: new first, then the reference
    auto answers = answersOfTrial(d, t, "ann", {2.0});  // the reference (second) is better by 2
    checkAnswers(d, answers, "x");
    EXPECT_EQ(answers[0].system, "new");
    EXPECT_EQ(*answers[0].score, -2.0);
    EXPECT_THROW(answersOfTrial(d, t, "ann", {1.0, 2.0}), ParamError);
}

TEST(Analysis, RaterWhoRatedNothingIsReportedNotCounted) {
    const TestDesign d = designOf(TestKind::Mos, {{"a", SystemRole::Candidate}, {"b", SystemRole::Candidate}}, 2, 3);
    std::vector<Answer> answers;
    for (const char* rater : {"ann", "bob"})
        for (const char* line : {"l01", "l02"})
            for (const char* sys : {"a", "b"})
                answers.push_back({rater, line, sys, "", (sys[0] == 'a') ? 4.0 : 3.0, TrialKind::Main, {}});
    answers.push_back({"cy", "l01", "a", "", std::nullopt, TrialKind::Main, {}});
    checkAnswers(d, answers, "x");
    const Report r = analyse(d, answers, {.bootstrapRounds = 0}, {}, {"dee"});
    EXPECT_EQ(r.screening.kept, (std::vector<std::string>{"ann", "bob"}));
    ASSERT_EQ(r.screening.excluded.size(), 2u);
    EXPECT_EQ(r.screening.excluded[0].rater, "cy");
    EXPECT_EQ(r.screening.excluded[0].rule, "rated-nothing");
    EXPECT_EQ(r.screening.excluded[1].rater, "dee");
    EXPECT_EQ(r.answersUsed, 8);
    EXPECT_TRUE(std::isnan(r.systems[0].bootLow));
}

}  // namespace
}  // namespace earmark::listening
