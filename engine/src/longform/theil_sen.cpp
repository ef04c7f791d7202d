#include "earmark/longform/theil_sen.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <map>

namespace earmark {
namespace {

double median(std::vector<double> v) {
    const std::size_t n = v.size();
    std::nth_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(n / 2), v.end());
    const double hi = v[n / 2];
    if (n % 2) return hi;
    return 0.5 * (hi + *std::max_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(n / 2)));
}

// Inverse of the standard normal CDF (Acklam's rational approximation,
// relative error < 1.2e-9), enough for a confidence bound.
double normalQuantile(double p) {
    static const double a[] = {-3.969683028665376e+01, 2.209460984245205e+02, -2.759285104469687e+02,
                               1.383577518672690e+02, -3.066479806614716e+01, 2.506628277459239e+00};
    static const double b[] = {-5.447609879822406e+01, 1.615858368580409e+02, -1.556989798598866e+02,
                               6.680131188771972e+01, -1.328068155288572e+01};
    static const double c[] = {-7.784894002430293e-03, -3.223964580411365e-01, -2.400758277161838e+00,
                               -2.549732539343734e+00, 4.374664141464968e+00, 2.938163982698783e+00};
    static const double d[] = {7.784695709041462e-03, 3.224671290700398e-01, 2.445134137142996e+00,
                               3.754408661907416e+00};
    const double lowTail = 0.02425;
    if (p < lowTail) {
        const double q = std::sqrt(-2 * std::log(p));
        return (((((c[0] * q + c[1]) * q + c[2]) * q + c[3]) * q + c[4]) * q + c[5]) /
               ((((d[0] * q + d[1]) * q + d[2]) * q + d[3]) * q + 1);
    }
    if (p > 1 - lowTail) return -normalQuantile(1 - p);
    const double q = p - 0.5, r = q * q;
    return (((((a[0] * r + a[1]) * r + a[2]) * r + a[3]) * r + a[4]) * r + a[5]) * q /
           (((((b[0] * r + b[1]) * r + b[2]) * r + b[3]) * r + b[4]) * r + 1);
}

// Σ t(t−1)(2t+5) over groups of tied values.
double tieTerm(const std::vector<double>& v) {
    std::map<double, int> counts;
    for (double x : v) ++counts[x];
    double s = 0;
    for (const auto& [value, t] : counts) s += static_cast<double>(t) * (t - 1) * (2 * t + 5);
    return s;
}

}  // namespace

TrendFit theilSen(const std::vector<double>& xIn, const std::vector<double>& yIn, double confidence) {
    if (xIn.size() != yIn.size()) throw ParamError("theilSen.y", "must have as many values as x");
    if (!(confidence > 0 && confidence < 1)) throw ParamError("theilSen.confidence", "must be in (0, 1)");
    std::vector<double> x, y;
    for (std::size_t i = 0; i < xIn.size(); ++i)
        if (std::isfinite(xIn[i]) && std::isfinite(yIn[i])) {
            x.push_back(xIn[i]);
            y.push_back(yIn[i]);
        }
    TrendFit fit;
    fit.points = static_cast<int>(x.size());
    std::vector<double> slopes;
    for (std::size_t i = 0; i < x.size(); ++i)
        for (std::size_t j = i + 1; j < x.size(); ++j)
            if (x[j] != x[i]) slopes.push_back((y[j] - y[i]) / (x[j] - x[i]));
    if (slopes.empty()) return fit;
    fit.valid = true;
    std::sort(slopes.begin(), slopes.end());
    const std::size_t m = slopes.size();
    fit.slope = m % 2 ? slopes[m / 2] : 0.5 * (slopes[m / 2 - 1] + slopes[m / 2]);
    fit.intercept = median(y) - fit.slope * median(x);

    const double n = static_cast<double>(x.size());
    const double varS = (n * (n - 1) * (2 * n + 5) - tieTerm(x) - tieTerm(y)) / 18.0;
    const double z = normalQuantile(0.5 + confidence / 2);
    const double c = z * std::sqrt(std::max(0.0, varS));
    const double nm = static_cast<double>(m);
    // Sen's bounds are the M1-th and (M2 + 1)-th smallest slopes (1-based).
    const auto at = [&](double index) { return slopes[static_cast<std::size_t>(std::clamp(index, 0.0, nm - 1))]; };
    fit.slopeLow = at(std::round((nm - c) / 2) - 1);
    fit.slopeHigh = at(std::round((nm + c) / 2));
    return fit;
}

}  // namespace earmark
