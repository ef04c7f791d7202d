#include "earmark/tiers/timings_json.hpp"

#include "earmark/core/error.hpp"
#include "row_check.hpp"
#include "json_document.hpp"
#include "text_util.hpp"

#include <nlohmann/json.hpp>

namespace earmark {
namespace {

using namespace tiers_detail;

double numberField(const Json& item, const char* key, const std::string& row, const std::string& source) {
    const auto it = item.find(key);
    if (it == item.end()) throw InputError(source, row + ": '" + key + "' is missing");
    if (!it->is_number()) throw InputError(source, row + ": '" + key + "' is not a number");
    return it->get<double>();
}

Interval readInterval(const Json& item, const std::string& row, const std::string& source) {
    if (!item.is_object()) throw InputError(source, row + ": expected an object {\"text\", \"start\", \"end\"}");
    Interval iv;
    const auto text = item.find("text");
    if (text == item.end()) throw InputError(source, row + ": 'text' is missing");
    if (!text->is_string()) throw InputError(source, row + ": 'text' is not a string");
    iv.label = text->get<std::string>();
    iv.startS = numberField(item, "start", row, source);
    iv.endS = numberField(item, "end", row, source);
    const auto conf = item.find("confidence");
    if (conf != item.end() && !conf->is_null()) {
        if (!conf->is_number()) throw InputError(source, row + ": 'confidence' is not a number");
        iv.confidence = conf->get<double>();
    }
    return iv;
}

}  // namespace

LoadedTimings parseTimingsJson(std::string_view text, const std::string& source,
                               const TimingsReadOptions& options) {
    const Json doc = parseJsonObject(text, source, "expected a JSON object with tiers such as \"words\"");

    LoadedTimings out;
    if (const auto v = doc.find("version"); v != doc.end() && !(v->is_number_integer() && v->get<long long>() == 1))
        throw InputError(source, "'version' is not 1 (this reader knows version 1)");
    if (const auto d = doc.find("duration"); d != doc.end() && !d->is_null()) {
        if (!d->is_number() || d->get<double>() < 0)
            throw InputError(source, "'duration' is not a non-negative number of seconds");
        out.tiers.durationS = d->get<double>();
    }
    RowNames rows;
    for (const auto& [key, value] : doc.items()) {
        if (!value.is_array()) continue;
        Tier& tier = out.tiers.getOrAdd(key);
        rows.emplace_back();
        for (std::size_t i = 0; i < value.size(); ++i) {
            const std::string row = key + "[" + std::to_string(i) + "]";
            tier.intervals.push_back(readInterval(value[i], row, source));
            rows.back().push_back(row);
        }
    }
    out.warnings = validateRows(out.tiers, rows, source, options.takeDurationS);
    return out;
}

std::string timingsToJson(const TierSet& set) {
    const auto str = [](const std::string& s) {
        return Json(s).dump(-1, ' ', false, Json::error_handler_t::replace);
    };
    std::string out = "{\n  \"version\": 1";
    if (set.durationS) out += ",\n  \"duration\": " + formatNumber(*set.durationS);
    for (const Tier& tier : set.tiers) {
        out += ",\n  " + str(tier.name) + ": [";
        for (std::size_t i = 0; i < tier.intervals.size(); ++i) {
            const Interval& iv = tier.intervals[i];
            out += i == 0 ? "\n    " : ",\n    ";
            out += "{\"text\": " + str(iv.label) + ", \"start\": " + formatNumber(iv.startS) +
                   ", \"end\": " + formatNumber(iv.endS);
            if (iv.confidence) out += ", \"confidence\": " + formatNumber(*iv.confidence);
            out += "}";
        }
        out += tier.intervals.empty() ? "]" : "\n  ]";
    }
    out += "\n}\n";
    return out;
}

}  // namespace earmark
