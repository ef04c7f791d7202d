// Theil–Sen fits checked against scipy.stats.theilslopes (data made by
// tests/data/make_longform_reference.py).
#include "earmark/core/error.hpp"
#include "earmark/longform/theil_sen.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>

namespace earmark {
namespace {

nlohmann::json reference() {
    std::ifstream in(std::string(EARMARK_TEST_DATA_DIR) + "/longform/reference.json");
    return nlohmann::json::parse(in);
}

TEST(TheilSen, MatchesScipyTheilslopes) {
    const auto doc = reference();
    ASSERT_EQ(doc["theil_sen"].size(), 3u);
    for (const auto& c : doc["theil_sen"]) {
        SCOPED_TRACE(c["name"].get<std::string>());
        const TrendFit fit = theilSen(c["x"].get<std::vector<double>>(), c["y"].get<std::vector<double>>());
        ASSERT_TRUE(fit.valid);
        EXPECT_NEAR(fit.slope, c["slope"].get<double>(), 1e-12);
        EXPECT_NEAR(fit.intercept, c["intercept"].get<double>(), 1e-12);
        EXPECT_NEAR(fit.slopeLow, c["low"].get<double>(), 1e-12);
        EXPECT_NEAR(fit.slopeHigh, c["high"].get<double>(), 1e-12);
    }
}

TEST(TheilSen, ExactLineAndOutlier) {
    // y = 2 − 0.5x with one wild point: the median of pairwise slopes ignores it.
    std::vector<double> x, y;
    for (int i = 0; i < 21; ++i) {
        x.push_back(i);
        y.push_back(2.0 - 0.5 * i);
    }
    y[10] = 100.0;
    const TrendFit fit = theilSen(x, y);
    EXPECT_DOUBLE_EQ(fit.slope, -0.5);
    EXPECT_TRUE(fit.significant());
}

TEST(TheilSen, DegenerateAndInvalidInput) {
    EXPECT_FALSE(theilSen({1.0, 1.0, 1.0}, {0.0, 1.0, 2.0}).valid);  // no distinct x
    EXPECT_FALSE(theilSen({}, {}).valid);
    const double nan = std::nan("");
    EXPECT_FALSE(theilSen({0.0, nan}, {1.0, 2.0}).valid);  // non-finite pairs are skipped
    EXPECT_THROW(theilSen({1.0, 2.0}, {1.0}), ParamError);
    EXPECT_THROW(theilSen({1.0, 2.0}, {1.0, 2.0}, 1.0), ParamError);
}

}  // namespace
}  // namespace earmark
