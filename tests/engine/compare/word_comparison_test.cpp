// The per-word table: differences B against A and the flags on them.
#include "earmark/compare/word_comparison.hpp"
#include "earmark/core/error.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <cmath>

namespace earmark {
namespace {

using ::testing::ElementsAre;

WordMeasures word(const std::string& text, double duration, std::optional<double> f0, std::optional<double> range,
                  double prominence) {
    WordMeasures m;
    m.text = text;
    m.durationS = duration;
    m.endS = duration;
    m.f0MeanHz = f0;
    m.f0RangeSt = range;
    m.prominence = prominence;
    return m;
}

TEST(WordComparison, DifferencesAndFlags) {
    const std::vector<WordMeasures> a = {word("one", 0.20, 100.0, 2.0, 0.0), word("two", 0.40, 120.0, 4.0, 1.0),
                                         word("three", 0.28, std::nullopt, std::nullopt, -1.0)};
    const std::vector<WordMeasures> b = {word("one", 0.30, 100.0 * std::pow(2.0, 3.0 / 12), 2.5, 0.2),
                                         word("two", 0.40, 120.0, 8.0, -0.5), word("three", 0.20, 110.0, 1.0, -1.0)};
    const WordTable t = compareWords(a, b);
    ASSERT_EQ(t.words.size(), 3u);
    EXPECT_DOUBLE_EQ(t.words[0].durationRatio, 1.5);
    EXPECT_NEAR(*t.words[0].f0MeanDiffSt, 3.0, 1e-12);
    EXPECT_DOUBLE_EQ(*t.words[0].f0RangeDiffSt, 0.5);
    EXPECT_THAT(t.words[0].flags, ElementsAre(WordDifference::Duration, WordDifference::F0Mean));
    EXPECT_DOUBLE_EQ(*t.words[1].f0RangeDiffSt, 4.0);
    EXPECT_DOUBLE_EQ(t.words[1].prominenceDiff, -1.5);
    EXPECT_THAT(t.words[1].flags, ElementsAre(WordDifference::F0Range, WordDifference::Prominence));
    // No F0 in A: no F0 difference, no F0 flag; 0.28 s → 0.2 s is a factor 1.4 shorter.
    EXPECT_FALSE(t.words[2].f0MeanDiffSt);
    EXPECT_THAT(t.words[2].flags, ElementsAre(WordDifference::Duration));
    // Largest: "one" lengthened by a factor 1.5 beats "three" shortened by 1.4.
    EXPECT_EQ(t.largest[static_cast<std::size_t>(WordDifference::Duration)], 0u);
    EXPECT_EQ(t.largest[static_cast<std::size_t>(WordDifference::F0Mean)], 0u);
    EXPECT_EQ(t.largest[static_cast<std::size_t>(WordDifference::F0Range)], 1u);
    EXPECT_EQ(t.largest[static_cast<std::size_t>(WordDifference::Prominence)], 1u);
}

TEST(WordComparison, NothingFlaggedBelowTheThresholds) {
    const std::vector<WordMeasures> a = {word("x", 0.30, 100.0, 2.0, 0.0)};
    const std::vector<WordMeasures> b = {word("x", 0.35, 110.0, 3.0, 0.5)};  // 17 %, 1.65 st, 1 st, 0.5
    const WordTable t = compareWords(a, b);
    EXPECT_TRUE(t.words[0].flags.empty());
    for (const auto& l : t.largest) EXPECT_FALSE(l);
}

TEST(WordComparison, BadParamsAndLengthsAreParamErrors) {
    WordFlagParams p;
    p.durationRatio = 1.0;
    EXPECT_THROW(compareWords({}, {}, p), ParamError);
    EXPECT_THROW(compareWords({word("x", 0.3, {}, {}, 0)}, {}), ParamError);
}

}  // namespace
}  // namespace earmark
