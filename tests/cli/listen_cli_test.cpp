// earmark-cli listen: a MUSHRA round from folders to report files — blind
// plans, imported ratings with a planted failing rater, bad ratings files.
#include "run_cli.hpp"

#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <filesystem>
#include <fstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using ::testing::HasSubstr;
using ::testing::Not;
using test::runCli;

struct Round {
    test::TempDir dir;
    std::string session = dir.file("round.earmark");
    Round() {
        for (const char* system : {"studio", "low", "tern", "gull"}) {
            fs::create_directories(dir.path() / system);
            for (int i = 1; i <= 4; ++i) std::ofstream(dir.path() / system / ("line-" + std::to_string(i) + ".wav"));
        }
        EXPECT_EQ(runCli({"session", "new", session}).exitCode, 0);
        const auto r = runCli({"listen", "create", session, "--test", "m1", "--kind", "mushra", "--reference", "studio",
                               "--low-anchor", "low", "--raters", "3", "--seed", "11", dir.file("studio"),
                               dir.file("low"), dir.file("tern"), dir.file("gull")});
        EXPECT_EQ(r.exitCode, 0) << r.err;
    }
    std::string csv(const std::string& name, const std::string& body) {
        std::ofstream(dir.file(name)) << "rater,line,system,score\n" << body;
        return dir.file(name);
    }
};

TEST(ListenCli, PlanIsBlind) {
    Round r;
    const auto plan = runCli({"listen", "plan", r.session, "--test", "m1", "--rater", "ann"});
    ASSERT_EQ(plan.exitCode, 0) << plan.err;
    EXPECT_THAT(plan.out, HasSubstr("A B C D"));
    for (const char* hidden : {"studio", "low", "tern", "gull", ".wav"}) EXPECT_THAT(plan.out, Not(HasSubstr(hidden)));
}

TEST(ListenCli, ImportAndAnalyseExcludeThePlantedRater) {
    Round r;
    std::string body;
    for (const std::string rater : {"ann", "bob", "cy"})
        for (int i = 1; i <= 4; ++i) {
            const std::string line = "line-" + std::to_string(i);
            const int refScore = rater == "cy" && i <= 2 ? 70 : 100;  // cy: 2 of 4 lines below 90
            body += rater + "," + line + ",studio," + std::to_string(refScore) + "\n";
            body += rater + "," + line + ",low," + std::to_string(10 + i) + "\n";
            body += rater + "," + line + ",tern," + std::to_string(80 + i + (rater == "bob" ? 3 : 0)) + "\n";
            body += rater + "," + line + ",gull," + std::to_string(60 + 2 * i) + "\n";
        }
    const auto imported = runCli({"listen", "import", r.session, r.csv("ratings.csv", body), "--test", "m1"});
    ASSERT_EQ(imported.exitCode, 0) << imported.err;
    EXPECT_THAT(imported.out, HasSubstr("imported 48 answer(s)"));
    const std::string out = r.dir.file("report");
    const auto analysed = runCli({"listen", "analyse", r.session, "--test", "m1", "--out", out, "--bootstrap", "300"});
    ASSERT_EQ(analysed.exitCode, 0) << analysed.err;
    EXPECT_THAT(analysed.out, HasSubstr("excluded cy (mushra-reference)"));
    for (const char* f : {"report.json", "systems.csv", "pairs.csv", "exclusions.csv", "answers.csv", "means.svg", "lines.svg"})
        EXPECT_TRUE(fs::exists(fs::path(out) / f)) << f;
    const auto report = nlohmann::json::parse(std::ifstream(fs::path(out) / "report.json"));
    EXPECT_EQ(report["raters_kept"], nlohmann::json::array({"ann", "bob"}));
    EXPECT_EQ(report["answers_used"], 32);
    EXPECT_EQ(report["systems"].size(), 4u);
    EXPECT_EQ(report["pairs"].size(), 6u);
    EXPECT_THAT(test::slurp(fs::path(out) / "means.svg"), HasSubstr("<svg"));
    // The exported answers read back as an import file: all 48, in the same form.
    const std::string again = test::slurp(fs::path(out) / "answers.csv");
    EXPECT_EQ(std::count(again.begin(), again.end(), '\n'), 49);
    EXPECT_THAT(again, HasSubstr("cy,line-1,studio,,70,main"));
}

TEST(ListenCli, BadRatingsFilesGetOneClearLine) {
    Round r;
    const auto offScale = runCli({"listen", "import", r.session, r.csv("a.csv", "ann,line-1,tern,120\n"), "--test", "m1"});
    EXPECT_EQ(offScale.exitCode, 3);
    test::expectOneLineError(offScale, "a.csv: row 2: rater 'ann', line 'line-1', system 'tern': score 120 is not on the mushra scale");
    const auto dup = runCli({"listen", "import", r.session,
                             r.csv("b.csv", "ann,line-1,tern,50\nbob,line-1,tern,40\nann,line-1,tern,55\n"), "--test", "m1"});
    EXPECT_EQ(dup.exitCode, 3);
    test::expectOneLineError(dup, "row 4: rater 'ann', line 'line-1', system 'tern': duplicate answer (first at row 2)");
    const auto unknown = runCli({"listen", "import", r.session, r.csv("c.csv", "ann,line-9,tern,50\n"), "--test", "m1"});
    EXPECT_EQ(unknown.exitCode, 3);
    test::expectOneLineError(unknown, "no such line");
    // Nothing of the refused files was stored.
    const auto list = runCli({"listen", "list", r.session});
    EXPECT_THAT(list.out, HasSubstr("0 answers"));
    const auto noTest = runCli({"listen", "analyse", r.session, "--test", "nope", "--out", r.dir.file("x")});
    EXPECT_EQ(noTest.exitCode, 3);
    test::expectOneLineError(noTest, "has no listening test named 'nope'");
    EXPECT_EQ(runCli({"listen", "plan", r.session, "--test", "m1"}).exitCode, 2);
}

TEST(ListenCli, LineMissingForOneSystemIsNamed) {
    Round r;
    fs::remove(r.dir.path() / "gull" / "line-3.wav");
    const auto made = runCli({"listen", "create", r.session, "--test", "m2", "--kind", "ab", r.dir.file("tern"),
                              r.dir.file("gull")});
    EXPECT_EQ(made.exitCode, 3);
    test::expectOneLineError(made, "line 'line-3' has no take of system 'gull'");
    const auto dropped = runCli({"listen", "create", r.session, "--test", "m2", "--kind", "ab", "--drop-incomplete",
                                 r.dir.file("tern"), r.dir.file("gull")});
    EXPECT_EQ(dropped.exitCode, 0) << dropped.err;
    EXPECT_THAT(dropped.err, HasSubstr("note: line 'line-3' left out: no take of system 'gull'"));
    EXPECT_THAT(dropped.out, HasSubstr("3 lines"));
}

}  // namespace
}  // namespace earmark
