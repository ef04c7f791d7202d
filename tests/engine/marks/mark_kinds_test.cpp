// The mark vocabulary: categories, subtypes and severities as DESIGN.md lists them.
#include "earmark/marks/mark_kinds.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <string>
#include <vector>

namespace earmark {
namespace {

std::vector<std::string> names(std::span<const std::string_view> list) { return {list.begin(), list.end()}; }

// The table in DESIGN.md ("Mark categories") is the source of truth; the
// strings here are copied from it by hand, so a drift in either shows up.
TEST(MarkKinds, CategoriesAndSubtypesFollowTheDesignTable) {
    using ::testing::ElementsAre;
    EXPECT_EQ(categoryNameList(), "emphasis, intonation, timing, pronunciation, artifact, other");
    EXPECT_THAT(names(subtypesOf(MarkCategory::Emphasis)), ElementsAre("misplaced", "missing", "excessive"));
    EXPECT_THAT(names(subtypesOf(MarkCategory::Intonation)), ElementsAre("flat", "wrong-contour", "pitch-jump"));
    EXPECT_THAT(names(subtypesOf(MarkCategory::Timing)),
                ElementsAre("rushed", "dragged", "pause-missing", "pause-extra", "pause-too-long"));
    EXPECT_THAT(names(subtypesOf(MarkCategory::Pronunciation)),
                ElementsAre("wrong-sound", "wrong-stress", "dropped-sound", "added-sound"));
    EXPECT_THAT(names(subtypesOf(MarkCategory::Artifact)),
                ElementsAre("click", "buzz", "noise", "truncation", "clipping"));
    EXPECT_TRUE(subtypesOf(MarkCategory::Other).empty());
    EXPECT_EQ(severityNameList(), "minor, major, blocker");
}

TEST(MarkKinds, NamesParseBackAndUnknownNamesDoNot) {
    for (MarkCategory c : allMarkCategories()) EXPECT_EQ(parseCategory(categoryName(c)), c);
    for (Severity s : allSeverities()) EXPECT_EQ(parseSeverity(severityName(s)), s);
    EXPECT_FALSE(parseCategory("Emphasis"));  // names are case-sensitive: they are file-format words
    EXPECT_FALSE(parseCategory(""));
    EXPECT_FALSE(parseCategory("timin"));
    EXPECT_FALSE(parseSeverity("critical"));
}

TEST(MarkKinds, SubtypeMustBelongToItsCategory) {
    EXPECT_TRUE(isValidSubtype(MarkCategory::Intonation, "flat"));
    EXPECT_TRUE(isValidSubtype(MarkCategory::Intonation, ""));
    EXPECT_FALSE(isValidSubtype(MarkCategory::Timing, "flat"));
    EXPECT_FALSE(isValidSubtype(MarkCategory::Other, "flat"));
    EXPECT_TRUE(isValidSubtype(MarkCategory::Other, ""));
    EXPECT_FALSE(isValidSubtype(MarkCategory::Artifact, "Click"));
}

}  // namespace
}  // namespace earmark
