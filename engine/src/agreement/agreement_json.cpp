#include "earmark/agreement/agreement_json.hpp"

#include <nlohmann/json.hpp>

#include <cmath>

namespace earmark::agreement {
namespace {

using nlohmann::ordered_json;

ordered_json number(double v) { return std::isfinite(v) ? ordered_json(v) : ordered_json(nullptr); }

ordered_json statistic(const ChanceCorrected& c) {
    return {{"value", number(c.value)}, {"observed", number(c.observed)}, {"expected", number(c.expected)},
            {"units", c.units}};
}

ordered_json pairToJson(const PairAgreement& p) {
    const SpanTally& s = p.spans;
    return {{"rater_a", p.raterA},
            {"rater_b", p.raterB},
            {"takes", p.takes},
            {"cohen_kappa", statistic(p.cohen)},
            {"spans",
             {{"marks_a", s.spansA},
              {"marks_b", s.spansB},
              {"matched", s.matched},
              {"only_a", s.onlyA()},
              {"only_b", s.onlyB()},
              {"recall", number(s.recall())},
              {"precision", number(s.precision())},
              {"f1", number(s.f1())},
              {"mean_abs_start_diff_s", number(s.meanAbsStartDiffSeconds())},
              {"mean_abs_end_diff_s", number(s.meanAbsEndDiffSeconds())}}}};
}

}  // namespace

std::string agreementToJson(const AgreementReport& report, const std::string& sessionName) {
    ordered_json rows = ordered_json::array();
    for (const CategoryAgreement& row : report.rows) {
        ordered_json pairs = ordered_json::array();
        for (const PairAgreement& p : row.pairs) pairs.push_back(pairToJson(p));
        rows.push_back({{"category", row.category ? ordered_json(std::string(categoryName(*row.category)))
                                                  : ordered_json("overall")},
                        {"fleiss_kappa", statistic(row.fleiss)},
                        {"krippendorff_alpha", statistic(row.alpha)},
                        {"pairs", std::move(pairs)}});
    }
    const ordered_json j = {{"format", "earmark-agreement"},
                            {"version", 1},
                            {"session", sessionName},
                            {"tolerance_s", report.toleranceSeconds},
                            {"raters", report.raters},
                            {"takes_compared", report.takes},
                            {"marks_compared", report.marksCompared},
                            {"marks_without_rater", report.marksWithoutRater},
                            {"categories", std::move(rows)}};
    return j.dump(2, ' ', false, ordered_json::error_handler_t::replace) + "\n";
}

}  // namespace earmark::agreement
