#include "earmark/listening/screening.hpp"

#include "earmark/core/error.hpp"
#include "earmark/export/defect_list.hpp"  // formatNumber

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <set>
#include <tuple>

namespace earmark::listening {
namespace {

std::string percent(double share) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.1f %%", 100.0 * share);
    return buf;
}

void validate(const ScreeningParams& p) {
    if (!(p.maxFailShare >= 0 && p.maxFailShare <= 1)) throw ParamError("ScreeningParams.maxFailShare", "must be in [0, 1]");
    if (p.maxAttentionFailures < 0) throw ParamError("ScreeningParams.maxAttentionFailures", "must not be negative");
    if (!std::isfinite(p.referenceBelow) || !std::isfinite(p.anchorAbove))
        throw ParamError("ScreeningParams.referenceBelow", "thresholds must be finite");
}

struct RaterAnswers {
    std::vector<const Answer*> main, repeat;
};

void mushraRule(const TestDesign& d, const std::string& rater, const RaterAnswers& ra, const ScreeningParams& p,
                std::vector<Exclusion>& out) {
    const bool hasMid = std::any_of(d.systems.begin(), d.systems.end(),
                                    [](const System& s) { return s.role == SystemRole::MidAnchor; });
    const SystemRole anchorRole = hasMid ? SystemRole::MidAnchor : SystemRole::LowAnchor;
    std::set<std::string> lines, refLow, anchorHigh;
    for (const Answer* a : ra.main) {
        if (!a->score) continue;
        lines.insert(a->line);
        const SystemRole role = d.systems[static_cast<std::size_t>(d.systemIndex(a->system))].role;
        if (role == SystemRole::Reference) {
            if (*a->score < p.referenceBelow) refLow.insert(a->line);
        }
        if (role == anchorRole && *a->score > p.anchorAbove) anchorHigh.insert(a->line);
    }
    if (lines.empty()) return;
    const double items = static_cast<double>(lines.size());
    const double refShare = refLow.size() / items, anchorShare = anchorHigh.size() / items;
    if (refShare > p.maxFailShare)
        out.push_back({rater, "mushra-reference",
                       "scored the hidden reference below " + formatNumber(p.referenceBelow) + " on " +
                           std::to_string(refLow.size()) + " of " + std::to_string(lines.size()) + " lines (" +
                           percent(refShare) + " > " + percent(p.maxFailShare) + ", ITU-R BS.1534-3)"});
    if (anchorShare > p.maxFailShare)
        out.push_back({rater, "mushra-anchor",
                       "scored the " + std::string(hasMid ? "mid-range" : "low") + " anchor above " +
                           formatNumber(p.anchorAbove) + " on " + std::to_string(anchorHigh.size()) + " of " +
                           std::to_string(lines.size()) + " lines (" + percent(anchorShare) + " > " +
                           percent(p.maxFailShare) + ", ITU-R BS.1534-3)"});
}

void repeatRule(const std::string& rater, const RaterAnswers& ra, double limit, std::vector<Exclusion>& out) {
    std::map<std::tuple<std::string, std::string, std::string>, double> first;
    for (const Answer* a : ra.main)
        if (a->score) first[{a->line, a->system, a->versus}] = *a->score;
    double sum = 0;
    int n = 0;
    for (const Answer* a : ra.repeat) {
        const auto it = first.find({a->line, a->system, a->versus});
        if (!a->score || it == first.end()) continue;
        sum += std::fabs(*a->score - it->second);
        ++n;
    }
    if (n > 0 && sum / n > limit)
        out.push_back({rater, "repeat-consistency",
                       "repeated answers differ from the first by " + formatNumber(std::round(sum / n * 1000) / 1000) +
                           " on average over " + std::to_string(n) + " repeats (limit " + formatNumber(limit) + ")"});
}

void attentionRule(const TestDesign& d, const std::string& rater, const RaterAnswers& ra, int allowed,
                   std::vector<Exclusion>& out) {
    int checks = 0, failed = 0;
    for (const Answer* a : ra.main) {
        if (!a->score) continue;
        for (const auto& [name, sign] : {std::pair{a->system, 1.0}, std::pair{a->versus, -1.0}}) {
            const int s = name.empty() ? -1 : d.systemIndex(name);
            if (s < 0 || d.systems[static_cast<std::size_t>(s)].role != SystemRole::AttentionCheck) continue;
            const System& sys = d.systems[static_cast<std::size_t>(s)];
            const double v = sign * *a->score + 0.0;
            ++checks;
            if (v < sys.acceptMin || v > sys.acceptMax) ++failed;
        }
    }
    if (failed > allowed)
        out.push_back({rater, "attention", "failed " + std::to_string(failed) + " of " + std::to_string(checks) +
                                               " attention checks (allowed " + std::to_string(allowed) + ")"});
}

}  // namespace

bool Screening::isKept(const std::string& rater) const { return std::binary_search(kept.begin(), kept.end(), rater); }

Screening screenRaters(const TestDesign& d, const std::vector<Answer>& answers, const ScreeningParams& p,
                       const std::vector<std::string>& expectedRaters) {
    validate(p);
    std::map<std::string, RaterAnswers> byRater;
    for (const std::string& r : expectedRaters) byRater[r];
    for (const Answer& a : answers) (a.kind == TrialKind::Repeat ? byRater[a.rater].repeat : byRater[a.rater].main).push_back(&a);
    const Scale scale = scaleOf(d.kind);
    const double repeatLimit = p.maxRepeatDifference >= 0 ? p.maxRepeatDifference : 0.25 * (scale.max - scale.min);

    Screening s;
    for (const auto& [rater, ra] : byRater) {
        std::vector<Exclusion> failed;
        const bool any = std::any_of(ra.main.begin(), ra.main.end(), [](const Answer* a) { return a->score.has_value(); });
        if (!any) {
            failed.push_back({rater, "rated-nothing", "gave no score"});
        } else {
            if (d.kind == TestKind::Mushra && p.mushraPostScreening) mushraRule(d, rater, ra, p, failed);
            repeatRule(rater, ra, repeatLimit, failed);
            attentionRule(d, rater, ra, p.maxAttentionFailures, failed);
        }
        if (failed.empty()) s.kept.push_back(rater);
        s.excluded.insert(s.excluded.end(), failed.begin(), failed.end());
    }
    return s;
}

}  // namespace earmark::listening
