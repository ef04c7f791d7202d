// Chance-corrected agreement of raters who sort units into nominal
// categories (codes 0, 1, 2 …; no order between them).
//
// A rating table holds one row per unit and one column per rater; a cell is
// the rater's category code, or empty when that rater did not rate the unit
// (missing). Units rated by fewer than two raters carry no information on
// agreement and are left out by every statistic below.
//
// Undefined results are NaN: when no unit is pairable, or when every rating
// falls in one category (expected agreement 1: kappa and alpha are 0/0).
// Pure functions; thread-safe. ParamError for a negative code or rows of
// different lengths.
#pragma once

#include <optional>
#include <vector>

namespace earmark::agreement {

using RatingTable = std::vector<std::vector<std::optional<int>>>;  // [unit][rater]

struct ChanceCorrected {
    double value = 0.0;     // kappa or alpha; NaN when undefined
    double observed = 0.0;  // observed agreement (kappa) or 1 − observed disagreement (alpha)
    double expected = 0.0;  // agreement expected by chance (kappa) or 1 − expected disagreement (alpha)
    int units = 0;          // units that entered the statistic
};

// Cohen's kappa of two raters over the units both rated:
// κ = (p_o − p_e) / (1 − p_e), p_o the share of units rated alike, p_e the sum
// over categories of the product of the two raters' own shares.
// Cohen, J. (1960). A coefficient of agreement for nominal scales.
// Educational and Psychological Measurement 20(1), 37–46.
ChanceCorrected cohenKappa(const std::vector<std::optional<int>>& raterA,
                           const std::vector<std::optional<int>>& raterB);

// Fleiss' kappa of any number of raters. With n ratings on every unit it is
// exactly Fleiss, J. L. (1971). Measuring nominal scale agreement among many
// raters. Psychological Bulletin 76(5), 378–382: P_i = Σ_j n_ij(n_ij − 1) /
// (n(n − 1)), P̄ = mean P_i, p_j = Σ_i n_ij / (N n), P̄_e = Σ_j p_j².
// With missing ratings each unit uses its own count n_i in P_i, and p_j is
// the share of all ratings (units with n_i ≥ 2 only) — the usual extension;
// prefer Krippendorff's alpha there, which is defined for missing data.
ChanceCorrected fleissKappa(const RatingTable& table);

// Krippendorff's alpha for nominal data, any number of raters, missing
// ratings allowed: α = 1 − D_o / D_e from the coincidence matrix, each unit's
// m_u(m_u − 1) ordered pairs of values weighted 1 / (m_u − 1).
// Krippendorff, K. (2011). Computing Krippendorff's alpha-reliability.
// Annenberg School for Communication Departmental Papers 43, University of
// Pennsylvania; Krippendorff, K. (2004). Content Analysis: An Introduction to
// Its Methodology, 2nd ed., Sage, ch. 11.
ChanceCorrected krippendorffAlphaNominal(const RatingTable& table);

}  // namespace earmark::agreement
