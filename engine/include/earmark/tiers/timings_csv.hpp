// Plain CSV timings: one interval per record, `start,end,label[,tier[,confidence]]`,
// times in seconds (docs/timings-formats.md).
//
// Quoting follows RFC 4180 (fields holding a comma, a quote or a line break
// are quoted; a quote inside is doubled; a quoted field may span lines). Both
// CRLF and LF line ends are read. The header row is optional: a first
// record that names a "start" column (and does not begin with a number) is a
// header, and then columns are found by name (start, end, label or text,
// tier, confidence) in any order. Blank lines are skipped. Labels are kept
// byte for byte (UTF-8).
#pragma once

#include "earmark/tiers/timings.hpp"

#include <string>
#include <string_view>

namespace earmark {

// Throws InputError(source, "line N: …") naming the line where the bad record
// starts: an unclosed quote, too few fields, a time that is not a number, and
// every check of tier.hpp. Rows with an empty tier field go to
// options.defaultTier; tiers appear in the order first named.
LoadedTimings parseTimingsCsv(std::string_view text, const std::string& source,
                              const TimingsReadOptions& options = {});

// Header "start,end,label,tier" (plus ",confidence" when any interval has
// one), then every interval of every tier, tier by tier, times with full
// precision. CRLF line ends (RFC 4180). Ends with a line end.
std::string timingsToCsv(const TierSet& set);

}  // namespace earmark
