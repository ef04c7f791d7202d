// The rules document: the file shipped in docs/ is exactly the compiled-in
// defaults; partial files override only what they name; unknown keys, wrong
// types and bad values are errors naming the key.
#include "earmark/core/error.hpp"
#include "earmark/prosody/rules.hpp"

#include <nlohmann/json.hpp>

#include <gtest/gtest.h>

#include <fstream>
#include <sstream>

namespace earmark {
namespace {

std::string paramErrorSubject(const std::string& json) {
    try {
        parseRules(json);
    } catch (const ParamError& e) {
        return e.subject();
    }
    return "(no error)";
}

TEST(Rules, ShippedDefaultFileEqualsCompiledDefaults) {
    const std::string path = std::string(EARMARK_SOURCE_DIR) + "/docs/rules-default.json";
    std::ifstream in(path);
    ASSERT_TRUE(in) << path;
    std::stringstream text;
    text << in.rdbuf();
    auto shipped = nlohmann::json::parse(text.str());
    shipped.erase("comment");
    EXPECT_EQ(shipped, nlohmann::json::parse(rulesToJson(ScanRules{})));
    // And it parses back to the same values.
    EXPECT_EQ(rulesToJson(loadRules(path)), rulesToJson(ScanRules{}));
}

TEST(Rules, PartialFileOverridesOnlyItsKeys) {
    const auto r = parseRules(R"({"flat": {"max_range_st": 3.5}, "rushed": {"enabled": false},
                                  "clipping": {"max_clipped_samples": 0}})");
    EXPECT_DOUBLE_EQ(r.flat.maxRangeSt, 3.5);
    EXPECT_EQ(r.flat.minWords, ScanRules{}.flat.minWords);
    EXPECT_FALSE(r.rushed.enabled);
    EXPECT_EQ(r.clipping.maxClippedSamples, 0);
    EXPECT_DOUBLE_EQ(r.pauseTooLong.maxSeconds, 1.0);
}

TEST(Rules, ErrorsNameTheKey) {
    EXPECT_EQ(paramErrorSubject(R"({"flat": {"max_range": 3}})"), "rules.flat.max_range");
    EXPECT_EQ(paramErrorSubject(R"({"flatness": {}})"), "rules.flatness");
    EXPECT_EQ(paramErrorSubject(R"({"flat": {"min_words": 2.5}})"), "rules.flat.min_words");
    EXPECT_EQ(paramErrorSubject(R"({"flat": {"enabled": "yes"}})"), "rules.flat.enabled");
    EXPECT_EQ(paramErrorSubject(R"({"pause_too_long": {"max_s": -1}})"), "rules.pause_too_long.max_s");
    EXPECT_EQ(paramErrorSubject(R"({"measure": {"min_pause_s": 0}})"), "rules.measure.min_pause_s");
    EXPECT_EQ(paramErrorSubject(R"({"dragged": {"min_syllables_per_s": 9}})"), "rules.dragged.min_syllables_per_s");
    EXPECT_EQ(paramErrorSubject(R"({"rushed": 3})"), "rules.rushed");
    EXPECT_EQ(paramErrorSubject(R"([1, 2])"), "rules");
    // Bad content of a rules file is a bad setting (docs/scan.md: exit 2), named by the file.
    EXPECT_EQ(paramErrorSubject("{not json"), "rules");
    EXPECT_THROW(loadRules("/nonexistent/rules.json"), InputError);
}

TEST(Rules, NumbersBeyondTheirTypeAreRefusedNotWrapped) {
    try {
        parseRules(R"({"flat": {"max_range_st": 1e400}})", "big.json");
        FAIL() << "expected ParamError";
    } catch (const ParamError& e) {
        EXPECT_EQ(e.subject(), "big.json");
        EXPECT_NE(std::string(e.problem()).find("too large"), std::string::npos) << e.what();
    }
    // 2^32 + 4 read as an int was 4: a silent wrong threshold.
    EXPECT_EQ(paramErrorSubject(R"({"flat": {"min_words": 4294967300}})"), "rules.flat.min_words");
    EXPECT_EQ(paramErrorSubject(R"({"flat": {"min_words": 18446744073709551615}})"), "rules.flat.min_words");
}

}  // namespace
}  // namespace earmark
