#include "earmark/scan/shard_environment.hpp"

#include "earmark/core/error.hpp"

#include <charconv>
#include <climits>

namespace earmark {
namespace {

[[noreturn]] void fail(const std::string& problem) { throw ParamError("Shard", "auto: " + problem); }

// A whole number from `text` (no sign, no spaces, no trailing characters);
// `what` names where it came from in the message.
long long wholeNumber(const std::string& text, const std::string& what) {
    long long v = 0;
    const char* end = text.data() + text.size();
    auto [p, ec] = std::from_chars(text.data(), end, v);
    if (ec == std::errc::result_out_of_range || (ec == std::errc() && p == end && v > INT_MAX))
        fail(what + "='" + text + "' is too large");
    if (text.empty() || ec != std::errc() || p != end || v < 0)
        fail(what + "='" + text + "' is not a whole number >= 0");
    return v;
}

std::optional<long long> variable(const EnvironmentLookup& lookup, const std::string& name) {
    auto v = lookup(name);
    if (!v) return std::nullopt;
    return wholeNumber(*v, name);
}

std::optional<long long> countFromSpec(const std::string& spec) {
    if (spec == "auto") return std::nullopt;
    if (spec.rfind("auto/", 0) != 0) fail("expects auto or auto/N, got '" + spec + "'");
    const long long count = wholeNumber(spec.substr(5), "N of --shard auto/N");
    if (count < 1) fail("auto/N needs N >= 1, got '" + spec + "'");
    return count;
}

ShardFromEnvironment fromSlurm(long long id, std::optional<long long> given, const EnvironmentLookup& lookup) {
    auto count = variable(lookup, "SLURM_ARRAY_TASK_COUNT");
    const long long min = variable(lookup, "SLURM_ARRAY_TASK_MIN").value_or(0);
    const long long step = variable(lookup, "SLURM_ARRAY_TASK_STEP").value_or(1);
    const auto max = variable(lookup, "SLURM_ARRAY_TASK_MAX");
    if (step < 1) fail("SLURM_ARRAY_TASK_STEP=0 is not a step");
    if (count && given && *count != *given)
        fail("auto/" + std::to_string(*given) + " disagrees with SLURM_ARRAY_TASK_COUNT=" + std::to_string(*count));
    if (!count) count = given;
    if (!count)
        fail("SLURM_ARRAY_TASK_ID is set but SLURM_ARRAY_TASK_COUNT is not; give the count as --shard auto/N");
    if (*count < 1) fail("SLURM_ARRAY_TASK_COUNT=0: the array has no tasks");
    if (max && *max != min + (*count - 1) * step)
        fail("the job array is not one evenly spaced range (SLURM_ARRAY_TASK_MIN=" + std::to_string(min) +
             ", SLURM_ARRAY_TASK_MAX=" + std::to_string(*max) + ", SLURM_ARRAY_TASK_STEP=" + std::to_string(step) +
             ", SLURM_ARRAY_TASK_COUNT=" + std::to_string(*count) + "); submit e.g. --array=1-N");
    if (id < min || (id - min) % step != 0 || (id - min) / step >= *count)
        fail("SLURM_ARRAY_TASK_ID=" + std::to_string(id) + " is outside the array of " + std::to_string(*count) +
             " task(s) from " + std::to_string(min) + " in steps of " + std::to_string(step));
    ShardFromEnvironment r;
    r.shard.part = static_cast<int>((id - min) / step + 1);
    r.shard.parts = static_cast<int>(*count);
    std::string ids = std::to_string(min) + "-" + std::to_string(min + (*count - 1) * step);
    if (step > 1) ids.append(":").append(std::to_string(step));
    r.source = "SLURM_ARRAY_TASK_ID=" + std::to_string(id) + " (ids " + ids + ")";
    return r;
}

ShardFromEnvironment fromKubernetes(long long index, std::optional<long long> given, const EnvironmentLookup& lookup) {
    const auto fromVariable = variable(lookup, "EARMARK_SHARD_COUNT");
    if (fromVariable && given && *fromVariable != *given)
        fail("auto/" + std::to_string(*given) + " disagrees with EARMARK_SHARD_COUNT=" + std::to_string(*fromVariable));
    const auto count = given ? given : fromVariable;
    if (!count)
        fail("JOB_COMPLETION_INDEX is set but the number of completions is not: set EARMARK_SHARD_COUNT "
             "(the job's completions) or give --shard auto/N");
    if (*count < 1) fail("EARMARK_SHARD_COUNT=0: there are no parts");
    if (index >= *count)
        fail("JOB_COMPLETION_INDEX=" + std::to_string(index) + " is outside 0-" + std::to_string(*count - 1) +
             " (" + std::to_string(*count) + " completions)");
    ShardFromEnvironment r;
    r.shard.part = static_cast<int>(index + 1);
    r.shard.parts = static_cast<int>(*count);
    r.source = "JOB_COMPLETION_INDEX=" + std::to_string(index);
    return r;
}

}  // namespace

bool isAutoShard(const std::string& spec) { return spec == "auto" || spec.rfind("auto/", 0) == 0; }

ShardFromEnvironment shardFromEnvironment(const std::string& spec, const EnvironmentLookup& lookup) {
    const auto given = countFromSpec(spec);
    if (auto id = variable(lookup, "SLURM_ARRAY_TASK_ID")) return fromSlurm(*id, given, lookup);
    if (auto index = variable(lookup, "JOB_COMPLETION_INDEX")) return fromKubernetes(*index, given, lookup);
    fail("no job-array environment: neither SLURM_ARRAY_TASK_ID (a Slurm job array) nor JOB_COMPLETION_INDEX "
         "(a Kubernetes indexed job) is set");
}

}  // namespace earmark
