#include "finding_json.hpp"

#include "earmark/core/error.hpp"

#include <cmath>

namespace earmark::detail {
namespace {

using Json = nlohmann::ordered_json;

Json number(double v) { return std::isfinite(v) ? Json(std::round(v * 1000.0) / 1000.0) : Json(nullptr); }
double numberFrom(const Json& j) { return j.is_number() ? j.get<double>() : NAN; }

}  // namespace

Json findingToJson(const Finding& f) {
    return Json{{"kind", findingName(f.kind)}, {"measure", f.measure},         {"unit", f.unit},
                {"start_s", number(f.startS)}, {"end_s", number(f.endS)},     {"value", number(f.value)},
                {"threshold", number(f.threshold)}, {"reason", f.reason}};
}

Finding findingFromJson(const Json& j, const std::string& path, const std::string& takeId) {
    try {
        const auto kind = findingKindFromName(j.at("kind").get<std::string>());
        if (!kind) throw InputError(path, "take '" + takeId + "': unknown finding '" + j.at("kind").get<std::string>() + "'");
        Finding f;
        f.kind = *kind;
        f.measure = j.at("measure").get<std::string>();
        f.unit = j.value("unit", "");
        f.startS = numberFrom(j.at("start_s"));
        f.endS = numberFrom(j.at("end_s"));
        f.value = numberFrom(j.at("value"));
        f.threshold = numberFrom(j.at("threshold"));
        f.reason = j.at("reason").get<std::string>();
        return f;
    } catch (const Json::exception& e) {
        throw InputError(path, "take '" + takeId + "': a finding lacks a field: " + e.what());
    }
}

}  // namespace earmark::detail
