#include "word_measures_json.hpp"

#include "earmark/core/error.hpp"

#include <cmath>
#include <optional>

namespace earmark::detail {
namespace {

using Json = nlohmann::ordered_json;
using Opt = std::optional<double>;

// The optional figures: JSON key and member, written as null when empty.
struct OptionalField {
    const char* key;
    Opt WordMeasures::*field;
};
constexpr OptionalField kOptional[] = {
    {"f0_mean_hz", &WordMeasures::f0MeanHz},
    {"f0_min_hz", &WordMeasures::f0MinHz},
    {"f0_max_hz", &WordMeasures::f0MaxHz},
    {"f0_range_st", &WordMeasures::f0RangeSt},
    {"f0_peak_position", &WordMeasures::f0PeakPosition},
    {"f0_slope_st_per_s", &WordMeasures::f0SlopeStPerS},
    {"energy_mean_dbfs", &WordMeasures::energyMeanDb},
    {"energy_max_dbfs", &WordMeasures::energyMaxDb},
    {"pause_before_s", &WordMeasures::pauseBeforeS},
    {"pause_after_s", &WordMeasures::pauseAfterS},
};

Json numberOrNull(const Opt& v) { return v && std::isfinite(*v) ? Json(*v) : Json(nullptr); }

}  // namespace

Json wordMeasuresToJson(const std::vector<WordMeasures>& words) {
    Json out = Json::array();
    for (const auto& w : words) {
        Json j;
        j["word"] = w.text;
        j["start_s"] = w.startS;
        j["end_s"] = w.endS;
        j["duration_s"] = w.durationS;
        j["syllables"] = w.syllables;
        for (const auto& f : kOptional) j[f.key] = numberOrNull(w.*f.field);
        j["voiced_fraction"] = w.voicedFraction;
        j["prominence"] = w.prominence;
        out.push_back(std::move(j));
    }
    return out;
}

std::vector<WordMeasures> wordMeasuresFromJson(const Json& json, const std::string& path, const std::string& takeId) {
    if (!json.is_array()) throw InputError(path, "take '" + takeId + "': word_measures must be a list");
    std::vector<WordMeasures> out;
    for (const auto& j : json) {
        const std::string where = "take '" + takeId + "' word_measures entry " + std::to_string(out.size() + 1);
        if (!j.is_object() || !j.contains("word") || !j.at("word").is_string() || !j.contains("start_s") ||
            !j.at("start_s").is_number() || !j.contains("end_s") || !j.at("end_s").is_number())
            throw InputError(path, where + ": needs a word, start_s and end_s");
        WordMeasures w;
        w.text = j.at("word").get<std::string>();
        w.startS = j.at("start_s").get<double>();
        w.endS = j.at("end_s").get<double>();
        w.durationS = j.value("duration_s", w.endS - w.startS);
        w.syllables = j.value("syllables", 0);
        for (const auto& f : kOptional)
            if (j.contains(f.key) && j.at(f.key).is_number()) w.*f.field = j.at(f.key).get<double>();
        w.voicedFraction = j.value("voiced_fraction", 0.0);
        w.prominence = j.value("prominence", 0.0);
        out.push_back(std::move(w));
    }
    return out;
}

}  // namespace earmark::detail
