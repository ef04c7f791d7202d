// Numbers beyond what a reader can hold: a one-line InputError naming the
// file, never a library exception or undefined behaviour.
#include "earmark/core/error.hpp"
#include "earmark/tiers/timings_file.hpp"
#include "earmark/tiers/timings_json.hpp"
#include "earmark/tiers/token_durations.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <fstream>
#include <string>

namespace earmark {
namespace {

using ::testing::HasSubstr;

std::string problemOf(const std::string& path) {
    try {
        loadTimings(path);
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), path);
        return e.problem();
    }
    return "(no error)";
}

TEST(NumberLimits, TooLargeForADoubleNamesTheFile) {
    test::TempDir dir;
    const std::string digits(400, '9');
    const std::pair<const char*, std::string> cases[] = {
        {"exp.json", R"({"words": [{"text": "a", "start": 1e400, "end": 2}]})"},
        {"digits.json", R"({"words": [{"text": "a", "start": 0, "end": )" + digits + "}]}"},
        {"durations.json", R"({"hop_size": 256, "sample_rate": 1e400, "tokens": []})"},
        {"frames.json", R"({"hop_size": 256, "sample_rate": 22050, "tokens": [{"text": "a", "frames": )" + digits +
                            "}]}"},
    };
    for (const auto& [name, text] : cases) {
        std::ofstream(dir.file(name), std::ios::binary) << text;
        EXPECT_THAT(problemOf(dir.file(name)), HasSubstr("holds a number too large to read")) << name;
    }
    EXPECT_THAT(problemOf(dir.file("digits.json")), HasSubstr("99999999999999999999… (400 characters)"));
}

TEST(NumberLimits, FrameCountsThatAddUpPastTheLargestIntegerAreRefused) {
    // Each count fits in 64 bits; their sum does not (signed overflow before the check).
    const char* text = R"({"hop_size": 1, "sample_rate": 22050, "tokens": [
        {"text": "a", "frames": 9223372036854775807}, {"text": "b", "frames": 9223372036854775807}]})";
    try {
        parseTokenDurations(text, "big.json");
        FAIL() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "big.json");
        EXPECT_THAT(e.problem(), HasSubstr("tokens[1]: the frames add up past"));
    }
}

TEST(NumberLimits, AVersionNumberIsNotReadModulo2To32) {
    // 4294967297 = 2^32 + 1 became 1 when read as an int.
    EXPECT_THROW(parseTimingsJson(R"({"version": 4294967297, "words": []})", "v.json"), InputError);
}

TEST(RepeatedKeys, ATierGivenTwiceIsRefusedNotMerged) {
    // JSON (RFC 8259 §4) leaves repeated names undefined; a reader that kept
    // the last "words" would drop the first tier without a word.
    test::TempDir dir;
    std::ofstream(dir.file("twice.json"), std::ios::binary)
        << R"({"words": [{"text": "a", "start": 0, "end": 1}], "words": [{"text": "b", "start": 1, "end": 2}]})";
    EXPECT_THAT(problemOf(dir.file("twice.json")), HasSubstr("holds the key \"words\" twice in one object"));
    // The same name in two different objects is fine.
    std::ofstream(dir.file("rows.json"), std::ios::binary)
        << R"({"words": [{"text": "a", "start": 0, "end": 1}, {"text": "b", "start": 1, "end": 2}]})";
    EXPECT_EQ(problemOf(dir.file("rows.json")), "(no error)");
}

}  // namespace
}  // namespace earmark
