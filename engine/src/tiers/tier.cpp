#include "earmark/tiers/tier.hpp"

#include "earmark/core/error.hpp"
#include "earmark/core/format.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace earmark {
namespace {

std::string seconds(double s) { return formatSeconds(s); }

std::optional<std::string> intervalProblem(const Interval& iv, const Interval* previous,
                                           std::optional<double> takeDurationS) {
    if (!std::isfinite(iv.startS) || !std::isfinite(iv.endS)) return "a time is not a finite number";
    if (iv.startS < -kTimeSlackS) return "starts at " + seconds(iv.startS) + ", before the start of the audio";
    if (iv.endS == iv.startS)
        return "has zero length: start and end are the same boundary (" + seconds(iv.startS) + ")";
    if (iv.endS < iv.startS) return "ends (" + seconds(iv.endS) + ") before it starts (" + seconds(iv.startS) + ")";
    if (previous) {
        if (iv.startS < previous->startS)
            return "is out of time order: starts at " + seconds(iv.startS) +
                   ", before the previous interval (" + seconds(previous->startS) + ")";
        if (iv.startS == previous->startS)
            return "starts at the same boundary as the previous interval (" + seconds(iv.startS) + ")";
        if (iv.startS < previous->endS - kTimeSlackS)
            return "starts at " + seconds(iv.startS) + ", before the previous interval ends (" +
                   seconds(previous->endS) + ")";
    }
    if (takeDurationS && iv.endS > *takeDurationS + kTimeSlackS)
        return "ends at " + seconds(iv.endS) + ", past the end of the audio (" + seconds(*takeDurationS) + ")";
    if (iv.confidence && !(*iv.confidence >= 0.0 && *iv.confidence <= 1.0))
        return "has a confidence outside 0…1";
    return std::nullopt;
}

}  // namespace

const Tier* TierSet::find(std::string_view name) const {
    for (const auto& t : tiers)
        if (t.name == name) return &t;
    return nullptr;
}

Tier* TierSet::find(std::string_view name) {
    for (auto& t : tiers)
        if (t.name == name) return &t;
    return nullptr;
}

Tier& TierSet::getOrAdd(std::string_view name) {
    if (Tier* t = find(name)) return *t;
    tiers.push_back(Tier{std::string(name), {}});
    return tiers.back();
}

TierCheck checkTier(const Tier& tier, std::optional<double> takeDurationS) {
    TierCheck check;
    for (std::size_t i = 0; i < tier.intervals.size(); ++i) {
        const Interval& iv = tier.intervals[i];
        if (auto problem = intervalProblem(iv, i > 0 ? &tier.intervals[i - 1] : nullptr, takeDurationS)) {
            check.error = TierIssue{i, *problem};
            break;
        }
        if (iv.label.empty()) check.warnings.push_back(TierIssue{i, "has an empty label"});
    }
    return check;
}

void clampToTake(Tier& tier, std::optional<double> takeDurationS) {
    for (std::size_t i = 0; i < tier.intervals.size(); ++i) {
        Interval& iv = tier.intervals[i];
        // Only moves that keep the interval non-empty; a check has already
        // bounded every move by kTimeSlackS.
        const auto setStart = [&](double s) { if (s < iv.endS) iv.startS = s; };
        setStart(std::max(iv.startS, 0.0));
        if (takeDurationS && iv.endS > *takeDurationS && *takeDurationS > iv.startS) iv.endS = *takeDurationS;
        // Slack-sized overlaps become touching boundaries.
        if (i > 0) setStart(std::max(iv.startS, tier.intervals[i - 1].endS));
    }
}

std::vector<std::string> validateTierSet(TierSet& set, const std::string& subject,
                                         std::optional<double> takeDurationS) {
    const std::optional<double> duration = takeDurationS ? takeDurationS : set.durationS;
    std::vector<std::string> warnings;
    for (std::size_t t = 0; t < set.tiers.size(); ++t) {
        Tier& tier = set.tiers[t];
        for (std::size_t u = 0; u < t; ++u)
            if (set.tiers[u].name == tier.name) throw InputError(subject, "tier '" + tier.name + "' appears twice");
        const auto describe = [&](const TierIssue& issue) {
            return "tier '" + tier.name + "', interval " + std::to_string(issue.index + 1) + " ('" +
                   tier.intervals[issue.index].label + "') " + issue.problem;
        };
        const TierCheck check = checkTier(tier, duration);
        if (check.error) throw InputError(subject, describe(*check.error));
        for (const auto& w : check.warnings) warnings.push_back(describe(w));
        clampToTake(tier, duration);
    }
    return warnings;
}

}  // namespace earmark
