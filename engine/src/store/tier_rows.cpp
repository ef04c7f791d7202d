#include "earmark/store/tier_rows.hpp"

namespace earmark {

std::vector<TierRow> toTierRows(const TierSet& set) {
    std::vector<TierRow> rows;
    for (const Tier& tier : set.tiers)
        for (const Interval& i : tier.intervals) rows.push_back({tier.name, i.startS, i.endS, i.label});
    return rows;
}

TierSet toTierSet(const std::vector<TierRow>& rows, std::optional<double> durationSeconds) {
    TierSet set;
    set.durationS = durationSeconds;
    for (const TierRow& row : rows)
        set.getOrAdd(row.tier).intervals.push_back({row.startSeconds, row.endSeconds, row.label, std::nullopt});
    return set;
}

}  // namespace earmark
