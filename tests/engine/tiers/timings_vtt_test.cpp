// WebVTT cues as a tier, per the W3C WebVTT format: both timestamp forms,
// optional cue identifiers, ignored cue settings, skipped NOTE/STYLE/REGION
// blocks, cue text tags and character references.
#include "earmark/tiers/timings_vtt.hpp"
#include "tier_matchers.hpp"

namespace earmark {
namespace {

using test::expectRowError;

TEST(TimingsVtt, RoundTripOnTheMillisecondGrid) {
    const TierSet set = test::sampleTierSet(false);
    const Tier& words = set.tiers[0];
    const LoadedTimings back = parseTimingsVtt(tierToVtt(words), "mem.vtt");
    TierSet expected;
    expected.tiers.push_back(words);
    test::expectSameTiers(expected, back.tiers);
}

TEST(TimingsVtt, WritesHoursMinutesSecondsMillis) {
    const std::string vtt = tierToVtt(Tier{"words", {{3723.4567, 3724.0, "a & <b>", {}}}});
    EXPECT_EQ(vtt, "WEBVTT\n\n01:02:03.457 --> 01:02:04.000\na &amp; &lt;b&gt;\n");
}

TEST(TimingsVtt, ReadsTheFormsTheStandardAllows) {
    const std::string text =
        "\xEF\xBB\xBFWEBVTT - ferry words\r\n"
        "Kind: captions\r\n"
        "\r\n"
        "STYLE\r\n::cue { color: yellow }\r\n\r\n"
        "NOTE this block is a comment\r\nand spans lines\r\n\r\n"
        "intro\r\n"
        "00:00.250 --> 00:00.610 align:start position:10%\r\n"
        "<v Guide>Café</v>\r\n\r\n"
        "00:00:00.610 --> 00:00:01.087\r\n"
        "na&iuml;ve &amp; <b>bold</b>\r\n"
        "second line\r\n\r\n"
        "NOTE\r\nlast note\r\n\r\n"
        "3\r\n"
        "100:00:00.000 --> 100:00:00.500\r\n"
        "&#x6771;&#20140;\r\n";
    const LoadedTimings t = parseTimingsVtt(text, "f.vtt");
    const auto& iv = t.tiers.tiers.at(0).intervals;
    ASSERT_EQ(iv.size(), 3u);
    EXPECT_EQ(t.tiers.tiers[0].name, "words");
    EXPECT_EQ(iv[0].startS, 0.25);
    EXPECT_EQ(iv[0].endS, 0.61);
    EXPECT_EQ(iv[0].label, "Café");
    // &iuml; is not one of the references decoded, so it stays as written.
    EXPECT_EQ(iv[1].label, "na&iuml;ve & bold second line");
    EXPECT_EQ(iv[2].startS, 360000.0);
    EXPECT_EQ(iv[2].label, "東京");
}

TEST(TimingsVtt, ErrorsNameTheLine) {
    expectRowError([] { parseTimingsVtt("WEBVTTX\n", "v.vtt"); }, "v.vtt", "line 1", "not a WebVTT file");
    expectRowError([] { parseTimingsVtt("WEBVTT\n\n00:00.000 --> 00:01.00\na\n", "v.vtt"); }, "v.vtt", "line 3",
                   "bad cue timing");
    expectRowError([] { parseTimingsVtt("WEBVTT\n\n00:00.000 --> 00:61.000\na\n", "v.vtt"); }, "v.vtt", "line 3",
                   "bad cue timing");
    expectRowError([] { parseTimingsVtt("WEBVTT\n\nid\njust text\n", "v.vtt"); }, "v.vtt", "line 3",
                   "without a timing line");
    expectRowError(
        [] { parseTimingsVtt("WEBVTT\n\n00:00.000 --> 00:01.000\na\n\n00:00.500 --> 00:02.000\nb\n", "v.vtt"); },
        "v.vtt", "line 6", "before the previous interval ends");
}

}  // namespace
}  // namespace earmark
