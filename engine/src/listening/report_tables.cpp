// The report as JSON and CSV.
#include "earmark/export/defect_list.hpp"  // csvRecord, formatNumber
#include "earmark/listening/report_files.hpp"

#include <nlohmann/json.hpp>

#include <cmath>

namespace earmark::listening {
namespace {

using nlohmann::json;

json number(double v) { return std::isfinite(v) ? json(v) : json(nullptr); }
std::string field(double v) { return std::isfinite(v) ? formatNumber(v) : std::string(); }

json testJson(const TestResult& r) {
    json j = {{"defined", r.defined}, {"n", r.n}, {"statistic", number(r.statistic)}, {"p", number(r.p)},
              {"effect", number(r.effect)}};
    if (!r.method.empty()) j["method"] = r.method;
    if (!r.defined) j["why"] = r.why;
    return j;
}

}  // namespace

std::string reportToJson(const TestDesign& d, const Report& r, int indent) {
    json j;
    j["test"] = d.name;
    j["kind"] = std::string(kindName(r.kind));
    const Scale scale = scaleOf(r.kind);
    j["scale"] = {{"min", scale.min}, {"max", scale.max}};
    j["settings"] = {{"alpha", r.params.alpha},
                     {"bootstrap_rounds", r.params.bootstrapRounds},
                     {"bootstrap_seed", r.params.bootstrapSeed},
                     {"paired_test", std::string(pairedTestName(r.params.test))}};
    j["raters_kept"] = r.screening.kept;
    j["exclusions"] = json::array();
    for (const Exclusion& e : r.screening.excluded)
        j["exclusions"].push_back({{"rater", e.rater}, {"rule", e.rule}, {"reason", e.reason}});
    j["answers_used"] = r.answersUsed;
    j["balanced"] = r.balanced;
    j["systems"] = json::array();
    for (const SystemSummary& s : r.systems)
        j["systems"].push_back({{"system", s.system}, {"role", std::string(roleName(s.role))}, {"raters", s.raters},
                                {"lines", s.lines}, {"n", s.t.n}, {"mean", number(s.t.mean)}, {"sd", number(s.t.sd)},
                                {"ci_low", number(s.t.low)}, {"ci_high", number(s.t.high)},
                                {"bootstrap_low", number(s.bootLow)}, {"bootstrap_high", number(s.bootHigh)}});
    j["pairs"] = json::array();
    for (const PairComparison& p : r.pairs)
        j["pairs"].push_back({{"a", p.a}, {"b", p.b}, {"n", p.n}, {"mean_difference", number(p.meanDifference)},
                              {"test", p.chosen}, {"p", number(p.p)}, {"p_holm", number(p.pHolm)},
                              {"paired_t", testJson(p.pairedT)}, {"wilcoxon", testJson(p.wilcoxon)}});
    j["preferences"] = json::array();
    for (const Preference& p : r.preferences)
        j["preferences"].push_back({{"a", p.a}, {"b", p.b}, {"a_preferred", p.aPreferred},
                                    {"b_preferred", p.bPreferred}, {"no_preference", p.none},
                                    {"share_a", number(p.test.share)}, {"ci_low", number(p.test.low)},
                                    {"ci_high", number(p.test.high)}, {"p", number(p.test.p)},
                                    {"p_holm", number(p.pHolm)}, {"effect", number(p.test.share - 0.5)}});
    j["per_line"] = json::array();
    for (const LineValues& lv : r.perLine) {
        const BoxFigures b = boxFigures(lv.values);
        j["per_line"].push_back({{"line", lv.line}, {"system", lv.system}, {"n", lv.values.size()},
                                 {"min", b.min}, {"q1", b.q1}, {"median", b.median}, {"q3", b.q3}, {"max", b.max}});
    }
    return j.dump(indent) + "\n";
}

std::string systemsCsv(const Report& r) {
    std::string out = csvRecord({"system", "role", "raters", "lines", "n", "mean", "sd", "ci_low", "ci_high",
                                 "bootstrap_low", "bootstrap_high"});
    for (const SystemSummary& s : r.systems)
        out += csvRecord({s.system, std::string(roleName(s.role)), std::to_string(s.raters), std::to_string(s.lines),
                          std::to_string(s.t.n), field(s.t.mean), field(s.t.sd), field(s.t.low), field(s.t.high),
                          field(s.bootLow), field(s.bootHigh)});
    return out;
}

std::string pairsCsv(const Report& r) {
    std::string out = csvRecord({"a", "b", "n", "mean_difference", "test", "p", "p_holm", "t", "p_t", "d_z",
                                 "wilcoxon_T", "p_wilcoxon", "wilcoxon_method", "rank_biserial"});
    for (const PairComparison& p : r.pairs)
        out += csvRecord({p.a, p.b, std::to_string(p.n), field(p.meanDifference), p.chosen, field(p.p),
                          field(p.pHolm), field(p.pairedT.statistic), field(p.pairedT.p), field(p.pairedT.effect),
                          field(p.wilcoxon.statistic), field(p.wilcoxon.p), p.wilcoxon.method,
                          field(p.wilcoxon.effect)});
    return out;
}

std::string preferencesCsv(const Report& r) {
    std::string out = csvRecord({"a", "b", "a_preferred", "b_preferred", "no_preference", "share_a", "ci_low",
                                 "ci_high", "p", "p_holm"});
    for (const Preference& p : r.preferences)
        out += csvRecord({p.a, p.b, std::to_string(p.aPreferred), std::to_string(p.bPreferred),
                          std::to_string(p.none), field(p.test.share), field(p.test.low), field(p.test.high),
                          field(p.test.p), field(p.pHolm)});
    return out;
}

std::string exclusionsCsv(const Report& r) {
    std::string out = csvRecord({"rater", "rule", "reason"});
    for (const Exclusion& e : r.screening.excluded) out += csvRecord({e.rater, e.rule, e.reason});
    return out;
}

}  // namespace earmark::listening
