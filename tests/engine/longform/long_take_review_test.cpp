// The window's review of a long take: findings and series as analyseLongform
// gives them, text tiers when the text aligns, and a reason (not an error)
// when it does not. The truth is the built read's own placement
// (support/long_read.hpp).
#include "earmark/core/error.hpp"
#include "earmark/longform/long_take_review.hpp"

#include "support/long_read.hpp"

#include <gtest/gtest.h>

namespace earmark {
namespace {

TEST(LongTakeReview, SeriesAndFindingsAsTheAnalysisWithoutText) {
    const test::LongRead& read = test::twelveSentenceRead();
    const LongTakeReview r = reviewLongTake(read.audio, "  \n", LongformRules{}, referenceWarpingAligner());
    const LongformReport direct = analyseLongform(read.audio, {}, LongformRules{});
    EXPECT_EQ(r.series.windows.size(), direct.analysis.series.windows.size());
    EXPECT_EQ(r.findings.size(), direct.findings.size());
    EXPECT_FALSE(r.textTiers);
    EXPECT_TRUE(r.textProblem.empty());
}

TEST(LongTakeReview, TextGivesParagraphAndSentenceTiersAtTheSentences) {
    const test::LongRead& read = test::twelveSentenceRead();
    const LongTakeReview r = reviewLongTake(read.audio, read.text, LongformRules{}, referenceWarpingAligner());
    ASSERT_TRUE(r.textTiers) << r.textProblem;
    const Tier* sentences = r.textTiers->find(kSentencesTier);
    const Tier* paragraphs = r.textTiers->find(kParagraphsTier);
    ASSERT_TRUE(sentences && paragraphs);
    ASSERT_EQ(sentences->intervals.size(), 12u);
    EXPECT_EQ(paragraphs->intervals.size(), 2u);  // six sentences a paragraph
    for (std::size_t i = 0; i < 12; ++i) EXPECT_NEAR(sentences->intervals[i].startS, read.sentenceStartS[i], 0.3) << i;
    EXPECT_GE(r.textChunks, 1);
}

TEST(LongTakeReview, TextOfHalfTheTakeIsAReasonNotAnError) {
    const test::LongRead& read = test::twelveSentenceRead();
    std::string half;
    for (int i = 0; i < 6; ++i) half += test::longReadSentence(i) + " ";
    const LongTakeReview r = reviewLongTake(read.audio, half, LongformRules{}, referenceWarpingAligner());
    EXPECT_FALSE(r.textTiers);
    EXPECT_NE(r.textProblem.find("covers only"), std::string::npos) << r.textProblem;
    EXPECT_FALSE(r.series.windows.empty());
}

TEST(LongTakeReview, TooShortTakeIsAnInputError) {
    const Signal shortTake{std::vector<float>(3 * 16000, 0.0f), 16000.0};
    EXPECT_THROW(reviewLongTake(shortTake, "", LongformRules{}, referenceWarpingAligner()), InputError);
}

}  // namespace
}  // namespace earmark
