// Listening-test statistics against scipy.stats (values written by the
// committed generator tests/data/make_listening_reference.py), to 1e-9.
#include "earmark/core/error.hpp"
#include "earmark/listening/distributions.hpp"
#include "earmark/listening/hypothesis_tests.hpp"
#include "listening_fixtures.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>

namespace earmark::listening {
namespace {

using fixtures::kTol;

std::vector<double> numbers(const nlohmann::json& j) { return j.get<std::vector<double>>(); }

TEST(StudentT, CdfAndSurvivalMatchScipy) {
    ASSERT_FALSE(fixtures::statsReference()["t_points"].empty());
    for (const auto& c : fixtures::statsReference()["t_points"]) {
        const double t = c["t"], nu = c["nu"];
        EXPECT_NEAR(studentTCdf(t, nu), c["cdf"].get<double>(), kTol) << "t=" << t << " nu=" << nu;
        EXPECT_NEAR(studentTSf(t, nu), c["sf"].get<double>(), kTol) << "t=" << t << " nu=" << nu;
    }
}

TEST(StudentT, QuantileMatchesScipy) {
    for (const auto& c : fixtures::statsReference()["t_quantiles"]) {
        const double p = c["p"], nu = c["nu"];
        EXPECT_NEAR(studentTQuantile(p, nu), c["q"].get<double>(), kTol) << "p=" << p << " nu=" << nu;
    }
}

TEST(StudentT, RefusesBadArguments) {
    EXPECT_THROW(studentTQuantile(1.0, 3), ParamError);
    EXPECT_THROW(studentTCdf(1.0, 0), ParamError);
    EXPECT_THROW(incompleteBeta(-1, 2, 0.5), ParamError);
}

TEST(MeanInterval, MatchesScipyT) {
    for (const auto& c : fixtures::statsReference()["mean_intervals"]) {
        const MeanInterval m = meanInterval(numbers(c["values"]));
        EXPECT_NEAR(m.mean, c["mean"].get<double>(), kTol);
        EXPECT_NEAR(m.sd, c["sd"].get<double>(), kTol);
        EXPECT_NEAR(m.low, c["low"].get<double>(), kTol);
        EXPECT_NEAR(m.high, c["high"].get<double>(), kTol);
    }
}

TEST(MeanInterval, UndefinedBelowTwoValues) {
    const MeanInterval one = meanInterval({3.0});
    EXPECT_EQ(one.mean, 3.0);
    EXPECT_TRUE(std::isnan(one.low));
    EXPECT_TRUE(std::isnan(meanInterval({}).mean));
}

TEST(PairedT, MatchesScipyTtestRel) {
    for (const auto& c : fixtures::statsReference()["paired_t"]) {
        const auto x = numbers(c["x"]), y = numbers(c["y"]);
        std::vector<double> d(x.size());
        for (std::size_t i = 0; i < x.size(); ++i) d[i] = x[i] - y[i];
        const TestResult r = pairedT(d);
        ASSERT_TRUE(r.defined);
        EXPECT_NEAR(r.statistic, c["statistic"].get<double>(), kTol);
        EXPECT_NEAR(r.p, c["p"].get<double>(), kTol);
        EXPECT_NEAR(r.effect, c["dz"].get<double>(), kTol);
    }
}

TEST(PairedT, UndefinedWithoutSpread) {
    EXPECT_FALSE(pairedT({1, 1, 1}).defined);
    EXPECT_FALSE(pairedT({1}).defined);
}

TEST(Wilcoxon, MatchesScipyExactAndApprox) {
    int exact = 0, approx = 0;
    for (const auto& c : fixtures::statsReference()["wilcoxon"]) {
        const TestResult r = wilcoxonSignedRank(numbers(c["d"]));
        ASSERT_TRUE(r.defined);
        EXPECT_EQ(r.method, c["method"].get<std::string>());
        EXPECT_NEAR(r.statistic, c["statistic"].get<double>(), kTol);
        EXPECT_NEAR(r.p, c["p"].get<double>(), kTol) << c["d"].dump();
        (r.method == "exact" ? exact : approx)++;
    }
    EXPECT_GT(exact, 0);
    EXPECT_GT(approx, 0);
}

TEST(Wilcoxon, AllZeroDifferencesAreUndefined) {
    const TestResult r = wilcoxonSignedRank({0, 0, 0});
    EXPECT_FALSE(r.defined);
    EXPECT_FALSE(r.why.empty());
}

TEST(Binomial, MatchesScipyBinomtest) {
    for (const auto& c : fixtures::statsReference()["binomial"]) {
        const BinomialResult r = binomialTest(c["k"], c["n"]);
        EXPECT_NEAR(r.p, c["p"].get<double>(), kTol) << c.dump();
        EXPECT_NEAR(r.low, c["low"].get<double>(), kTol) << c.dump();
        EXPECT_NEAR(r.high, c["high"].get<double>(), kTol) << c.dump();
    }
}

TEST(Holm, MatchesStepDownDefinition) {
    for (const auto& c : fixtures::statsReference()["holm"]) {
        const auto adjusted = holmAdjust(numbers(c["p"]));
        const auto expected = numbers(c["adjusted"]);
        ASSERT_EQ(adjusted.size(), expected.size());
        for (std::size_t i = 0; i < expected.size(); ++i) EXPECT_NEAR(adjusted[i], expected[i], kTol);
    }
}

TEST(Holm, LeavesUndefinedOutOfTheFamily) {
    const auto a = holmAdjust({0.01, std::nan(""), 0.02});
    EXPECT_NEAR(a[0], 0.02, 1e-15);  // family of two, not three
    EXPECT_TRUE(std::isnan(a[1]));
    EXPECT_NEAR(a[2], 0.02, 1e-15);
}

}  // namespace
}  // namespace earmark::listening
