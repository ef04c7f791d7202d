#include "earmark/agreement/span_matching.hpp"

#include "earmark/core/error.hpp"
#include "earmark/core/numeric.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

namespace earmark::agreement {
namespace {

void checkSpans(const std::vector<Span>& spans, const char* which) {
    for (const Span& s : spans)
        if (!(s.endSeconds >= s.startSeconds) || !std::isfinite(s.startSeconds) || !std::isfinite(s.endSeconds))
            throw ParamError(which, "span " + std::to_string(s.startSeconds) + "–" + std::to_string(s.endSeconds) +
                                        " s is not a finite span with end ≥ start");
}

double ratio(double num, double den) { return den > 0.0 ? num / den : kNaN; }

}  // namespace

SpanMatching matchSpans(const std::vector<Span>& a, const std::vector<Span>& b, double toleranceSeconds) {
    if (!(toleranceSeconds >= 0.0) || !std::isfinite(toleranceSeconds))
        throw ParamError("toleranceSeconds", "must be a finite number ≥ 0, not " + std::to_string(toleranceSeconds));
    checkSpans(a, "matchSpans.a");
    checkSpans(b, "matchSpans.b");
    struct Candidate {
        double overlap;
        std::size_t i, j;
    };
    std::vector<Candidate> candidates;
    for (std::size_t i = 0; i < a.size(); ++i)
        for (std::size_t j = 0; j < b.size(); ++j) {
            const double overlap = std::min(a[i].endSeconds, b[j].endSeconds) -
                                   std::max(a[i].startSeconds, b[j].startSeconds);
            if (overlap >= -toleranceSeconds) candidates.push_back({overlap, i, j});
        }
    std::stable_sort(candidates.begin(), candidates.end(),
                     [](const Candidate& x, const Candidate& y) { return x.overlap > y.overlap; });
    std::vector<bool> usedA(a.size(), false), usedB(b.size(), false);
    SpanMatching out{{}, a.size(), b.size()};
    for (const Candidate& c : candidates) {
        if (usedA[c.i] || usedB[c.j]) continue;
        usedA[c.i] = usedB[c.j] = true;
        out.pairs.emplace_back(c.i, c.j);
    }
    std::sort(out.pairs.begin(), out.pairs.end());
    return out;
}

void SpanTally::add(const std::vector<Span>& a, const std::vector<Span>& b, const SpanMatching& m) {
    spansA += static_cast<int>(m.spansA);
    spansB += static_cast<int>(m.spansB);
    matched += static_cast<int>(m.pairs.size());
    for (const auto& [i, j] : m.pairs) {
        sumAbsStartDiffSeconds += std::abs(a[i].startSeconds - b[j].startSeconds);
        sumAbsEndDiffSeconds += std::abs(a[i].endSeconds - b[j].endSeconds);
    }
}

double SpanTally::recall() const { return ratio(matched, spansA); }
double SpanTally::precision() const { return ratio(matched, spansB); }
double SpanTally::f1() const { return ratio(2.0 * matched, spansA + spansB); }
double SpanTally::meanAbsStartDiffSeconds() const { return ratio(sumAbsStartDiffSeconds, matched); }
double SpanTally::meanAbsEndDiffSeconds() const { return ratio(sumAbsEndDiffSeconds, matched); }

}  // namespace earmark::agreement
