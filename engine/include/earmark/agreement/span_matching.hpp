// Temporal agreement of two raters' mark spans on the same take.
//
// Two spans match when they overlap, or when the gap between them is at most
// `toleranceSeconds` (gap = later start − earlier end). Each span matches at
// most one span of the other rater: candidate pairs are taken greedily, the
// largest overlap first (a gap counts as a negative overlap); ties go to the
// earlier span of rater A, then of rater B, so the result is deterministic.
// Greedy matching by overlap is common practice for event-based comparison
// of annotations; it can miss the largest possible matching when spans chain
// across each other, which marks on one take rarely do.
//
// Figures are precision/recall-style with rater A as the reference:
// recall = matched / spans of A, precision = matched / spans of B,
// F1 = 2 · matched / (spans of A + spans of B). Each is NaN when its
// denominator is 0. Times are seconds from the start of the take.
// Pure functions; thread-safe. ParamError for a negative tolerance or a span
// whose end precedes its start.
#pragma once

#include <cstddef>
#include <utility>
#include <vector>

namespace earmark::agreement {

struct Span {
    double startSeconds = 0.0;
    double endSeconds = 0.0;
};

struct SpanMatching {
    std::vector<std::pair<std::size_t, std::size_t>> pairs;  // (index in A, index in B), by index in A
    std::size_t spansA = 0, spansB = 0;
};

SpanMatching matchSpans(const std::vector<Span>& a, const std::vector<Span>& b, double toleranceSeconds);

// Counts summed over several takes, and the figures derived from them.
struct SpanTally {
    int spansA = 0, spansB = 0, matched = 0;
    double sumAbsStartDiffSeconds = 0.0;  // over matched pairs
    double sumAbsEndDiffSeconds = 0.0;

    // Adds one take's matching of spans `a` and `b`.
    void add(const std::vector<Span>& a, const std::vector<Span>& b, const SpanMatching& m);
    int onlyA() const { return spansA - matched; }
    int onlyB() const { return spansB - matched; }
    double recall() const;                 // matched / spansA
    double precision() const;              // matched / spansB
    double f1() const;                     // 2 matched / (spansA + spansB)
    double meanAbsStartDiffSeconds() const;  // NaN when nothing matched
    double meanAbsEndDiffSeconds() const;
};

}  // namespace earmark::agreement
