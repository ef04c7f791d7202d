// Mel filterbanks against an independent numpy implementation of the
// published definitions (tests/data/make_reference_data.py: HTK and Slaney
// scales, triangles at k·rate/n_fft, Slaney area normalisation 2/(f_{i+2} − f_i)),
// for both scales and both normalisations.
#include "earmark/core/error.hpp"
#include "earmark/export/npy.hpp"
#include "earmark/spectral/mel.hpp"
#include "reference_data.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

namespace earmark {
namespace {

TEST(MelFilterbank, MatchesNumpyForBothScalesAndNormalisations) {
    const nlohmann::json ref = test::melReference();
    ASSERT_EQ(ref.at("filterbanks").size(), 4u);
    for (const auto& entry : ref.at("filterbanks")) {
        const std::string name = entry.at("name");
        SCOPED_TRACE(name);
        const MelParams params = test::melParamsFrom(entry);
        const MelFilterbank fb = makeMelFilterbank(params, entry.at("rate").get<double>());

        const auto edges = entry.at("edgesHz").get<std::vector<double>>();
        ASSERT_EQ(fb.edgesHz.size(), edges.size());
        for (std::size_t i = 0; i < edges.size(); ++i) EXPECT_NEAR(fb.edgesHz[i], edges[i], 1e-9 * std::max(1.0, edges[i]));

        const NpyArray weights = readNpy(test::melDataPath(entry.at("weights")));
        ASSERT_EQ(weights.shape, (std::vector<std::int64_t>{fb.bands, fb.bins}));
        const float peak = *std::max_element(weights.data.begin(), weights.data.end());
        double worst = 0.0;
        for (std::size_t i = 0; i < weights.data.size(); ++i)
            worst = std::max(worst, static_cast<double>(std::abs(fb.weights[i] - weights.data[i])));
        // Both sides compute in double and round to float: at most an ulp or two apart.
        EXPECT_LE(worst, 1e-6 * peak) << "max abs deviation " << worst;
        ::testing::Test::RecordProperty(name + "_max_abs_dev", test::formatG(worst));
    }
}

TEST(MelFilterbank, SparseSpansCoverExactlyTheNonZeroWeights) {
    MelParams params;
    const MelFilterbank fb = makeMelFilterbank(params, 22050);
    for (int b = 0; b < fb.bands; ++b) {
        ASSERT_GT(fb.binCount[b], 0);
        for (int k = 0; k < fb.bins; ++k) {
            const bool inside = k >= fb.firstBin[b] && k < fb.firstBin[b] + fb.binCount[b];
            const float w = fb.weights[static_cast<std::size_t>(b * fb.bins + k)];
            if (inside) EXPECT_GT(w, 0.0f) << b << " " << k;
            else EXPECT_EQ(w, 0.0f) << b << " " << k;
        }
    }
}

TEST(MelFilterbank, AreaNormalisationScalesEachTriangleByTwoOverItsWidth) {
    MelParams params;
    params.normalisation = MelNormalisation::None;
    const MelFilterbank plain = makeMelFilterbank(params, 22050);
    params.normalisation = MelNormalisation::Area;
    const MelFilterbank area = makeMelFilterbank(params, 22050);
    for (int b = 0; b < plain.bands; ++b) {
        const double scale = 2.0 / (plain.edgesHz[static_cast<std::size_t>(b + 2)] - plain.edgesHz[static_cast<std::size_t>(b)]);
        for (int k = 0; k < plain.bins; ++k) {
            const auto i = static_cast<std::size_t>(b * plain.bins + k);
            EXPECT_NEAR(area.weights[i], plain.weights[i] * scale, 1e-6 * scale);
        }
    }
}

void expectMelParamError(const MelParams& p, const std::string& field, const std::string& words = {},
                         double rate = 22050) {
    try {
        makeMelFilterbank(p, rate);
        ADD_FAILURE() << "no error for " << field;
    } catch (const ParamError& e) {
        EXPECT_EQ(e.subject(), field) << e.what();
        EXPECT_NE(std::string(e.what()).find(words), std::string::npos) << e.what();
    }
}

TEST(MelFilterbank, InvalidParamsNameTheField) {
    MelParams p;
    p.fmaxHz = 12000;  // above 11025
    expectMelParamError(p, "MelParams.fmaxHz", "half the sample rate");
    p = {};
    p.bands = 0;
    expectMelParamError(p, "MelParams.bands", "at least 1");
    p = {};
    p.fminHz = 8000;
    expectMelParamError(p, "MelParams.fmaxHz", "above fminHz");
    p = {};
    p.fminHz = -1;
    expectMelParamError(p, "MelParams.fminHz");
    p = {};
    p.stft.hopSize = 0;
    expectMelParamError(p, "MelParams.stft.hopSize");
    p = {};
    p.stft.windowSize = 4096;
    expectMelParamError(p, "MelParams.stft.windowSize");
    p = {};
    p.floor = 0;
    expectMelParamError(p, "MelParams.floor");
    expectMelParamError(MelParams{}, "Signal.sampleRate", "", 0.0);
}

TEST(MelFilterbank, BandsNarrowerThanABinAreRefused) {
    MelParams p;
    p.stft.fftSize = 256;  // 62.5 Hz bins at 16 kHz
    p.stft.windowSize = 256;
    p.bands = 128;
    expectMelParamError(p, "MelParams.bands", "too many bands (128) for fftSize 256", 16000);
    p.bands = 40;  // fine at this size
    EXPECT_NO_THROW(makeMelFilterbank(p, 16000));
}

}  // namespace
}  // namespace earmark
