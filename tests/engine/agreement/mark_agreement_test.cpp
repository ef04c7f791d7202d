// How marks become agreement units (docs/agreement.md): take × category,
// present/absent per reviewer, missing for a rater who did not review.
#include "earmark/agreement/mark_agreement.hpp"
#include "earmark/core/error.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace earmark::agreement {
namespace {

Mark markOf(TakeId take, const std::string& rater, MarkCategory c, double start, double end) {
    Mark m;
    m.takeId = take;
    m.rater = rater;
    m.category = c;
    m.startSeconds = start;
    m.endSeconds = end;
    return m;
}

const CategoryAgreement& rowFor(const AgreementReport& r, std::optional<MarkCategory> c) {
    for (const auto& row : r.rows)
        if (row.category == c) return row;
    throw std::runtime_error("no row");
}

TEST(MarkAgreement, UnitsAreTakeByCategoryWithMissingReviewers) {
    using C = MarkCategory;
    const std::vector<Mark> marks{
        markOf(1, "ann", C::Timing, 1.0, 1.5), markOf(1, "bo", C::Timing, 1.1, 1.6),
        markOf(1, "bo", C::Artifact, 0.2, 0.3), markOf(2, "cy", C::Intonation, 0.0, 2.0),
        markOf(3, "ann", C::Timing, 0.5, 0.9),  // take 3: only ann reviewed it, not compared
        markOf(2, "", C::Other, 0.0, 1.0),      // no rater: left out
    };
    // ann and cy reviewed take 2 (ann found nothing); bo never saw take 2.
    const ReviewersByTake reviewers{{2, {"ann", "cy"}}, {3, {"ann"}}};
    const AgreementReport r = markAgreement(marks, reviewers, {.toleranceSeconds = 0.1});
    EXPECT_EQ(r.raters, (std::vector<std::string>{"ann", "bo", "cy"}));
    EXPECT_EQ(r.takes, (std::vector<TakeId>{1, 2}));
    EXPECT_EQ(r.marksWithoutRater, 1);
    EXPECT_EQ(r.marksCompared, 4);
    ASSERT_EQ(r.rows.size(), 1 + allMarkCategories().size());

    // Timing, by hand: take 1 ann=1 bo=1 cy=missing; take 2 ann=0 bo=missing cy=0.
    const RatingTable timing{{1, 1, std::nullopt}, {0, std::nullopt, 0}};
    const auto& t = rowFor(r, C::Timing);
    EXPECT_EQ(t.alpha.units, 2);
    EXPECT_DOUBLE_EQ(t.alpha.value, krippendorffAlphaNominal(timing).value);
    // Overall pools 2 takes × 6 categories.
    const auto& all = rowFor(r, std::nullopt);
    EXPECT_EQ(all.alpha.units, 12);
    EXPECT_EQ(all.pairs.size(), 3u);  // ann-bo, ann-cy, bo-cy
    const PairAgreement& annBo = all.pairs[0];
    EXPECT_EQ(annBo.raterA, "ann");
    EXPECT_EQ(annBo.raterB, "bo");
    EXPECT_EQ(annBo.takes, 1);
    EXPECT_EQ(annBo.cohen.units, 6);  // take 1 × 6 categories
    EXPECT_EQ(annBo.spans.matched, 1);  // the timing marks overlap; bo's artifact has no partner
    EXPECT_EQ(annBo.spans.onlyB(), 1);
    EXPECT_DOUBLE_EQ(annBo.spans.recall(), 1.0);
    EXPECT_DOUBLE_EQ(annBo.spans.precision(), 0.5);
    const PairAgreement& annCy = all.pairs[1];
    EXPECT_EQ(annCy.takes, 1);
    EXPECT_EQ(annCy.spans.onlyB(), 1);
    const PairAgreement& boCy = all.pairs[2];
    EXPECT_EQ(boCy.takes, 0);
    EXPECT_EQ(boCy.cohen.units, 0);
    EXPECT_TRUE(std::isnan(boCy.cohen.value));
}

TEST(MarkAgreement, SpansOfDifferentCategoriesNeverMatch) {
    using C = MarkCategory;
    const std::vector<Mark> marks{markOf(1, "ann", C::Timing, 1.0, 2.0), markOf(1, "bo", C::Emphasis, 1.0, 2.0)};
    const AgreementReport r = markAgreement(marks, {});
    EXPECT_EQ(rowFor(r, std::nullopt).pairs.at(0).spans.matched, 0);
    EXPECT_EQ(rowFor(r, std::nullopt).pairs.at(0).spans.spansA, 1);
}

TEST(MarkAgreement, RefusesNegativeTolerance) {
    EXPECT_THROW(markAgreement({}, {}, {.toleranceSeconds = -1.0}), ParamError);
}

}  // namespace
}  // namespace earmark::agreement
