// Plain CSV timings with RFC 4180 quoting: round trip, optional header, the
// RFC's own record rules, and errors naming the file and line.
#include "earmark/tiers/timings_csv.hpp"
#include "tier_matchers.hpp"

namespace earmark {
namespace {

using test::expectRowError;

TEST(TimingsCsv, RoundTripKeepsTiersQuotedLabelsAndConfidence) {
    for (bool withConfidence : {false, true}) {
        const TierSet set = test::sampleTierSet(withConfidence);
        const LoadedTimings back = parseTimingsCsv(timingsToCsv(set), "mem.csv");
        EXPECT_TRUE(back.warnings.empty());
        test::expectSameTiers(set, back.tiers);
    }
}

TEST(TimingsCsv, WritesRfc4180Quoting) {
    // RFC 4180 §2 rules 6-7: fields with commas, quotes or line breaks are
    // enclosed in double quotes, and a quote inside is doubled; CRLF ends records.
    TierSet set;
    set.tiers.push_back(Tier{"words", {{0, 0.5, "a,b", {}}, {0.5, 1, "say \"x\"", {}}, {1, 1.5, "two\nlines", {}}}});
    EXPECT_EQ(timingsToCsv(set),
              "start,end,label,tier\r\n0,0.5,\"a,b\",words\r\n0.5,1,\"say \"\"x\"\"\",words\r\n"
              "1,1.5,\"two\nlines\",words\r\n");
}

TEST(TimingsCsv, HeaderIsOptionalAndTierDefaults) {
    TimingsReadOptions opt;
    opt.defaultTier = "phones";
    const LoadedTimings t = parseTimingsCsv("0.1,0.2,k\n0.2,0.35,æ\n", "p.csv", opt);
    ASSERT_EQ(t.tiers.tiers.size(), 1u);
    EXPECT_EQ(t.tiers.tiers[0].name, "phones");
    EXPECT_EQ(t.tiers.tiers[0].intervals[1].label, "æ");
    EXPECT_EQ(t.tiers.tiers[0].intervals[1].endS, 0.35);
}

TEST(TimingsCsv, HeaderColumnsMayComeInAnyOrder) {
    const LoadedTimings t = parseTimingsCsv("\xEF\xBB\xBFLabel,Tier,End,Start\r\nhello,words,0.5,0.1\r\n", "h.csv");
    ASSERT_EQ(t.tiers.tiers.size(), 1u);
    const Interval& iv = t.tiers.tiers[0].intervals[0];
    EXPECT_EQ(iv.label, "hello");
    EXPECT_EQ(iv.startS, 0.1);
    EXPECT_EQ(iv.endS, 0.5);
}

TEST(TimingsCsv, ReadsTheRfcRecordForms) {
    // RFC 4180 §2: last record may lack a line break (rule 2); quoted fields
    // may hold CRLF (rule 6) and doubled quotes (rule 7); spaces are part of a field (rule 4).
    const LoadedTimings t = parseTimingsCsv("0,1,\"a\r\nb\",words\r\n1,2,\"b\"\"bb\",words\r\n2,3, c ,words", "r.csv");
    const auto& iv = t.tiers.tiers[0].intervals;
    ASSERT_EQ(iv.size(), 3u);
    EXPECT_EQ(iv[0].label, "a\r\nb");
    EXPECT_EQ(iv[1].label, "b\"bb");
    EXPECT_EQ(iv[2].label, " c ");
}

TEST(TimingsCsv, ErrorsNameTheLineWhereTheRecordStarts) {
    // Line 3 holds a quoted field spanning two lines, so the bad record is on line 5.
    const std::string text = "start,end,label\n0,0.5,a\n0.5,1,\"b\nb\"\n1,2,c\n2,1.5,d\n";
    expectRowError([&] { parseTimingsCsv(text, "t.csv"); }, "t.csv", "line 6", "ends (1.500 s) before it starts (2.000 s)");
    expectRowError([] { parseTimingsCsv("0,0.5,a\n0.5,x,b\n", "t.csv"); }, "t.csv", "line 2",
                   "end 'x' is not a number");
    expectRowError([] { parseTimingsCsv("0,0.5\n", "t.csv"); }, "t.csv", "line 1", "found 2 field(s)");
    expectRowError([] { parseTimingsCsv("0,0.5,a\n0.5,1,\"open\n", "t.csv"); }, "t.csv", "line 2", "not closed");
    expectRowError([] { parseTimingsCsv("0,0.5,a\"b\n", "t.csv"); }, "t.csv", "line 1", "quote inside an unquoted");
    expectRowError([] { parseTimingsCsv("0,0.5,a\n0.4,1,b\n", "t.csv"); }, "t.csv", "line 2", "before the previous interval ends");
    TimingsReadOptions opt;
    opt.takeDurationS = 1.0;
    expectRowError([&] { parseTimingsCsv("0,0.5,a\n0.5,1.3,b\n", "t.csv", opt); }, "t.csv", "line 2",
                   "past the end of the audio");
}

TEST(TimingsCsv, BlankLinesAreSkippedAndEmptyLabelsWarned) {
    const LoadedTimings t = parseTimingsCsv("\n0,0.5,\n\n0.5,1,b\n\n", "b.csv");
    ASSERT_EQ(t.tiers.tiers[0].intervals.size(), 2u);
    ASSERT_EQ(t.warnings.size(), 1u);
    EXPECT_THAT(t.warnings[0], ::testing::StartsWith("line 2"));
}

}  // namespace
}  // namespace earmark
