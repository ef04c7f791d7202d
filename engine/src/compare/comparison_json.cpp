#include "earmark/compare/comparison_json.hpp"

#include "io/json_text.hpp"

#include <nlohmann/json.hpp>

#include <cmath>

namespace earmark {
namespace {

using nlohmann::json;

// Four decimals: figures, not raw tracks.
json number(double v) { return std::isfinite(v) ? json(std::round(v * 1e4) / 1e4) : json(nullptr); }
json number(const std::optional<double>& v) { return v ? number(*v) : json(nullptr); }

json sideJson(const TakeSide& s, const std::string& name) {
    json side = {
        {"duration_s", number(s.durationS)},
        {"speech_start_s", number(s.speechStartS)},
        {"speech_end_s", number(s.speechEndS)},
        {"words_from", wordSourceName(s.wordSource)},
        {"words", s.words.intervals.size()},
        {"f0_median_hz", number(s.pitchSummary.medianHz)},
        {"f0_range_st", number(s.pitchSummary.rangeSemitones)},
    };
    io_detail::putPath(side, "file", name);
    return side;
}

json wordSide(const WordMeasures& m) {
    return {
        {"start_s", number(m.startS)},        {"end_s", number(m.endS)},
        {"duration_s", number(m.durationS)},  {"f0_mean_hz", number(m.f0MeanHz)},
        {"f0_range_st", number(m.f0RangeSt)}, {"prominence", number(m.prominence)},
    };
}

}  // namespace

std::string comparisonToJson(const TakeComparison& c, const ComparisonJsonNames& names) {
    json j;
    j["a"] = sideJson(c.a, names.a);
    j["b"] = sideJson(c.b, names.b);
    j["alignment"] = {
        {"method", c.alignment.method == AlignmentMethod::WordByWord ? "word-by-word" : "frame-wise"},
        {"hop_s", number(c.alignment.hopSeconds)},
        {"aligned_frames", c.overall.alignedPairs},
    };
    const OverallFigures& o = c.overall;
    j["overall"] = {
        {"duration_ratio", number(o.durationRatio)},
        {"f0_mean_diff_st", number(o.f0MeanDiffSt)},
        {"f0_mean_abs_diff_st", number(o.f0MeanAbsDiffSt)},
        {"f0_range_diff_st", number(o.f0RangeDiffSt)},
        {"mcd_db", number(o.mcdDb)},
        {"voiced_frames", o.voicedPairs},
    };
    if (c.words) {
        json words = json::array();
        for (std::size_t i = 0; i < c.words->words.size(); ++i) {
            const WordComparison& w = c.words->words[i];
            json flags = json::array(), largest = json::array();
            for (WordDifference d : w.flags) {
                flags.push_back(wordDifferenceName(d));
                if (c.words->largest[static_cast<std::size_t>(d)] == i) largest.push_back(wordDifferenceName(d));
            }
            words.push_back({
                {"text", w.text},
                {"a", wordSide(w.a)},
                {"b", wordSide(w.b)},
                {"duration_ratio", number(w.durationRatio)},
                {"f0_mean_diff_st", number(w.f0MeanDiffSt)},
                {"f0_range_diff_st", number(w.f0RangeDiffSt)},
                {"prominence_diff", number(w.prominenceDiff)},
                {"flags", flags},
                {"largest", largest},
            });
        }
        j["words"] = words;
    } else {
        j["words"] = nullptr;
    }
    j["notes"] = c.notes;
    return j.dump(2, ' ', false, json::error_handler_t::replace);
}

}  // namespace earmark
