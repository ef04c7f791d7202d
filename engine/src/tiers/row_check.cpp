#include "row_check.hpp"

#include "earmark/core/error.hpp"

namespace earmark::tiers_detail {

std::vector<std::string> validateRows(TierSet& set, const RowNames& rows, const std::string& subject,
                                      std::optional<double> takeDurationS) {
    const std::optional<double> duration = takeDurationS ? takeDurationS : set.durationS;
    std::vector<std::string> warnings;
    for (std::size_t t = 0; t < set.tiers.size(); ++t) {
        Tier& tier = set.tiers[t];
        const auto describe = [&](const TierIssue& issue) {
            const std::string row = t < rows.size() && issue.index < rows[t].size()
                                        ? rows[t][issue.index]
                                        : "interval " + std::to_string(issue.index + 1);
            return row + ": '" + tier.intervals[issue.index].label + "' " + issue.problem;
        };
        const TierCheck check = checkTier(tier, duration);
        if (check.error) throw InputError(subject, describe(*check.error));
        for (const auto& w : check.warnings) warnings.push_back(describe(w));
        clampToTake(tier, duration);
    }
    return warnings;
}

}  // namespace earmark::tiers_detail
