// What every timings reader takes and gives back (Earmark JSON, CSV, WebVTT,
// per-token durations: see docs/timings-json.md and docs/timings-formats.md).
//
// Readers validate what they read (earmark/tiers/tier.hpp): a bad row is an
// InputError whose subject is the file (or the source name given) and whose
// problem starts with the line or row, e.g. "line 7: tier 'words', interval
// 'ferry' ends (1.200 s) before it starts (1.400 s)". Empty labels come back
// as warnings in the same form.
#pragma once

#include "earmark/tiers/tier.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct TimingsReadOptions {
    // Length of the take in seconds: intervals must end inside it. When not
    // given, a duration stored in the file (Earmark JSON) is used, else none.
    std::optional<double> takeDurationS;
    // Tier for rows that name none (CSV without a tier column, WebVTT cues).
    std::string defaultTier = std::string(kWordsTier);
};

struct LoadedTimings {
    TierSet tiers;
    std::vector<std::string> warnings;  // one line each, naming the line/row
};

}  // namespace earmark
