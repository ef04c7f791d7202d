// The long-form sections of the rules file: partial overrides, unknown keys
// and bad values are errors naming the key (the shipped defaults file is
// checked whole by tests/engine/prosody/rules_test.cpp).
#include "earmark/core/error.hpp"
#include "earmark/prosody/rules.hpp"

#include <gtest/gtest.h>

namespace earmark {
namespace {

std::string subjectOf(const std::string& json) {
    try {
        parseRules(json);
    } catch (const ParamError& e) {
        return e.subject();
    }
    return "(no error)";
}

TEST(LongformRules, PartialSectionsOverrideOnlyTheirKeys) {
    const ScanRules r = parseRules(R"({"seam": {"click_db": 25}, "rate_drift": {"enabled": false},
                                       "longform": {"window_s": 30, "min_take_s": 60}})");
    EXPECT_DOUBLE_EQ(r.longform.seam.clickDb, 25.0);
    EXPECT_DOUBLE_EQ(r.longform.seam.levelStepDb, LongformRules{}.seam.levelStepDb);
    EXPECT_FALSE(r.longform.rateDrift.enabled);
    EXPECT_TRUE(r.longform.levelDrift.enabled);
    EXPECT_DOUBLE_EQ(r.longform.windowSeconds, 30.0);
    EXPECT_DOUBLE_EQ(r.longform.minTakeSeconds, 60.0);
}

TEST(LongformRules, ErrorsNameTheKey) {
    EXPECT_EQ(subjectOf(R"({"seam": {"click": 3}})"), "rules.seam.click");
    EXPECT_EQ(subjectOf(R"({"monotone_stretch": {"max_range_st": -4}})"), "rules.monotone_stretch.max_range_st");
    EXPECT_EQ(subjectOf(R"({"longform": {"window_hop_s": 40}})"), "rules.longform.window_hop_s");
    EXPECT_EQ(subjectOf(R"({"longform": {"min_take_s": 10}})"), "rules.longform.min_take_s");
    EXPECT_EQ(subjectOf(R"({"longform": {"scan_min_take_s": 20}})"), "rules.longform.scan_min_take_s");
    EXPECT_EQ(subjectOf(R"({"timbre_shift": {"min_ratio": 1}})"), "rules.timbre_shift.min_ratio");
    EXPECT_EQ(subjectOf(R"({"seam": {"envelope_jump": 0.5}})"), "rules.seam.envelope_jump");
    EXPECT_EQ(subjectOf(R"({"level_drift": {"enabled": 1}})"), "rules.level_drift.enabled");
}

}  // namespace
}  // namespace earmark
