// Validation with the reader's own row names ("line 7", "words[3]") so that
// errors point into the file (internal to the timings readers).
#pragma once

#include "earmark/tiers/timings.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark::tiers_detail {

// rows[t][i] names where interval i of set.tiers[t] came from.
using RowNames = std::vector<std::vector<std::string>>;

// Checks every tier (tier.hpp checkTier) and clamps within the slack. Throws
// InputError(subject, "<row>: '<label>' <problem>") for the first bad
// interval (tier by tier); returns the warnings in the same form.
std::vector<std::string> validateRows(TierSet& set, const RowNames& rows, const std::string& subject,
                                      std::optional<double> takeDurationS);

}  // namespace earmark::tiers_detail
