// Earmark JSON timings: {"version":1,"duration":3.5,"words":[{"text","start",
// "end","confidence"?}...],"phones":[...]} — schema in docs/timings-json.md.
//
// Every top-level array is a tier named by its key, in file order; other
// top-level keys are ignored (fields may be added). Times are seconds.
#pragma once

#include "earmark/tiers/timings.hpp"

#include <string>
#include <string_view>

namespace earmark {

// Parses the text of a timings file. `source` names it in errors (a path).
// Throws InputError(source, "line L, column C: …") for malformed JSON and
// InputError(source, "words[3]: …") for a bad row (missing or non-numeric
// time, a non-string text, and every check of tier.hpp).
LoadedTimings parseTimingsJson(std::string_view text, const std::string& source,
                               const TimingsReadOptions& options = {});

// One interval per line, times and confidences with full precision (the
// shortest text that reads back to the same double), UTF-8 labels as they
// are. Writes "duration" when set.durationS is known. Ends with a newline.
std::string timingsToJson(const TierSet& set);

}  // namespace earmark
