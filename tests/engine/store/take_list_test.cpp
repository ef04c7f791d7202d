// Reading lists of takes: RFC 4180 CSV, and samples/lines.csv itself.
#include "earmark/core/error.hpp"
#include "earmark/store/take_list.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace earmark {
namespace {

using ::testing::ElementsAre;
using ::testing::HasSubstr;

// Records from RFC 4180, section 2 (rules 1-7).
TEST(TakeList, Rfc4180Records) {
    EXPECT_THAT(parseCsv("aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n", "t"),
                ElementsAre(ElementsAre("aaa", "bbb", "ccc"), ElementsAre("zzz", "yyy", "xxx")));
    EXPECT_THAT(parseCsv("aaa,bbb,ccc", "t"), ElementsAre(ElementsAre("aaa", "bbb", "ccc")));  // rule 2
    EXPECT_THAT(parseCsv("\"aaa\",\"b\r\nbb\",\"ccc\"\r\n", "t"),
                ElementsAre(ElementsAre("aaa", "b\r\nbb", "ccc")));  // rule 6
    EXPECT_THAT(parseCsv("\"aaa\",\"b\"\"bb\",\"ccc\"", "t"), ElementsAre(ElementsAre("aaa", "b\"bb", "ccc")));  // rule 7
    EXPECT_THAT(parseCsv("a,,\n", "t"), ElementsAre(ElementsAre("a", "", "")));
    EXPECT_THAT(parseCsv("a\nb\n", "t"), ElementsAre(ElementsAre("a"), ElementsAre("b")));  // LF accepted
}

TEST(TakeList, MalformedCsvNamesTheLine) {
    try {
        parseCsv("a,b\n\"open,c\n", "list.csv");
        FAIL();
    } catch (const InputError& e) {
        EXPECT_THAT(e.what(), HasSubstr("list.csv: line 2: a quoted field is not closed"));
    }
    EXPECT_THROW(parseCsv("\"a\"b,c\n", "x"), InputError);
}

TEST(TakeList, ReadsTheDemoLinesWithPathsRelativeToTheCsv) {
    const std::string csv = std::string(EARMARK_SOURCE_DIR) + "/samples/lines.csv";
    const auto takes = readTakeList(csv, "pennant-2");
    ASSERT_EQ(takes.size(), 12u);
    EXPECT_EQ(takes[2].lineId, "ferry-003");
    EXPECT_EQ(takes[0].text, "Good morning, and welcome aboard the seven fifteen crossing to Wrenholm.");
    EXPECT_EQ(takes[2].build, "pennant-2");
    const auto expected = (std::filesystem::path(EARMARK_SOURCE_DIR) / "samples/takes/ferry-003.wav").lexically_normal();
    EXPECT_EQ(takes[2].audioPath, expected.string());
    EXPECT_TRUE(std::filesystem::exists(takes[2].audioPath));
}

TEST(TakeList, BadListsAreRefusedWithTheReason) {
    test::TempDir dir;
    auto attempt = [&](const std::string& text) {
        std::ofstream(dir.file("l.csv"), std::ios::binary) << text;
        try {
            readTakeList(dir.file("l.csv"));
        } catch (const InputError& e) {
            return std::string(e.what());
        }
        return std::string();
    };
    EXPECT_THAT(attempt("name,file\nx,y.wav\n"), HasSubstr("needs a header row with the columns id and audio"));
    EXPECT_THAT(attempt("id,audio,text\nx\n"), HasSubstr("row 2 has 1 fields; the header has 3"));
    EXPECT_THAT(attempt("id,audio\n,y.wav\n"), HasSubstr("row 2 has an empty id or audio"));
    EXPECT_THAT(attempt("id,audio,text\nx,y.wav,caf\xE9\n"), HasSubstr("is not UTF-8 text"));
    EXPECT_EQ(attempt("\xEF\xBB\xBFid,audio\r\nx,y z.wav\r\n\r\n"), "");  // BOM, CRLF, blank line
    EXPECT_THAT(attempt(""), HasSubstr("is empty"));
    EXPECT_THROW(readTakeList(dir.file("missing.csv")), InputError);
}

}  // namespace
}  // namespace earmark
