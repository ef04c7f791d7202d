// Mel-cepstral distortion against an independent numpy computation of
// Kubichek's formula (tests/data/model/make_model_data.py), a worked value,
// and the property that a change of level alone moves only c0.
#include "earmark/compare/mcd.hpp"
#include "earmark/core/error.hpp"
#include "earmark/export/npy.hpp"
#include "engine/model/model_data.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace earmark {
namespace {

FeatureMatrix loadCepstra(const std::string& name) {
    const NpyArray a = readNpy(test::modelDataPath(name));
    FeatureMatrix m;
    m.frames = static_cast<int>(a.shape.at(0));
    m.dims = static_cast<int>(a.shape.at(1));
    m.hopSeconds = 0.005;
    m.values = a.data;
    return m;
}

std::vector<FramePair> loadPairs(const std::string& name) {
    const NpyArray a = readNpy(test::modelDataPath(name));
    std::vector<FramePair> pairs;
    for (std::size_t i = 0; i + 1 < a.data.size(); i += 2)
        pairs.push_back({static_cast<int>(a.data[i]), static_cast<int>(a.data[i + 1])});
    return pairs;
}

TEST(Mcd, MatchesNumpyOnAWarpingPathAndFrameByFrame) {
    // Kubichek 1993: (10/ln 10)·sqrt(2·Σ_{d=1..24} Δc_d²), mean over pairs; numpy in float64.
    const auto ref = test::modelReference()["mcd"];
    const FeatureMatrix a = loadCepstra(ref["a"]), b = loadCepstra(ref["b"]);
    ASSERT_EQ(a.dims, 25);
    const std::vector<FramePair> pairs = loadPairs(ref["pairs"]);
    EXPECT_NEAR(meanMcdDb(a, b, pairs), ref["pairs_mean_db"].get<double>(), 1e-4);
    const std::vector<double> perPair = mcdPerPairDb(a, b, pairs);
    for (std::size_t k = 0; k < ref["pairs_first_db"].size(); ++k)
        EXPECT_NEAR(perPair[k], ref["pairs_first_db"][k].get<double>(), 1e-4) << k;
    std::vector<FramePair> diagonal;
    for (int i = 0; i < b.frames; ++i) diagonal.push_back({i, i});
    EXPECT_NEAR(meanMcdDb(a, b, diagonal), ref["diagonal_mean_db"].get<double>(), 1e-4);
    RecordProperty("earmark_minus_numpy_db",
                   std::to_string(meanMcdDb(a, b, pairs) - ref["pairs_mean_db"].get<double>()));
}

TEST(Mcd, IdenticalFramesGiveZeroAndC0IsLeftOut) {
    const float x[3] = {5.0f, 0.25f, -0.5f};
    const float y[3] = {-3.0f, 0.25f, -0.5f};  // differs only in c0
    EXPECT_DOUBLE_EQ(mcdFrameDb(x, x, 3), 0.0);
    EXPECT_DOUBLE_EQ(mcdFrameDb(x, y, 3), 0.0);
    // One coefficient one unit apart: (10/ln 10)·sqrt(2) = 6.1418 dB, worked from the formula.
    const float z[3] = {5.0f, 1.25f, -0.5f};
    EXPECT_NEAR(mcdFrameDb(x, z, 3), 10.0 / std::numbers::ln10 * std::sqrt(2.0), 1e-9);
    EXPECT_NEAR(mcdFrameDb(x, z, 3), 6.1418, 1e-4);
}

TEST(Mcd, ALevelChangeAloneMovesOnlyC0) {
    // A gain scales the mel power of every band alike: only c0 changes, so MCD stays 0.
    const Signal s = test::speechLike(1.5, 16000);
    Signal louder = s;
    for (float& v : louder.samples) v *= 0.5f;
    const FeatureMatrix a = mcdCepstra(s, {}), b = mcdCepstra(louder, {});
    std::vector<FramePair> pairs;
    for (int i = 0; i < a.frames; ++i) pairs.push_back({i, i});
    EXPECT_LT(meanMcdDb(a, b, pairs), 1e-3);
    EXPECT_GT(std::abs(a.row(a.frames / 2)[0] - b.row(a.frames / 2)[0]), 0.1f);  // c0 did move
}

TEST(Mcd, CepstraAreTheMfccsRescaledWithoutMeanNormalisation) {
    const Signal s = test::speechLike(0.5, 16000);
    MfccParams p;
    p.meanNormalise = false;
    const FeatureMatrix raw = computeMfcc(s, p);
    p.meanNormalise = true;  // ignored by mcdCepstra
    const FeatureMatrix c = mcdCepstra(s, p);
    ASSERT_EQ(c.values.size(), raw.values.size());
    const double scale = 1.0 / std::sqrt(8.0 * p.bands);
    for (std::size_t i = 0; i < c.values.size(); i += 97) EXPECT_NEAR(c.values[i], raw.values[i] * scale, 1e-6);
}

TEST(Mcd, BadInputsAreParamErrors) {
    FeatureMatrix a{2, 3, 0.005, std::vector<float>(6, 0.0f)};
    FeatureMatrix b{2, 4, 0.005, std::vector<float>(8, 0.0f)};
    EXPECT_THROW(meanMcdDb(a, b, {{0, 0}}), ParamError);
    EXPECT_THROW(meanMcdDb(a, a, {{0, 2}}), ParamError);
    EXPECT_THROW(meanMcdDb(a, a, {}), ParamError);
}

}  // namespace
}  // namespace earmark
