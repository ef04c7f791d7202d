#include "earmark/agreement/mark_agreement.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <tuple>

namespace earmark::agreement {
namespace {

// Spans of one rater on one take in one category.
using SpanKey = std::tuple<TakeId, std::string, MarkCategory>;

struct Inputs {
    ReviewersByTake reviewers;  // compared takes only
    std::vector<std::string> raters;
    std::map<SpanKey, std::vector<Span>> spans;
};

Inputs gather(const std::vector<Mark>& marks, const ReviewersByTake& given, AgreementReport& report) {
    Inputs in;
    ReviewersByTake all = given;
    for (const Mark& m : marks)
        if (m.rater.empty()) ++report.marksWithoutRater;
        else all[m.takeId].insert(m.rater);
    std::set<std::string> raters;
    for (auto& [take, who] : all) {
        who.erase(std::string());
        if (who.size() < 2) continue;
        in.reviewers[take] = who;
        raters.insert(who.begin(), who.end());
        report.takes.push_back(take);
    }
    in.raters.assign(raters.begin(), raters.end());
    for (const Mark& m : marks) {
        if (m.rater.empty() || !in.reviewers.count(m.takeId)) continue;
        ++report.marksCompared;
        in.spans[{m.takeId, m.rater, m.category}].push_back({m.startSeconds, m.endSeconds});
    }
    return in;
}

const std::vector<Span>& spansOf(const Inputs& in, TakeId take, const std::string& rater, MarkCategory c) {
    static const std::vector<Span> kNone;
    const auto it = in.spans.find({take, rater, c});
    return it == in.spans.end() ? kNone : it->second;
}

// Present (1) / absent (0) / missing per (take, rater) for one category.
RatingTable tableOf(const Inputs& in, MarkCategory c) {
    RatingTable table;
    for (const auto& [take, who] : in.reviewers) {
        std::vector<std::optional<int>> row;
        for (const std::string& r : in.raters)
            row.push_back(who.count(r) ? std::optional<int>(spansOf(in, take, r, c).empty() ? 0 : 1) : std::nullopt);
        table.push_back(std::move(row));
    }
    return table;
}

std::vector<std::optional<int>> column(const RatingTable& t, std::size_t rater) {
    std::vector<std::optional<int>> out;
    for (const auto& row : t) out.push_back(row[rater]);
    return out;
}

CategoryAgreement rowOf(const Inputs& in, std::optional<MarkCategory> only, double tolerance) {
    CategoryAgreement row{only, {}, {}, {}};
    RatingTable table;
    for (MarkCategory c : allMarkCategories()) {
        if (only && c != *only) continue;
        const RatingTable part = tableOf(in, c);
        table.insert(table.end(), part.begin(), part.end());
    }
    row.fleiss = fleissKappa(table);
    row.alpha = krippendorffAlphaNominal(table);
    for (std::size_t a = 0; a < in.raters.size(); ++a)
        for (std::size_t b = a + 1; b < in.raters.size(); ++b) {
            PairAgreement pair{in.raters[a], in.raters[b], 0, cohenKappa(column(table, a), column(table, b)), {}};
            for (const auto& [take, who] : in.reviewers) {
                if (!who.count(pair.raterA) || !who.count(pair.raterB)) continue;
                ++pair.takes;
                for (MarkCategory c : allMarkCategories()) {
                    if (only && c != *only) continue;
                    const auto& sa = spansOf(in, take, pair.raterA, c);
                    const auto& sb = spansOf(in, take, pair.raterB, c);
                    pair.spans.add(sa, sb, matchSpans(sa, sb, tolerance));
                }
            }
            row.pairs.push_back(std::move(pair));
        }
    return row;
}

}  // namespace

AgreementReport markAgreement(const std::vector<Mark>& marks, const ReviewersByTake& reviewers,
                              const AgreementParams& params) {
    if (!(params.toleranceSeconds >= 0.0) || !std::isfinite(params.toleranceSeconds))
        throw ParamError("AgreementParams.toleranceSeconds",
                         "must be a finite number of seconds ≥ 0, not " + std::to_string(params.toleranceSeconds));
    AgreementReport report;
    report.toleranceSeconds = params.toleranceSeconds;
    const Inputs in = gather(marks, reviewers, report);
    report.raters = in.raters;
    report.rows.push_back(rowOf(in, std::nullopt, params.toleranceSeconds));
    for (MarkCategory c : allMarkCategories()) report.rows.push_back(rowOf(in, c, params.toleranceSeconds));
    return report;
}

}  // namespace earmark::agreement
