// earmark-cli with several raters: who made each change (--rater, then
// $EARMARK_RATER), session assign / list --rater / history, exports carrying
// the rater, and `agreement` on a small session whose figures are worked out
// by hand below (Cohen 1960's formula on the take × category units).
#include "run_cli.hpp"

#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <filesystem>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using ::testing::HasSubstr;
using test::runCli;
using test::runCliAfter;

struct Raters {
    test::TempDir dir;
    std::string session = dir.file("team.earmark");
    Raters() {
        for (const char* name : {"t1", "t2", "t3"}) writeWav(dir.file(std::string(name) + ".wav"), test::sine(200, 1.0, 16000, 0.2));
        EXPECT_EQ(runCli({"session", "new", session}).exitCode, 0);
        const auto add = runCli({"session", "add", session, dir.file("t1.wav"), dir.file("t2.wav"), dir.file("t3.wav")});
        EXPECT_EQ(add.exitCode, 0) << add.err;
    }
    void mark(const std::string& shellPrefix, std::vector<std::string> args) {
        std::vector<std::string> all = {"mark", "add", session};
        all.insert(all.end(), args.begin(), args.end());
        const auto r = runCliAfter(shellPrefix, all);
        EXPECT_EQ(r.exitCode, 0) << r.err;
    }
    void status(const std::string& take, const std::string& rater) {
        const auto r = runCli({"session", "status", session, "--take", take, "clean", "--rater", rater});
        EXPECT_EQ(r.exitCode, 0) << r.err;
    }
    // ann marks t1 (timing) and t2 (artifact) and passes t3; bo marks t1
    // (timing, shifted by 0.05 s) and passes t2 and t3.
    void review() {
        mark("", {"--take", "t1.wav", "--start", "0.20", "--end", "0.50", "--category", "timing", "--rater", "ann"});
        mark("", {"--take", "t2.wav", "--start", "0.10", "--end", "0.20", "--category", "artifact", "--rater", "ann"});
        status("t3.wav", "ann");
        mark("EARMARK_RATER=bo ", {"--take", "t1.wav", "--start", "0.25", "--end", "0.55", "--category", "timing"});
        status("t2.wav", "bo");
        status("t3.wav", "bo");
    }
};

TEST(AgreementCli, FiguresOfASmallSessionMatchTheHandComputation) {
    Raters s;
    s.review();
    const auto r = runCli({"agreement", s.session, "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_EQ(j["format"], "earmark-agreement");
    EXPECT_EQ(j["raters"], nlohmann::json({"ann", "bo"}));
    EXPECT_EQ(j["takes_compared"].size(), 3u);
    EXPECT_EQ(j["tolerance_s"], 0.25);
    const auto& overall = j["categories"][0];
    EXPECT_EQ(overall["category"], "overall");
    const auto& pair = overall["pairs"][0];
    // 3 takes × 6 categories = 18 units; they differ on one (t2 artifact).
    // p_o = 17/18; ann says present on 2, bo on 1: p_e = (2·1 + 16·17) / 18² = 274/324;
    // kappa = (17/18 − 274/324) / (1 − 274/324) = 32/50.
    EXPECT_EQ(pair["cohen_kappa"]["units"], 18);
    EXPECT_NEAR(pair["cohen_kappa"]["value"].get<double>(), 32.0 / 50.0, 1e-12);
    EXPECT_EQ(pair["spans"]["matched"], 1);
    EXPECT_EQ(pair["spans"]["marks_a"], 2);
    EXPECT_EQ(pair["spans"]["marks_b"], 1);
    EXPECT_DOUBLE_EQ(pair["spans"]["recall"].get<double>(), 0.5);
    EXPECT_NEAR(pair["spans"]["mean_abs_start_diff_s"].get<double>(), 0.05, 1e-9);
    // Timing: both present on t1 only: perfect. Other: nobody marked it: undefined (null).
    for (const auto& row : j["categories"]) {
        if (row["category"] == "timing") {
            EXPECT_EQ(row["krippendorff_alpha"]["value"], 1.0);
        }
        if (row["category"] == "other") {
            EXPECT_TRUE(row["krippendorff_alpha"]["value"].is_null());
        }
    }
    const auto text = runCli({"agreement", s.session, "--tolerance", "0"});
    ASSERT_EQ(text.exitCode, 0) << text.err;
    EXPECT_THAT(text.out, HasSubstr("ann / bo"));
    EXPECT_THAT(text.out, HasSubstr("0.640"));
}

TEST(AgreementCli, ChangesRecordTheirRaterAndExportsCarryIt) {
    Raters s;
    s.review();
    const auto h = runCli({"session", "history", s.session});
    ASSERT_EQ(h.exitCode, 0) << h.err;
    EXPECT_THAT(h.out, HasSubstr("bo"));
    EXPECT_THAT(h.out, HasSubstr("mark-added"));
    const std::string csv = s.dir.file("defects.csv");
    ASSERT_EQ(runCli({"export", s.session, "--csv", csv}).exitCode, 0);
    const std::string text = test::slurp(csv);
    EXPECT_THAT(text, HasSubstr(",ann,"));
    EXPECT_THAT(text, HasSubstr(",bo,"));  // named by $EARMARK_RATER
}

TEST(AgreementCli, AssignSplitsTheQueueReproducibly) {
    Raters s;
    const auto first = runCli({"session", "assign", s.session, "--raters", "ann,bo", "--overlap", "0.34", "--seed", "7"});
    ASSERT_EQ(first.exitCode, 0) << first.err;
    EXPECT_THAT(first.out, HasSubstr("1 of them to several raters"));
    const auto annFirst = runCli({"session", "list", s.session, "--rater", "ann"}).out;
    const auto boFirst = runCli({"session", "list", s.session, "--rater", "bo"}).out;
    ASSERT_EQ(runCli({"session", "assign", s.session, "--raters", "bo,ann", "--overlap", "0.34", "--seed", "7"}).exitCode, 0);
    EXPECT_EQ(runCli({"session", "list", s.session, "--rater", "ann"}).out, annFirst);
    EXPECT_EQ(runCli({"session", "list", s.session, "--rater", "bo"}).out, boFirst);
    // 3 takes, one shared: 4 assignments, 2 each; each list has a header line.
    EXPECT_EQ(std::count(annFirst.begin(), annFirst.end(), '\n'), 3);
    EXPECT_EQ(std::count(boFirst.begin(), boFirst.end(), '\n'), 3);
}

TEST(AgreementCli, BadUsageAndBadInputGetTheirExitCodes) {
    Raters s;
    const auto none = runCli({"agreement"});
    EXPECT_EQ(none.exitCode, 2);
    test::expectOneLineError(none, "SESSION");
    EXPECT_EQ(runCli({"agreement", s.session, "--tolerance", "-1"}).exitCode, 2);
    EXPECT_EQ(runCli({"agreement", s.session, "--tolerance", "soon"}).exitCode, 2);
    const auto missing = runCli({"agreement", s.dir.file("nope.earmark")});
    EXPECT_EQ(missing.exitCode, 3);
    test::expectOneLineError(missing, "nope.earmark");
    const auto empty = runCli({"agreement", s.session});
    EXPECT_EQ(empty.exitCode, 0);
    EXPECT_THAT(empty.err, HasSubstr("nothing to compare"));
    const auto assign = runCli({"session", "assign", s.session, "--raters", "ann,ann"});
    EXPECT_EQ(assign.exitCode, 2);
    test::expectOneLineError(assign, "twice");
    EXPECT_EQ(runCli({"session", "assign", s.session}).exitCode, 2);
    const auto badName = runCli({"session", "status", s.session, "--take", "t1.wav", "clean", "--rater",
                                 std::string(300, 'x')});
    EXPECT_EQ(badName.exitCode, 2);
    test::expectOneLineError(badName, "rater");
}

}  // namespace
}  // namespace earmark
