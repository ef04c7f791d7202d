// earmark-cli mark list: every mark with the rater who made it, as a table
// column and, with --json, as the defect list's "rater" field.
#include "run_cli.hpp"

#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

namespace earmark {
namespace {

using ::testing::HasSubstr;
using test::runCli;
using test::runCliAfter;

TEST(MarkListCli, ShowsTheRaterOfEachMark) {
    test::TempDir dir;
    writeWav(dir.file("take.wav"), test::sine(200, 1.5, 16000, 0.2));
    const std::string session = dir.file("review.earmark");
    ASSERT_EQ(runCli({"session", "new", session}).exitCode, 0);
    ASSERT_EQ(runCli({"session", "add", session, dir.file("take.wav")}).exitCode, 0);
    const std::vector<std::string> mark = {"mark", "add", session, "--take", "take.wav", "--category", "other"};
    auto withSpan = [&](const char* start, const char* end) {
        auto args = mark;
        args.insert(args.end(), {"--start", start, "--end", end});
        return args;
    };
    auto first = withSpan("0.1", "0.4");
    first.insert(first.end(), {"--rater", "Jörg"});
    ASSERT_EQ(runCli(first).exitCode, 0);
    const auto second = runCliAfter("export EARMARK_RATER=ana; ", withSpan("0.5", "0.9"));
    ASSERT_EQ(second.exitCode, 0) << second.err;

    const auto table = runCli({"mark", "list", session});
    ASSERT_EQ(table.exitCode, 0) << table.err;
    EXPECT_THAT(table.out, HasSubstr("severity rater"));
    EXPECT_THAT(table.out, HasSubstr("0.100-0.400 s       other                      minor    Jörg"));
    EXPECT_THAT(table.out, HasSubstr("0.500-0.900 s       other                      minor    ana"));

    const auto json = runCli({"mark", "list", session, "--json", "-"});
    ASSERT_EQ(json.exitCode, 0) << json.err;
    const auto doc = nlohmann::json::parse(json.out);  // stdout holds only the JSON
    ASSERT_EQ(doc["marks"].size(), 2u);
    EXPECT_EQ(doc["marks"][0]["rater"], "Jörg");
    EXPECT_EQ(doc["marks"][1]["rater"], "ana");
    EXPECT_EQ(doc["marks"][1]["start_s"], 0.5);

    const auto file = runCli({"mark", "list", session, "--json", dir.file("marks.json")});
    ASSERT_EQ(file.exitCode, 0) << file.err;
    EXPECT_THAT(file.out, HasSubstr("Jörg"));  // the table too
    EXPECT_EQ(nlohmann::json::parse(test::slurp(dir.file("marks.json")))["marks"], doc["marks"]);
}

}  // namespace
}  // namespace earmark
