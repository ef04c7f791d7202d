// Probability distributions used by the listening-test statistics: the
// regularised incomplete beta function and what is built on it (Student's t,
// the beta quantile for exact binomial intervals), the standard normal, and
// the binomial probability mass.
//
// The incomplete beta is evaluated by its continued fraction (Abramowitz &
// Stegun 1964, "Handbook of Mathematical Functions", formula 26.5.8), using
// the symmetry I_x(a, b) = 1 − I_{1−x}(b, a) where the fraction converges
// slowly. Quantiles are found by bisection to the last representable bit, so
// they are exact inverses of the CDFs here. Accuracy: about 1e-13 relative
// for the degrees of freedom and counts of listening tests (checked against
// scipy in tests/engine/listening).
//
// All functions are pure and thread-safe. Arguments outside the domain
// (a ≤ 0, x ∉ [0, 1], ν ≤ 0, p ∉ [0, 1]) throw ParamError naming the
// function.
#pragma once

namespace earmark::listening {

// I_x(a, b), the regularised incomplete beta function; a, b > 0, 0 ≤ x ≤ 1.
double incompleteBeta(double a, double b, double x);
// The x with I_x(a, b) = p; p in [0, 1].
double incompleteBetaInverse(double a, double b, double p);

// Student's t with ν > 0 degrees of freedom: CDF, survival 1 − CDF (computed
// directly, so small tails keep their precision) and quantile (p in (0, 1)).
double studentTCdf(double t, double nu);
double studentTSf(double t, double nu);
double studentTQuantile(double p, double nu);

// The standard normal: CDF and survival, via erfc.
double normalCdf(double z);
double normalSf(double z);

// P(K = k) for K ~ Binomial(n, p); 0 for k outside [0, n]. n ≥ 0, p in [0, 1].
double binomialPmf(int k, int n, double p);

}  // namespace earmark::listening
