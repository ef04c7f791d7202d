// Conversions between the session's tier rows and the tier model
// (earmark/tiers/tier.hpp), so timings files can be stored in a session and
// stored tiers fed to the prosody measures.
#pragma once

#include "earmark/store/take.hpp"
#include "earmark/tiers/tier.hpp"

#include <optional>
#include <vector>

namespace earmark {

// Every interval of every tier, tier by tier, in order. Confidences are not kept.
std::vector<TierRow> toTierRows(const TierSet& set);

// Rows grouped into tiers in the order each tier first appears.
TierSet toTierSet(const std::vector<TierRow>& rows, std::optional<double> durationSeconds = std::nullopt);

}  // namespace earmark
