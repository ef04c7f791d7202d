#include "earmark/tiers/timings_file.hpp"

#include "earmark/core/error.hpp"
#include "earmark/tiers/timings_csv.hpp"
#include "earmark/tiers/timings_json.hpp"
#include "earmark/tiers/timings_vtt.hpp"
#include "earmark/tiers/token_durations.hpp"
#include "earmark/io/text_file.hpp"
#include "io/json_text.hpp"
#include "text_util.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cctype>
#include <filesystem>

namespace earmark {

std::optional<TimingsFormat> timingsFormatFromPath(const std::string& path) {
    std::string ext = std::filesystem::path(path).extension().string();
    std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return std::tolower(c); });
    if (ext == ".json") return TimingsFormat::EarmarkJson;
    if (ext == ".csv") return TimingsFormat::Csv;
    if (ext == ".vtt") return TimingsFormat::WebVtt;
    return std::nullopt;
}

LoadedTimings loadTimings(const std::string& path, const TimingsReadOptions& options,
                          std::optional<TimingsFormat> format) {
    if (!format) format = timingsFormatFromPath(path);
    if (!format) throw InputError(path, "unknown timings file type (expected .json, .csv or .vtt)");
    const std::string text = readTextFile(path);
    if (*format == TimingsFormat::EarmarkJson) {
        // The durations form is JSON too; tell them apart by its keys.
        const auto doc = io_detail::parseJsonText<nlohmann::json>(tiers_detail::stripBom(text), path);
        if (doc.is_object() && doc.contains("tokens") && doc.contains("hop_size"))
            format = TimingsFormat::TokenDurations;
    }
    switch (*format) {
    case TimingsFormat::EarmarkJson: return parseTimingsJson(text, path, options);
    case TimingsFormat::Csv: return parseTimingsCsv(text, path, options);
    case TimingsFormat::WebVtt: return parseTimingsVtt(text, path, options);
    case TimingsFormat::TokenDurations: return parseTokenDurations(text, path, options);
    }
    throw InputError(path, "unknown timings format");
}

}  // namespace earmark
