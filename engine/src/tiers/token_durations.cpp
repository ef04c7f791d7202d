#include "earmark/tiers/token_durations.hpp"

#include "earmark/core/error.hpp"
#include "row_check.hpp"
#include "json_document.hpp"
#include "text_util.hpp"

#include <nlohmann/json.hpp>

#include <cmath>
#include <limits>

namespace earmark {
namespace {

using namespace tiers_detail;

}  // namespace

void TokenDurationsParams::validate() const {
    if (hopSize < 1) throw ParamError("TokenDurationsParams.hopSize", "must be at least 1 sample");
    if (!(sampleRate > 0) || !std::isfinite(sampleRate))
        throw ParamError("TokenDurationsParams.sampleRate", "must be a positive number of Hz");
}

LoadedTimings parseTokenDurations(std::string_view text, const std::string& source,
                                  const TimingsReadOptions& options) {
    const Json doc = parseJsonObject(text, source, "expected a JSON object with hop_size, sample_rate and tokens");
    const auto hop = doc.find("hop_size");
    if (hop == doc.end() || !hop->is_number_integer() || hop->get<long long>() < 1)
        throw InputError(source, "'hop_size' is missing or not a whole number of samples >= 1");
    const auto rate = doc.find("sample_rate");
    if (rate == doc.end() || !rate->is_number() || !(rate->get<double>() > 0))
        throw InputError(source, "'sample_rate' is missing or not a positive number of Hz");
    const auto tokens = doc.find("tokens");
    if (tokens == doc.end() || !tokens->is_array()) throw InputError(source, "'tokens' is missing or not a list");
    std::string tierName(kTokensTier);
    if (const auto t = doc.find("tier"); t != doc.end()) {
        if (!t->is_string() || t->get<std::string>().empty())
            throw InputError(source, "'tier' is not a non-empty string");
        tierName = t->get<std::string>();
    }

    const double secondsPerFrame = static_cast<double>(hop->get<long long>()) / rate->get<double>();
    LoadedTimings out;
    Tier& tier = out.tiers.getOrAdd(tierName);
    RowNames rows(1);
    long long frame = 0;
    for (std::size_t k = 0; k < tokens->size(); ++k) {
        const Json& tok = (*tokens)[k];
        const std::string row = "tokens[" + std::to_string(k) + "]";
        if (!tok.is_object()) throw InputError(source, row + ": expected an object {\"text\", \"frames\"}");
        const auto txt = tok.find("text");
        if (txt == tok.end() || !txt->is_string()) throw InputError(source, row + ": 'text' is missing or not a string");
        const auto frames = tok.find("frames");
        if (frames == tok.end() || !frames->is_number_integer() || frames->get<long long>() < 0)
            throw InputError(source, row + ": 'frames' is missing or not a whole number >= 0");
        const long long n = frames->get<long long>();
        if (n > std::numeric_limits<long long>::max() - frame)
            throw InputError(source, row + ": the frames add up past " +
                                         std::to_string(std::numeric_limits<long long>::max()));
        const std::string label = txt->get<std::string>();
        if (n == 0) {
            if (!label.empty()) out.warnings.push_back(row + ": '" + label + "' lasts 0 frames and is left out");
        } else if (!label.empty()) {
            tier.intervals.push_back(Interval{static_cast<double>(frame) * secondsPerFrame,
                                              static_cast<double>(frame + n) * secondsPerFrame, label, std::nullopt});
            rows[0].push_back(row);
        }
        frame += n;
    }
    auto more = validateRows(out.tiers, rows, source, options.takeDurationS);
    out.warnings.insert(out.warnings.end(), more.begin(), more.end());
    return out;
}

std::string tierToTokenDurations(const Tier& tier, const TokenDurationsParams& params,
                                 std::optional<double> takeDurationS) {
    params.validate();
    const double framesPerSecond = params.sampleRate / params.hopSize;
    const auto toFrame = [&](double s) { return std::llround(std::max(0.0, s) * framesPerSecond); };
    Json tokens = Json::array();
    long long at = 0;
    const auto pauseTo = [&](long long frame) {
        if (frame > at) tokens.push_back(Json{{"text", ""}, {"frames", frame - at}});
        at = std::max(at, frame);
    };
    for (const Interval& iv : tier.intervals) {
        pauseTo(toFrame(iv.startS));
        const long long end = std::max(at, toFrame(iv.endS));
        tokens.push_back(Json{{"text", iv.label}, {"frames", end - at}});
        at = end;
    }
    if (takeDurationS) pauseTo(toFrame(*takeDurationS));

    std::string out = "{\"hop_size\": " + std::to_string(params.hopSize) +
                      ", \"sample_rate\": " + formatNumber(params.sampleRate) + ", \"tier\": " +
                      Json(tier.name).dump(-1, ' ', false, Json::error_handler_t::replace) + ",\n \"tokens\": [";
    for (std::size_t k = 0; k < tokens.size(); ++k) {
        out += k == 0 ? "\n  " : ",\n  ";
        out += tokens[k].dump(-1, ' ', false, Json::error_handler_t::replace);
    }
    out += tokens.empty() ? "]}\n" : "\n ]}\n";
    return out;
}

}  // namespace earmark
