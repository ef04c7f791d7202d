// The shard of a scan read from a batch scheduler's job-array environment
// (`earmark-cli scan --shard auto`), so one job script serves every task of
// an array (docs/cluster-scans.md).
#pragma once

#include "earmark/scan/scan_input.hpp"

#include <functional>
#include <optional>
#include <string>

namespace earmark {

// Looks a variable up; nullopt when it is not set. (The command line passes
// std::getenv; tests pass a map.)
using EnvironmentLookup = std::function<std::optional<std::string>(const std::string& name)>;

struct ShardFromEnvironment {
    Shard shard;
    std::string source;  // what it was read from, for messages, e.g.
                         // "SLURM_ARRAY_TASK_ID=4 (ids 3-5)"
};

// `spec` is "auto" or "auto/N". Read in this order:
//  1. Slurm job arrays: SLURM_ARRAY_TASK_ID with SLURM_ARRAY_TASK_COUNT,
//     offset by SLURM_ARRAY_TASK_MIN (arrays need not start at 0) and
//     divided by SLURM_ARRAY_TASK_STEP (e.g. --array=0-10:2); the array
//     must be one evenly spaced range (checked against
//     SLURM_ARRAY_TASK_MAX when set). Part = (ID − MIN) / STEP + 1.
//  2. Kubernetes indexed jobs: JOB_COMPLETION_INDEX (0-based); Kubernetes
//     does not export the number of completions, so the count comes from
//     "auto/N" or EARMARK_SHARD_COUNT. Part = index + 1.
// An N given in "auto/N" must agree with the scheduler's count when it has one.
// Throws ParamError("Shard", …) naming the variable and its value when no
// job-array variable is set, a value is not a whole number, overflows an
// int, or lies outside the array. Thread-safe if `lookup` is.
ShardFromEnvironment shardFromEnvironment(const std::string& spec, const EnvironmentLookup& lookup);

// True for "auto" and "auto/…" (the forms shardFromEnvironment reads).
bool isAutoShard(const std::string& spec);

}  // namespace earmark
