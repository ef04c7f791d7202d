// --shard auto: the shard read from a scheduler's job-array variables. The
// variable meanings follow Slurm's job-array documentation (sbatch(1),
// "OUTPUT ENVIRONMENT VARIABLES": SLURM_ARRAY_TASK_ID/COUNT/MIN/MAX/STEP)
// and Kubernetes' indexed Job (JOB_COMPLETION_INDEX, 0-based); the values
// a real Slurm exports are checked end to end by tests/cluster/slurm_array_test.sh.
#include "earmark/core/error.hpp"
#include "earmark/scan/shard_environment.hpp"

#include <gtest/gtest.h>

#include <map>

namespace earmark {
namespace {

using Env = std::map<std::string, std::string>;

EnvironmentLookup lookupIn(const Env& env) {
    return [env](const std::string& name) -> std::optional<std::string> {
        auto it = env.find(name);
        if (it == env.end()) return std::nullopt;
        return it->second;
    };
}

Shard read(const std::string& spec, const Env& env) { return shardFromEnvironment(spec, lookupIn(env)).shard; }

// The message of the ParamError, or "" when none was thrown.
std::string problem(const std::string& spec, const Env& env) {
    try {
        read(spec, env);
    } catch (const ParamError& e) {
        return e.what();
    }
    return "";
}

TEST(ShardEnvironment, SlurmArrayFromZeroAndFromOne) {
    // --array=0-2: ids 0, 1, 2 are parts 1, 2, 3 of 3.
    for (int id = 0; id < 3; ++id) {
        const Shard s = read("auto", {{"SLURM_ARRAY_TASK_ID", std::to_string(id)},
                                      {"SLURM_ARRAY_TASK_COUNT", "3"},
                                      {"SLURM_ARRAY_TASK_MIN", "0"},
                                      {"SLURM_ARRAY_TASK_MAX", "2"}});
        EXPECT_EQ(s.part, id + 1);
        EXPECT_EQ(s.parts, 3);
    }
    // --array=1-4 (MIN = 1): id 4 is the last part, not out of range.
    const Shard last = read("auto", {{"SLURM_ARRAY_TASK_ID", "4"}, {"SLURM_ARRAY_TASK_COUNT", "4"},
                                     {"SLURM_ARRAY_TASK_MIN", "1"}, {"SLURM_ARRAY_TASK_MAX", "4"}});
    EXPECT_EQ(last.part, 4);
    EXPECT_EQ(last.parts, 4);
    // Without MIN the array is taken to start at 0.
    EXPECT_EQ(read("auto", {{"SLURM_ARRAY_TASK_ID", "0"}, {"SLURM_ARRAY_TASK_COUNT", "2"}}).part, 1);
}

TEST(ShardEnvironment, SlurmStepAndSourceText) {
    // --array=10-16:3: ids 10, 13, 16.
    const Env env{{"SLURM_ARRAY_TASK_ID", "13"}, {"SLURM_ARRAY_TASK_COUNT", "3"}, {"SLURM_ARRAY_TASK_MIN", "10"},
                  {"SLURM_ARRAY_TASK_MAX", "16"}, {"SLURM_ARRAY_TASK_STEP", "3"}};
    const auto r = shardFromEnvironment("auto", lookupIn(env));
    EXPECT_EQ(r.shard.part, 2);
    EXPECT_EQ(r.shard.parts, 3);
    EXPECT_EQ(r.source, "SLURM_ARRAY_TASK_ID=13 (ids 10-16:3)");
    Env between = env;
    between["SLURM_ARRAY_TASK_ID"] = "11";
    EXPECT_NE(problem("auto", between).find("outside the array"), std::string::npos);
}

TEST(ShardEnvironment, SlurmCountFromSpecWhenNotExported) {
    EXPECT_EQ(read("auto/5", {{"SLURM_ARRAY_TASK_ID", "4"}}).parts, 5);
    EXPECT_NE(problem("auto", {{"SLURM_ARRAY_TASK_ID", "4"}}).find("SLURM_ARRAY_TASK_COUNT is not"), std::string::npos);
    EXPECT_NE(problem("auto/4", {{"SLURM_ARRAY_TASK_ID", "1"}, {"SLURM_ARRAY_TASK_COUNT", "3"}}).find("disagrees"),
              std::string::npos);
}

TEST(ShardEnvironment, SlurmRefusesIrregularAndOutOfRangeArrays) {
    // --array=0,1,5: three tasks, but 5 is not the third of an even range.
    const Env list{{"SLURM_ARRAY_TASK_ID", "0"}, {"SLURM_ARRAY_TASK_COUNT", "3"}, {"SLURM_ARRAY_TASK_MIN", "0"},
                   {"SLURM_ARRAY_TASK_MAX", "5"}};
    EXPECT_NE(problem("auto", list).find("not one evenly spaced range"), std::string::npos);
    EXPECT_NE(problem("auto", {{"SLURM_ARRAY_TASK_ID", "3"}, {"SLURM_ARRAY_TASK_COUNT", "3"}}).find("outside"),
              std::string::npos);
    EXPECT_NE(problem("auto", {{"SLURM_ARRAY_TASK_ID", "0"}, {"SLURM_ARRAY_TASK_COUNT", "3"},
                               {"SLURM_ARRAY_TASK_MIN", "1"}})
                  .find("outside"),
              std::string::npos);
    EXPECT_NE(problem("auto", {{"SLURM_ARRAY_TASK_ID", "0"}, {"SLURM_ARRAY_TASK_COUNT", "0"}}).find("no tasks"),
              std::string::npos);
}

TEST(ShardEnvironment, KubernetesIndexedJob) {
    const Shard s = read("auto", {{"JOB_COMPLETION_INDEX", "0"}, {"EARMARK_SHARD_COUNT", "8"}});
    EXPECT_EQ(s.part, 1);
    EXPECT_EQ(s.parts, 8);
    EXPECT_EQ(read("auto/8", {{"JOB_COMPLETION_INDEX", "7"}}).part, 8);
    EXPECT_NE(problem("auto", {{"JOB_COMPLETION_INDEX", "2"}}).find("EARMARK_SHARD_COUNT"), std::string::npos);
    EXPECT_NE(problem("auto/8", {{"JOB_COMPLETION_INDEX", "8"}}).find("outside 0-7"), std::string::npos);
    EXPECT_NE(problem("auto/3", {{"JOB_COMPLETION_INDEX", "0"}, {"EARMARK_SHARD_COUNT", "4"}}).find("disagrees"),
              std::string::npos);
    // Slurm's variables win when a Slurm job also carries the Kubernetes one.
    EXPECT_EQ(read("auto", {{"JOB_COMPLETION_INDEX", "0"}, {"EARMARK_SHARD_COUNT", "2"},
                            {"SLURM_ARRAY_TASK_ID", "1"}, {"SLURM_ARRAY_TASK_COUNT", "2"}})
                  .part,
              2);
}

TEST(ShardEnvironment, BadValuesNameTheVariable) {
    EXPECT_NE(problem("auto", {}).find("neither SLURM_ARRAY_TASK_ID"), std::string::npos);
    for (const char* bad : {"", "x", "1.5", "-1", " 1", "1 ", "+1", "0x2"}) {
        const std::string m = problem("auto", {{"SLURM_ARRAY_TASK_ID", bad}, {"SLURM_ARRAY_TASK_COUNT", "3"}});
        EXPECT_NE(m.find("SLURM_ARRAY_TASK_ID='" + std::string(bad) + "' is not a whole number"), std::string::npos)
            << bad << ": " << m;
    }
    for (const char* huge : {"2147483648", "99999999999999999999999"}) {
        EXPECT_NE(problem("auto", {{"SLURM_ARRAY_TASK_ID", "0"}, {"SLURM_ARRAY_TASK_COUNT", huge}}).find("too large"),
                  std::string::npos)
            << huge;
        EXPECT_NE(problem("auto", {{"JOB_COMPLETION_INDEX", huge}, {"EARMARK_SHARD_COUNT", "2"}}).find("too large"),
                  std::string::npos)
            << huge;
    }
    EXPECT_NE(problem("auto", {{"JOB_COMPLETION_INDEX", "0"}, {"EARMARK_SHARD_COUNT", "two"}})
                  .find("EARMARK_SHARD_COUNT='two'"),
              std::string::npos);
    for (const char* spec : {"auto/0", "auto/", "auto/x", "autox", "auto/2/3"})
        EXPECT_NE(problem(spec, {{"JOB_COMPLETION_INDEX", "0"}}), "") << spec;
    EXPECT_TRUE(isAutoShard("auto"));
    EXPECT_TRUE(isAutoShard("auto/3"));
    EXPECT_FALSE(isAutoShard("1/3"));
    EXPECT_FALSE(isAutoShard("automatic"));
}

}  // namespace
}  // namespace earmark
