#include "earmark/listening/hypothesis_tests.hpp"

#include "earmark/core/error.hpp"
#include "earmark/core/numeric.hpp"
#include "earmark/listening/distributions.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

namespace earmark::listening {
namespace {

TestResult undefinedTest(int n, std::string why) {
    TestResult r;
    r.n = n;
    r.p = kNaN;
    r.statistic = kNaN;
    r.effect = kNaN;
    r.why = std::move(why);
    return r;
}

// Exact null distribution of R+ for n untied non-zero differences: the number
// of subsets of {1..n} with each sum, divided by 2^n.
std::vector<double> signedRankDistribution(int n) {
    const int total = n * (n + 1) / 2;
    std::vector<double> counts(static_cast<std::size_t>(total) + 1, 0.0);
    counts[0] = 1.0;
    for (int r = 1; r <= n; ++r)
        for (int s = total; s >= r; --s) counts[s] += counts[s - r];
    const double scale = std::ldexp(1.0, -n);
    for (double& c : counts) c *= scale;
    return counts;
}

}  // namespace

MeanInterval meanInterval(const std::vector<double>& values, double alpha) {
    if (!(alpha > 0 && alpha < 1)) throw ParamError("meanInterval.alpha", "must be in (0, 1)");
    MeanInterval m;
    m.n = static_cast<int>(values.size());
    m.mean = m.sd = m.low = m.high = kNaN;
    if (m.n == 0) return m;
    m.mean = std::accumulate(values.begin(), values.end(), 0.0) / m.n;
    if (m.n < 2) return m;
    double ss = 0;
    for (double v : values) ss += (v - m.mean) * (v - m.mean);
    m.sd = std::sqrt(ss / (m.n - 1));
    const double half = studentTQuantile(1.0 - alpha / 2, m.n - 1.0) * m.sd / std::sqrt(double(m.n));
    m.low = m.mean - half;
    m.high = m.mean + half;
    return m;
}

TestResult pairedT(const std::vector<double>& d) {
    const MeanInterval m = meanInterval(d);
    if (m.n < 2) return undefinedTest(m.n, "fewer than 2 pairs");
    if (m.sd == 0) return undefinedTest(m.n, "all differences are equal");
    TestResult r;
    r.defined = true;
    r.n = m.n;
    r.method = "t";
    r.statistic = m.mean / (m.sd / std::sqrt(double(m.n)));
    r.p = std::min(1.0, 2.0 * studentTSf(std::fabs(r.statistic), m.n - 1.0));
    r.effect = m.mean / m.sd;
    return r;
}

std::vector<double> averageRanks(const std::vector<double>& values) {
    std::vector<std::size_t> order(values.size());
    std::iota(order.begin(), order.end(), 0);
    std::stable_sort(order.begin(), order.end(), [&](auto a, auto b) { return values[a] < values[b]; });
    std::vector<double> ranks(values.size());
    for (std::size_t i = 0; i < order.size();) {
        std::size_t j = i;
        while (j + 1 < order.size() && values[order[j + 1]] == values[order[i]]) ++j;
        const double rank = 0.5 * static_cast<double>(i + j) + 1.0;
        for (std::size_t k = i; k <= j; ++k) ranks[order[k]] = rank;
        i = j + 1;
    }
    return ranks;
}

TestResult wilcoxonSignedRank(const std::vector<double>& differences) {
    std::vector<double> d;
    for (double x : differences)
        if (x != 0) d.push_back(x);
    const int n = static_cast<int>(d.size());
    if (n == 0) return undefinedTest(0, "all differences are zero");
    std::vector<double> magnitude(d.size());
    std::transform(d.begin(), d.end(), magnitude.begin(), [](double x) { return std::fabs(x); });
    const std::vector<double> rank = averageRanks(magnitude);
    double rPlus = 0, rMinus = 0;
    for (int i = 0; i < n; ++i) (d[i] > 0 ? rPlus : rMinus) += rank[i];
    std::vector<double> sorted = rank;
    std::sort(sorted.begin(), sorted.end());
    const bool ties = std::adjacent_find(sorted.begin(), sorted.end()) != sorted.end();
    TestResult r;
    r.defined = true;
    r.n = n;
    r.statistic = std::min(rPlus, rMinus);
    r.effect = (rPlus - rMinus) / (rPlus + rMinus);
    if (n <= 50 && !ties) {
        r.method = "exact";
        const std::vector<double> pmf = signedRankDistribution(n);
        const auto k = static_cast<std::size_t>(rPlus);
        double below = 0, above = 0;
        for (std::size_t s = 0; s < pmf.size(); ++s) {
            if (s <= k) below += pmf[s];
            if (s >= k) above += pmf[s];
        }
        r.p = std::min(1.0, 2.0 * std::min(below, above));
        return r;
    }
    r.method = "approx";
    const double mean = n * (n + 1.0) / 4.0;
    double var = n * (n + 1.0) * (2.0 * n + 1.0);
    for (std::size_t i = 0; i < sorted.size();) {
        std::size_t j = i;
        while (j < sorted.size() && sorted[j] == sorted[i]) ++j;
        const double t = static_cast<double>(j - i);
        if (t > 1) var -= 0.5 * t * (t * t - 1.0);
        i = j;
    }
    const double z = (r.statistic - mean) / std::sqrt(var / 24.0);
    r.p = std::min(1.0, 2.0 * normalSf(std::fabs(z)));
    return r;
}

BinomialResult binomialTest(int k, int n, double nullP, double alpha) {
    if (!(nullP >= 0 && nullP <= 1)) throw ParamError("binomialTest.nullP", "must be in [0, 1]");
    if (!(alpha > 0 && alpha < 1)) throw ParamError("binomialTest.alpha", "must be in (0, 1)");
    if (n < 0 || k < 0 || k > n) throw ParamError("binomialTest.successes", "must be in [0, trials]");
    BinomialResult r;
    r.successes = k;
    r.trials = n;
    if (n == 0) {
        r.share = r.p = r.low = r.high = kNaN;
        return r;
    }
    r.share = static_cast<double>(k) / n;
    const double seen = binomialPmf(k, n, nullP) * (1.0 + 1e-7);
    double p = 0;
    for (int i = 0; i <= n; ++i) {
        const double pi = binomialPmf(i, n, nullP);
        if (pi <= seen) p += pi;
    }
    r.p = std::min(1.0, p);
    r.low = k == 0 ? 0.0 : incompleteBetaInverse(k, n - k + 1.0, alpha / 2);
    r.high = k == n ? 1.0 : incompleteBetaInverse(k + 1.0, n - k, 1.0 - alpha / 2);
    return r;
}

std::vector<double> holmAdjust(const std::vector<double>& p) {
    std::vector<std::size_t> order;
    for (std::size_t i = 0; i < p.size(); ++i) {
        if (std::isnan(p[i])) continue;
        if (!(p[i] >= 0 && p[i] <= 1)) throw ParamError("holmAdjust", "p-values must be in [0, 1]");
        order.push_back(i);
    }
    std::stable_sort(order.begin(), order.end(), [&](auto a, auto b) { return p[a] < p[b]; });
    std::vector<double> out(p.size(), kNaN);
    const double m = static_cast<double>(order.size());
    double running = 0;
    for (std::size_t j = 0; j < order.size(); ++j) {
        running = std::max(running, std::min(1.0, (m - static_cast<double>(j)) * p[order[j]]));
        out[order[j]] = running;
    }
    return out;
}

}  // namespace earmark::listening
