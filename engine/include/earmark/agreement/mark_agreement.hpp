// Agreement between raters who marked the same takes (docs/agreement.md).
//
// Input: the marks of a session and, per take, the raters who reviewed it.
// A rater reviewed a take when they made a mark on it or recorded a review
// status for it; the caller supplies the latter (Session::reviewers), and
// the raters of the marks are added here. Only takes with two or more
// reviewers are compared. Marks without a rater are left out (counted).
//
// Categorical units: one unit per (compared take, mark category). A rater who
// reviewed the take rates the unit "present" when they made at least one
// mark of that category on it, else "absent"; a rater who did not review
// the take has no rating for it (missing). Per category the units are the
// compared takes; "overall" pools the units of all categories. On these
// units: Cohen's kappa per rater pair (units both rated), Fleiss' kappa and
// Krippendorff's alpha (nominal) over all raters (earmark/agreement/nominal.hpp).
//
// Temporal: per rater pair, on every take both reviewed, the pair's marks of
// one category are matched by span (earmark/agreement/span_matching.hpp);
// "overall" sums the per-category counts, so a match always needs the same
// category.
// Pure function; thread-safe. ParamError for a negative tolerance.
#pragma once

#include "earmark/agreement/nominal.hpp"
#include "earmark/agreement/span_matching.hpp"
#include "earmark/marks/mark.hpp"

#include <map>
#include <optional>
#include <set>
#include <string>
#include <vector>

namespace earmark::agreement {

struct AgreementParams {
    double toleranceSeconds = 0.25;  // largest gap between two spans that still match (seconds)
};

struct PairAgreement {
    std::string raterA, raterB;  // raterA < raterB (byte order); A is the reference of recall
    int takes = 0;               // compared takes both reviewed
    ChanceCorrected cohen;
    SpanTally spans;
};

struct CategoryAgreement {
    std::optional<MarkCategory> category;  // empty: overall
    ChanceCorrected fleiss;
    ChanceCorrected alpha;
    std::vector<PairAgreement> pairs;  // every pair of raters, in order of (raterA, raterB)
};

struct AgreementReport {
    double toleranceSeconds = 0.0;
    std::vector<std::string> raters;  // sorted
    std::vector<TakeId> takes;        // compared takes, ascending id
    int marksCompared = 0;            // marks on compared takes
    int marksWithoutRater = 0;        // left out
    std::vector<CategoryAgreement> rows;  // overall first, then each category in allMarkCategories() order
};

using ReviewersByTake = std::map<TakeId, std::set<std::string>>;

AgreementReport markAgreement(const std::vector<Mark>& marks, const ReviewersByTake& reviewers,
                              const AgreementParams& params = {});

}  // namespace earmark::agreement
