// Summary statistics and hypothesis tests for listening tests.
//
// - meanInterval: mean ± t(1 − α/2, n − 1) · s / √n (Student 1908).
// - pairedT: the paired (one-sample) t test, two-sided.
// - wilcoxonSignedRank: Wilcoxon (1945, Biometrics Bulletin 1:80–83), two-
//   sided, zero differences dropped (Wilcoxon's own treatment). Exact null
//   distribution when 1 ≤ n ≤ 50 and no |difference| is tied; otherwise the
//   normal approximation with the tie correction of the variance and no
//   continuity correction (the same as scipy.stats.wilcoxon with
//   zero_method="wilcox", correction=False and method "exact" or "approx").
// - binomialTest: exact two-sided binomial test; the p-value sums the
//   probabilities of all outcomes no more likely than the one seen (with a
//   relative tolerance of 1e-7, as scipy.stats.binomtest), and the Clopper &
//   Pearson (1934, Biometrika 26:404–413) exact interval.
// - holmAdjust: Holm (1979, Scand. J. Statist. 6:65–70) step-down adjusted
//   p-values, controlling the family-wise error rate.
//
// All functions are pure and thread-safe. A result that is undefined (too few
// values, no spread) has `defined == false` and a `why`; nothing throws for
// such data. ParamError for alpha outside (0, 1) or p outside [0, 1].
#pragma once

#include <string>
#include <vector>

namespace earmark::listening {

struct MeanInterval {
    int n = 0;
    double mean = 0;        // NaN when n == 0
    double sd = 0;          // sample standard deviation (n − 1); NaN when n < 2
    double low = 0, high = 0;  // NaN when n < 2
};
MeanInterval meanInterval(const std::vector<double>& values, double alpha = 0.05);

struct TestResult {
    bool defined = false;
    std::string why;          // when not defined
    int n = 0;                // values used (after dropping zeros for Wilcoxon)
    double statistic = 0;     // t, or Wilcoxon's T = min(R+, R−)
    double p = 1;             // two-sided
    std::string method;       // "t", "exact", "approx"
    double effect = 0;        // t: Cohen's d_z = mean / sd; Wilcoxon: rank-biserial (R+ − R−)/(R+ + R−)
};
TestResult pairedT(const std::vector<double>& differences);
TestResult wilcoxonSignedRank(const std::vector<double>& differences);

struct BinomialResult {
    int successes = 0, trials = 0;
    double share = 0;         // successes / trials (NaN when trials == 0)
    double p = 1;             // two-sided, against `nullP`
    double low = 0, high = 1; // Clopper–Pearson interval at 1 − alpha
};
BinomialResult binomialTest(int successes, int trials, double nullP = 0.5, double alpha = 0.05);

// Adjusted p-values in the order given; entries that are NaN are left out of
// the family and stay NaN.
std::vector<double> holmAdjust(const std::vector<double>& p);

// Average ranks (1-based) of the values, ties sharing the mean of their ranks.
std::vector<double> averageRanks(const std::vector<double>& values);

}  // namespace earmark::listening
