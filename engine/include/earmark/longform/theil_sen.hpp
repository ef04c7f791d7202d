// A robust straight-line fit: the Theil–Sen estimator (H. Theil, "A
// rank-invariant method of linear and polynomial regression analysis",
// Indagationes Mathematicae 12, 1950, 85–91; P. K. Sen, "Estimates of the
// regression coefficient based on Kendall's tau", JASA 63(324), 1968,
// 1379–1389).
//
// slope = median of the pairwise slopes (y_j − y_i)/(x_j − x_i) over pairs
// with x_i ≠ x_j; intercept = median(y) − slope·median(x) (as
// scipy.stats.theilslopes does by default). The confidence interval of the
// slope is Sen's: with N pairwise slopes sorted and the variance of
// Kendall's S (ties in x and y corrected), C = z·sqrt(var S), the bounds are
// the M1-th and (M2 + 1)-th smallest slopes, M1 = round((N − C)/2),
// M2 = round((N + C)/2) (clamped to the list).
//
// Cost: O(n²) time and memory in the number of points (n is a number of
// windows, a few hundred for an hour). Thread-safety: pure function.
#pragma once

#include <vector>

namespace earmark {

struct TrendFit {
    bool valid = false;     // false with fewer than 2 distinct x
    int points = 0;
    double slope = 0.0;     // y units per x unit
    double intercept = 0.0;
    double slopeLow = 0.0;  // confidence bounds of the slope
    double slopeHigh = 0.0;
    // True when the interval excludes zero.
    bool significant() const { return valid && (slopeLow > 0.0 || slopeHigh < 0.0); }
};

// x and y of equal length (else ParamError("theilSen.y")); non-finite pairs are
// skipped. `confidence` in (0, 1) (else ParamError("theilSen.confidence")).
TrendFit theilSen(const std::vector<double>& x, const std::vector<double>& y, double confidence = 0.95);

}  // namespace earmark
