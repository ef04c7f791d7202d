// Earmark JSON timings (docs/timings-json.md): round trip with UTF-8 labels,
// and errors that name the file and the row or line.
#include "earmark/tiers/timings_json.hpp"
#include "tier_matchers.hpp"

#include <nlohmann/json.hpp>

namespace earmark {
namespace {

using test::expectRowError;

TEST(TimingsJson, RoundTripKeepsEveryFieldAndUtf8Label) {
    for (bool withConfidence : {false, true}) {
        const TierSet set = test::sampleTierSet(withConfidence);
        const std::string text = timingsToJson(set);
        const LoadedTimings back = parseTimingsJson(text, "mem.json");
        EXPECT_TRUE(back.warnings.empty());
        ASSERT_TRUE(back.tiers.durationS);
        EXPECT_EQ(*back.tiers.durationS, 4.0);
        test::expectSameTiers(set, back.tiers);
    }
}

TEST(TimingsJson, WrittenTextIsPlainJsonOfTheDocumentedShape) {
    // nlohmann-json, a general-purpose parser, reads what we write.
    const auto doc = nlohmann::json::parse(timingsToJson(test::sampleTierSet(true)));
    EXPECT_EQ(doc["version"], 1);
    EXPECT_EQ(doc["words"][2]["text"], "東京");
    EXPECT_EQ(doc["words"][2]["start"], 1.5);
    EXPECT_EQ(doc["words"][0]["confidence"], 0.93);
    EXPECT_EQ(doc["phones"].size(), 3u);
    EXPECT_FALSE(doc["phones"][0].contains("confidence"));
}

TEST(TimingsJson, KeepsTierOrderAndIgnoresUnknownKeys) {
    const char* text = R"({"source": "somewhere", "syllables": [{"text": "a", "start": 0, "end": 1}],
                          "words": [], "extra": {"x": 1}})";
    const LoadedTimings t = parseTimingsJson(text, "x.json");
    ASSERT_EQ(t.tiers.tiers.size(), 2u);
    EXPECT_EQ(t.tiers.tiers[0].name, "syllables");
    EXPECT_EQ(t.tiers.tiers[1].name, "words");
}

TEST(TimingsJson, MalformedJsonNamesLineAndColumn) {
    expectRowError([] { parseTimingsJson("{\n  \"words\": [\n    {\"text\": \"a\",, }\n]}", "bad.json"); },
                   "bad.json", "line 3, column", "not valid JSON");
}

TEST(TimingsJson, BadRowsNameTheRow) {
    expectRowError([] { parseTimingsJson(R"({"words":[{"text":"a","start":0,"end":1},{"text":"b","start":1}]})", "f.json"); },
                   "f.json", "words[1]", "'end' is missing");
    expectRowError([] { parseTimingsJson(R"({"words":[{"text":3,"start":0,"end":1}]})", "f.json"); }, "f.json",
                   "words[0]", "'text' is not a string");
    expectRowError([] { parseTimingsJson(R"({"words":[{"text":"a","start":"0","end":1}]})", "f.json"); }, "f.json",
                   "words[0]", "'start' is not a number");
    expectRowError([] { parseTimingsJson(R"({"phones":[{"text":"a","start":0.5,"end":0.2}]})", "f.json"); }, "f.json",
                   "phones[0]", "ends (0.200 s) before it starts (0.500 s)");
}

TEST(TimingsJson, DurationInTheFileOrFromTheCallerBoundsTheTiers) {
    const char* text = R"({"duration": 1.0, "words":[{"text":"late","start":0.5,"end":1.2}]})";
    expectRowError([&] { parseTimingsJson(text, "d.json"); }, "d.json", "words[0]", "past the end of the audio (1.000 s)");
    TimingsReadOptions longer;
    longer.takeDurationS = 2.0;
    EXPECT_NO_THROW(parseTimingsJson(text, "d.json", longer));
}

TEST(TimingsJson, EmptyLabelIsAWarningNamingTheRow) {
    const LoadedTimings t = parseTimingsJson(R"({"words":[{"text":"","start":0,"end":1}]})", "w.json");
    ASSERT_EQ(t.warnings.size(), 1u);
    EXPECT_THAT(t.warnings[0], ::testing::HasSubstr("words[0]"));
}

TEST(TimingsJson, RejectsOtherVersionsAndNonObjects) {
    EXPECT_THROW(parseTimingsJson(R"({"version": 2, "words": []})", "v.json"), InputError);
    EXPECT_THROW(parseTimingsJson("[1,2]", "v.json"), InputError);
}

}  // namespace
}  // namespace earmark
