// One long-form finding as a JSON object: kind, measure, unit, start_s,
// end_s, value, threshold, reason (non-finite numbers as null). Shared by the
// long-form report and the scan's JSON. Private to the engine.
#pragma once

#include "earmark/longform/findings.hpp"

#include <nlohmann/json.hpp>

#include <string>

namespace earmark::detail {

nlohmann::ordered_json findingToJson(const Finding& finding);

// Throws InputError(path, …) naming the take for an unknown kind or a
// missing field.
Finding findingFromJson(const nlohmann::ordered_json& json, const std::string& path, const std::string& takeId);

}  // namespace earmark::detail
