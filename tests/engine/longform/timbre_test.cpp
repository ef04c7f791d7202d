// Symmetric KL divergence between fitted Gaussians, checked against numpy
// (np.cov, np.linalg closed form; tests/data/make_longform_reference.py).
#include "earmark/longform/timbre.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>

namespace earmark {
namespace {

TimbreModel fitRows(const nlohmann::json& rows) {
    TimbreAccumulator acc(3);
    for (const auto& r : rows) {
        const std::vector<float> v = r.get<std::vector<float>>();
        acc.add(v.data());
    }
    return TimbreModel::fit(acc, 0.0);
}

TEST(Timbre, SymmetricKlMatchesNumpy) {
    std::ifstream in(std::string(EARMARK_TEST_DATA_DIR) + "/longform/reference.json");
    const auto doc = nlohmann::json::parse(in);
    ASSERT_EQ(doc["symmetric_kl"].size(), 2u);
    for (const auto& c : doc["symmetric_kl"]) {
        SCOPED_TRACE(c["name"].get<std::string>());
        const TimbreModel a = fitRows(c["a"]), b = fitRows(c["b"]);
        const double expected = c["symmetric_kl"].get<double>();
        EXPECT_NEAR(symmetricKl(a, b), expected, 1e-4 * expected);  // frames are float32 here
        EXPECT_NEAR(symmetricKl(b, a), expected, 1e-4 * expected);
        EXPECT_NEAR(symmetricKl(a, a), 0.0, 1e-9);
    }
}

TEST(Timbre, TooFewFramesGiveNoModel) {
    TimbreAccumulator acc(3);
    const float v[3] = {1, 2, 3};
    for (int i = 0; i < 3; ++i) acc.add(v);
    const TimbreModel m = TimbreModel::fit(acc);
    EXPECT_FALSE(m.valid());
    EXPECT_TRUE(std::isnan(symmetricKl(m, m)));
}

}  // namespace
}  // namespace earmark
