#include "earmark/longform/longform_json.hpp"

#include "earmark/core/error.hpp"

#include "finding_json.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <sstream>

namespace earmark {
namespace {

using Json = nlohmann::ordered_json;

Json number(double v, double scale = 1000.0) {
    if (!std::isfinite(v)) return nullptr;
    return std::round(v * scale) / scale;
}

}  // namespace

std::string longformToJson(const LongformReport& report, const LongformRules& rules, const LongformJsonInfo& info,
                           const LongAlignResult* text) {
    const LongTakeSeries& s = report.analysis.series;
    Json doc;
    doc["file"] = info.file;
    doc["duration_s"] = number(s.durationS);
    doc["sample_rate_hz"] = info.sampleRateHz;
    doc["channels"] = info.channels;
    doc["settings"] = {{"window_s", s.windowSeconds},
                       {"window_hop_s", s.windowHopSeconds},
                       {"frame_hop_s", number(report.analysis.tracks.hopSeconds, 1e6)},
                       {"seam_context_s", rules.seam.contextSeconds},
                       {"known_joins", std::any_of(report.joins.begin(), report.joins.end(),
                                                   [](const JoinMeasures& j) { return j.known; })}};
    Json findings = Json::array();
    for (const Finding& f : report.findings) findings.push_back(detail::findingToJson(f));
    doc["findings"] = findings;
    doc["f0_reference_hz"] = number(s.f0ReferenceHz, 100);
    Json trends = Json::array();
    for (const MeasureTrend& t : s.trends)
        trends.push_back({{"measure", t.measure},
                          {"unit", t.unit},
                          {"slope", t.fit.valid ? number(t.fit.slope, 1e5) : Json(nullptr)},
                          {"slope_low", t.fit.valid ? number(t.fit.slopeLow, 1e5) : Json(nullptr)},
                          {"slope_high", t.fit.valid ? number(t.fit.slopeHigh, 1e5) : Json(nullptr)},
                          {"significant", t.fit.significant()},
                          {"windows", t.fit.points}});
    doc["trends"] = trends;
    Json windows = Json::array();
    for (const WindowMeasures& w : s.windows)
        windows.push_back({{"start_s", number(w.startS)},
                           {"end_s", number(w.endS)},
                           {"measured", w.measured},
                           {"speech_s", number(w.speechSeconds, 100)},
                           {"loudness_lufs", number(w.loudnessLufs, 100)},
                           {"speech_level_dbfs", number(w.speechLevelDb, 100)},
                           {"f0_median_hz", number(w.f0MedianHz, 100)},
                           {"f0_range_st", number(w.f0RangeSt, 100)},
                           {"articulation_rate", number(w.articulationRate, 100)},
                           {"pauses", w.pauses},
                           {"pause_s", number(w.pauseSeconds, 100)},
                           {"timbre_distance", number(w.timbreDistance, 1000)}});
    doc["windows"] = windows;
    Json joins = Json::array();
    for (const JoinMeasures& j : report.joins)
        joins.push_back({{"time_s", number(j.timeS)},
                         {"known", j.known},
                         {"pause_start_s", number(j.pauseStartS)},
                         {"pause_end_s", number(j.pauseEndS)},
                         {"level_step_db", number(j.levelStepDb, 100)},
                         {"room_tone_step_db", number(j.roomToneStepDb, 100)},
                         {"click_db", number(j.clickDb, 100)},
                         {"click_time_s", number(j.clickTimeS, 1e4)},
                         {"envelope_jump", number(j.envelopeJump, 100)}});
    doc["joins"] = joins;
    if (text) {
        const auto intervals = [&](std::string_view name) {
            Json list = Json::array();
            if (const Tier* t = text->tiers.find(name))
                for (const Interval& i : t->intervals)
                    list.push_back({{"start_s", number(i.startS)}, {"end_s", number(i.endS)}, {"text", i.label}});
            return list;
        };
        const Tier* words = text->tiers.find(kWordsTier);
        doc["text"] = {{"method", text->method},
                       {"chunks", text->chunks},
                       {"words", words ? words->intervals.size() : 0},
                       {"mean_confidence", number(text->meanConfidence)},
                       {"paragraphs", intervals(kParagraphsTier)},
                       {"sentences", intervals(kSentencesTier)}};
    }
    return doc.dump(2);
}

std::vector<double> readChunkList(const std::string& path) {
    std::ifstream in(path);
    if (!in) throw InputError(path, "cannot be read");
    std::vector<double> times;
    std::string line;
    int lineNo = 0;
    while (std::getline(in, line)) {
        ++lineNo;
        const auto first = line.find_first_not_of(" \t\r");
        if (first == std::string::npos || line[first] == '#') continue;
        std::istringstream fields(line.substr(first));
        double t = 0;
        std::string rest;
        if (!(fields >> t) || (fields >> rest))
            throw InputError(path, "line " + std::to_string(lineNo) + ": expected one time in seconds, got '" +
                                       line.substr(first) + "'");
        if (!std::isfinite(t)) throw InputError(path, "line " + std::to_string(lineNo) + ": time is not finite");
        if (!times.empty() && t <= times.back())
            throw InputError(path, "line " + std::to_string(lineNo) + ": times must increase");
        times.push_back(t);
    }
    if (in.bad()) throw InputError(path, "cannot be read");
    return times;
}

}  // namespace earmark
