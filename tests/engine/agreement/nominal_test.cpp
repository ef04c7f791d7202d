// Cohen's kappa, Fleiss' kappa and Krippendorff's alpha against published
// worked examples and against sklearn / statsmodels / nltk (values written by
// the committed generator tests/data/make_agreement_reference.py), to 1e-9.
#include "earmark/agreement/nominal.hpp"
#include "earmark/core/error.hpp"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>

namespace earmark::agreement {
namespace {

constexpr double kTol = 1e-9;
constexpr int M = -1;  // missing, in the tables below

RatingTable tableOf(const std::vector<std::vector<int>>& rows) {
    RatingTable t;
    for (const auto& row : rows) {
        std::vector<std::optional<int>> cells;
        for (int v : row) cells.push_back(v < 0 ? std::nullopt : std::optional<int>(v));
        t.push_back(cells);
    }
    return t;
}

std::vector<std::optional<int>> columnOf(const RatingTable& t, std::size_t r) {
    std::vector<std::optional<int>> out;
    for (const auto& row : t) out.push_back(row[r]);
    return out;
}

// Krippendorff (2011), "Computing Krippendorff's alpha-reliability", section
// C: four observers, twelve units, values 1–5 with missing data; nominal
// alpha = 0.743 as printed there. The same value comes out of nltk's
// AnnotationTask.alpha on this table (checked when writing this test).
TEST(KrippendorffAlpha, PublishedExampleWithMissingData) {
    // Rows are units, columns observers A–D (the paper prints observers as rows).
    const RatingTable t = tableOf({{1, 1, M, 1}, {2, 2, 3, 2}, {3, 3, 3, 3}, {3, 3, 3, 3}, {2, 2, 2, 2}, {1, 2, 3, 4},
                                   {4, 4, 4, 4}, {1, 1, 2, 1}, {2, 2, 2, 2}, {M, 5, 5, 5}, {M, M, 1, 1}, {M, 3, M, M}});
    const ChanceCorrected a = krippendorffAlphaNominal(t);
    EXPECT_NEAR(a.value, 0.743, 0.0005);
    EXPECT_EQ(a.units, 11);  // the last unit has one value only: not pairable
}

// Krippendorff (2011), section A: two observers, ten units, binary data;
// alpha = 0.095 as printed there.
TEST(KrippendorffAlpha, PublishedBinaryExample) {
    const RatingTable t =
        tableOf({{0, 1}, {1, 1}, {0, 1}, {0, 0}, {0, 0}, {0, 1}, {0, 0}, {0, 0}, {1, 0}, {0, 0}});
    EXPECT_NEAR(krippendorffAlphaNominal(t).value, 0.095, 0.0005);
}

const nlohmann::json& reference() {
    static const nlohmann::json j = [] {
        std::ifstream in(std::string(EARMARK_TEST_DATA_DIR) + "/agreement/reference.json");
        return nlohmann::json::parse(in);
    }();
    return j;
}

TEST(NominalAgreement, MatchesReferenceLibraries) {
    ASSERT_GE(reference()["cases"].size(), 6u);
    int fleissChecked = 0;
    for (const auto& c : reference()["cases"]) {
        SCOPED_TRACE(c["name"].get<std::string>());
        const RatingTable t = tableOf(c["table"].get<std::vector<std::vector<int>>>());
        for (const auto& p : c["cohen"]) {
            const ChanceCorrected k = cohenKappa(columnOf(t, p["a"]), columnOf(t, p["b"]));
            EXPECT_NEAR(k.value, p["cohen"].get<double>(), kTol) << "sklearn cohen_kappa_score";
            EXPECT_EQ(k.units, p["units"].get<int>());
        }
        if (c.contains("fleiss")) {
            EXPECT_NEAR(fleissKappa(t).value, c["fleiss"].get<double>(), kTol) << "statsmodels fleiss_kappa";
            ++fleissChecked;
        }
        EXPECT_NEAR(krippendorffAlphaNominal(t).value, c["alpha"].get<double>(), kTol) << "nltk alpha";
    }
    EXPECT_GE(fleissChecked, 4);
}

// A unit with one rating holds no pair: the missing-data extension leaves it
// out, so the value equals Fleiss (1971) on the complete units.
TEST(FleissKappa, UnitsWithOneRatingAreLeftOut) {
    const RatingTable complete = tableOf({{0, 0, 1}, {1, 1, 1}, {2, 2, 0}, {0, 1, 2}, {1, 1, 0}});
    RatingTable withLoners = complete;
    withLoners.push_back({std::optional<int>(2), std::nullopt, std::nullopt});
    EXPECT_DOUBLE_EQ(fleissKappa(withLoners).value, fleissKappa(complete).value);
    EXPECT_EQ(fleissKappa(withLoners).units, 5);
}

TEST(NominalAgreement, PerfectAgreementIsOneAndOneCategoryIsUndefined) {
    const RatingTable perfect = tableOf({{0, 0, 0}, {1, 1, 1}, {2, 2, 2}, {1, 1, M}});
    EXPECT_DOUBLE_EQ(krippendorffAlphaNominal(perfect).value, 1.0);
    EXPECT_DOUBLE_EQ(fleissKappa(perfect).value, 1.0);
    EXPECT_DOUBLE_EQ(cohenKappa(columnOf(perfect, 0), columnOf(perfect, 2)).value, 1.0);
    const RatingTable single = tableOf({{0, 0}, {0, 0}, {0, 0}});
    EXPECT_TRUE(std::isnan(krippendorffAlphaNominal(single).value));
    EXPECT_TRUE(std::isnan(fleissKappa(single).value));
    EXPECT_TRUE(std::isnan(cohenKappa(columnOf(single, 0), columnOf(single, 1)).value));
    EXPECT_TRUE(std::isnan(krippendorffAlphaNominal({}).value));
    EXPECT_EQ(cohenKappa({std::nullopt}, {1}).units, 0);
}

TEST(NominalAgreement, RefusesMalformedTables) {
    EXPECT_THROW(fleissKappa(tableOf({{0, 1}, {0}})), ParamError);
    EXPECT_THROW(krippendorffAlphaNominal({{std::optional<int>(-2), std::optional<int>(0)}}), ParamError);
    EXPECT_THROW(cohenKappa({1, 2}, {1}), ParamError);
}

}  // namespace
}  // namespace earmark::agreement
