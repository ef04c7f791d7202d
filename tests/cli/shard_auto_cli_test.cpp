// earmark-cli scan --shard auto: the shard comes from the job-array
// variables of the scheduler (docs/cluster-scans.md); bad or missing
// variables are a usage error (exit 2) naming the variable.
#include "run_cli.hpp"

#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <sstream>

namespace earmark {
namespace {

using test::expectOneLineError;
using test::runCliAfter;
using test::TempDir;
using ::testing::HasSubstr;

// The variables cleared first (the tests may themselves run inside a job
// array), then `assignments` exported.
std::string environment(const std::string& assignments) {
    return "unset SLURM_ARRAY_TASK_ID SLURM_ARRAY_TASK_COUNT SLURM_ARRAY_TASK_MIN SLURM_ARRAY_TASK_MAX "
           "SLURM_ARRAY_TASK_STEP JOB_COMPLETION_INDEX EARMARK_SHARD_COUNT; " +
           (assignments.empty() ? std::string() : "export " + assignments + "; ");
}

// The take ids of a scan's CSV, sorted.
std::vector<std::string> ids(const std::string& csv) {
    std::istringstream in(csv);
    std::string line;
    std::getline(in, line);  // header: rank,id,…
    std::vector<std::string> out;
    while (std::getline(in, line)) {
        const auto a = line.find(',');
        out.push_back(line.substr(a + 1, line.find(',', a + 1) - a - 1));
    }
    std::sort(out.begin(), out.end());
    return out;
}

class ShardAutoCli : public ::testing::Test {
protected:
    void SetUp() override {
        for (int i = 0; i < 9; ++i)
            writeWav(dir.file("take-" + std::to_string(i) + ".wav"), test::speechLike(0.5, 16000.0));
    }
    test::CliResult scan(const std::string& assignments, const std::string& shard) {
        return runCliAfter(environment(assignments), {"scan", dir.path().string(), "--jobs", "1", "--shard", shard});
    }
    TempDir dir;
};

TEST_F(ShardAutoCli, SlurmAndKubernetesTasksScanTheSamePartsAsKOverN) {
    for (int part = 1; part <= 3; ++part) {
        const auto fixed = scan("", std::to_string(part) + "/3");
        ASSERT_EQ(fixed.exitCode, 0) << fixed.err;
        // --array=1-3: task id = part.
        const auto slurm = scan("SLURM_ARRAY_TASK_ID=" + std::to_string(part) +
                                    " SLURM_ARRAY_TASK_COUNT=3 SLURM_ARRAY_TASK_MIN=1 SLURM_ARRAY_TASK_MAX=3",
                                "auto");
        ASSERT_EQ(slurm.exitCode, 0) << slurm.err;
        EXPECT_EQ(ids(slurm.out), ids(fixed.out));
        EXPECT_THAT(slurm.err, HasSubstr("(shard " + std::to_string(part) + "/3 of 9, from SLURM_ARRAY_TASK_ID=" +
                                         std::to_string(part) + " (ids 1-3))"));
        const auto k8s = scan("JOB_COMPLETION_INDEX=" + std::to_string(part - 1), "auto/3");
        ASSERT_EQ(k8s.exitCode, 0) << k8s.err;
        EXPECT_EQ(ids(k8s.out), ids(fixed.out));
    }
    const auto k8s = scan("JOB_COMPLETION_INDEX=2 EARMARK_SHARD_COUNT=3", "auto");
    ASSERT_EQ(k8s.exitCode, 0) << k8s.err;
    EXPECT_EQ(ids(k8s.out), ids(scan("", "3/3").out));
}

TEST_F(ShardAutoCli, MissingOrBadVariablesAreUsageErrors) {
    const std::vector<std::pair<std::string, std::string>> cases = {
        {"", "neither SLURM_ARRAY_TASK_ID"},
        {"SLURM_ARRAY_TASK_ID=1", "SLURM_ARRAY_TASK_COUNT is not"},
        {"SLURM_ARRAY_TASK_ID=one SLURM_ARRAY_TASK_COUNT=3", "SLURM_ARRAY_TASK_ID='one' is not a whole number"},
        {"SLURM_ARRAY_TASK_ID=3 SLURM_ARRAY_TASK_COUNT=3", "SLURM_ARRAY_TASK_ID=3 is outside the array"},
        {"SLURM_ARRAY_TASK_ID=0 SLURM_ARRAY_TASK_COUNT=18446744073709551616", "is too large"},
        {"JOB_COMPLETION_INDEX=0", "set EARMARK_SHARD_COUNT"},
        {"JOB_COMPLETION_INDEX=4 EARMARK_SHARD_COUNT=4", "JOB_COMPLETION_INDEX=4 is outside 0-3"},
    };
    for (const auto& [assignments, message] : cases) {
        const auto r = scan(assignments, "auto");
        EXPECT_EQ(r.exitCode, 2) << assignments;
        expectOneLineError(r, message);
        EXPECT_THAT(r.err, HasSubstr("scan: --shard auto: ")) << assignments;
        EXPECT_TRUE(r.out.empty()) << assignments;
    }
    const auto r = scan("JOB_COMPLETION_INDEX=0", "auto/zero");
    EXPECT_EQ(r.exitCode, 2);
    expectOneLineError(r, "N of --shard auto/N='zero' is not a whole number");
}

}  // namespace
}  // namespace earmark
