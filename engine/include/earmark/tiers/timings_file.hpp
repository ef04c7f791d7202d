// Reading a timings file of any supported form, chosen by extension and,
// for .json, by content.
#pragma once

#include "earmark/tiers/timings.hpp"

#include <optional>
#include <string>

namespace earmark {

enum class TimingsFormat {
    EarmarkJson,     // docs/timings-json.md
    Csv,             // start,end,label[,tier[,confidence]]
    WebVtt,          // W3C WebVTT cues
    TokenDurations,  // {"hop_size","sample_rate","tokens":[{"text","frames"}]}
};

// From the extension (case-insensitive): .json → EarmarkJson, .csv → Csv,
// .vtt → WebVtt; nullopt otherwise. A .json file holding "tokens" and
// "hop_size" is read as TokenDurations by loadTimings.
std::optional<TimingsFormat> timingsFormatFromPath(const std::string& path);

// Reads and validates `path`. Throws InputError(path, …) when the file is
// missing or unreadable, its extension is unknown (and no format is given),
// or any row is bad (see the reader of each form).
LoadedTimings loadTimings(const std::string& path, const TimingsReadOptions& options = {},
                          std::optional<TimingsFormat> format = std::nullopt);

}  // namespace earmark
