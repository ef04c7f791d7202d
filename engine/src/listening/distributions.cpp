#include "earmark/listening/distributions.hpp"

#include "earmark/core/error.hpp"

#include <cmath>
#include <limits>

namespace earmark::listening {
namespace {

// Continued fraction of I_x(a, b) (A&S 26.5.8) by the modified Lentz method;
// converges fast for x < (a + 1) / (a + b + 2).
double betaFraction(double a, double b, double x) {
    constexpr double kTiny = 1e-300;
    constexpr double kEps = 1e-16;
    double c = 1.0;
    double d = 1.0 - (a + b) * x / (a + 1.0);
    if (std::fabs(d) < kTiny) d = kTiny;
    d = 1.0 / d;
    double h = d;
    for (int m = 1; m <= 10000; ++m) {
        const double m2 = 2.0 * m;
        // Even step: d_{2m} = m (b − m) x / ((a + 2m − 1)(a + 2m)).
        double num = m * (b - m) * x / ((a + m2 - 1.0) * (a + m2));
        d = 1.0 + num * d;
        if (std::fabs(d) < kTiny) d = kTiny;
        c = 1.0 + num / c;
        if (std::fabs(c) < kTiny) c = kTiny;
        d = 1.0 / d;
        h *= d * c;
        // Odd step: d_{2m+1} = −(a + m)(a + b + m) x / ((a + 2m)(a + 2m + 1)).
        num = -(a + m) * (a + b + m) * x / ((a + m2) * (a + m2 + 1.0));
        d = 1.0 + num * d;
        if (std::fabs(d) < kTiny) d = kTiny;
        c = 1.0 + num / c;
        if (std::fabs(c) < kTiny) c = kTiny;
        d = 1.0 / d;
        const double delta = d * c;
        h *= delta;
        if (std::fabs(delta - 1.0) < kEps) break;
    }
    return h;
}

// x^a (1 − x)^b / (a B(a, b)), the factor in front of the fraction.
double betaFront(double a, double b, double x) {
    const double logBeta = std::lgamma(a) + std::lgamma(b) - std::lgamma(a + b);
    return std::exp(a * std::log(x) + b * std::log1p(-x) - logBeta) / a;
}

// Bisection of an increasing function on [lo, hi] for f(x) = target, down to
// adjacent doubles.
template <class F>
double bisect(F f, double target, double lo, double hi) {
    for (int i = 0; i < 2000; ++i) {
        const double mid = 0.5 * (lo + hi);
        if (mid <= lo || mid >= hi) break;
        (f(mid) < target ? lo : hi) = mid;
    }
    return 0.5 * (lo + hi);
}

}  // namespace

double incompleteBeta(double a, double b, double x) {
    if (!(a > 0) || !(b > 0) || !std::isfinite(a) || !std::isfinite(b))
        throw ParamError("incompleteBeta", "needs a > 0 and b > 0");
    if (!(x >= 0.0 && x <= 1.0)) throw ParamError("incompleteBeta", "needs 0 <= x <= 1");
    if (x == 0.0) return 0.0;
    if (x == 1.0) return 1.0;
    if (x < (a + 1.0) / (a + b + 2.0)) return betaFront(a, b, x) * betaFraction(a, b, x);
    return 1.0 - betaFront(b, a, 1.0 - x) * betaFraction(b, a, 1.0 - x);
}

double incompleteBetaInverse(double a, double b, double p) {
    if (!(p >= 0.0 && p <= 1.0)) throw ParamError("incompleteBetaInverse", "needs 0 <= p <= 1");
    if (p == 0.0) return 0.0;
    if (p == 1.0) return 1.0;
    return bisect([&](double x) { return incompleteBeta(a, b, x); }, p, 0.0, 1.0);
}

double studentTSf(double t, double nu) {
    if (!(nu > 0)) throw ParamError("studentT", "needs nu > 0 degrees of freedom");
    if (std::isnan(t)) return t;
    if (std::isinf(t)) return t > 0 ? 0.0 : 1.0;
    // P(T > |t|) = I_{ν/(ν+t²)}(ν/2, 1/2) / 2.
    const double tail = 0.5 * incompleteBeta(0.5 * nu, 0.5, nu / (nu + t * t));
    return t >= 0 ? tail : 1.0 - tail;
}

double studentTCdf(double t, double nu) {
    if (std::isnan(t)) return t;
    return studentTSf(-t, nu);
}

double studentTQuantile(double p, double nu) {
    if (!(p > 0.0 && p < 1.0)) throw ParamError("studentTQuantile", "needs 0 < p < 1");
    if (!(nu > 0)) throw ParamError("studentT", "needs nu > 0 degrees of freedom");
    if (p == 0.5) return 0.0;
    // Solve on the upper half, where the survival keeps full precision.
    const double q = p > 0.5 ? 1.0 - p : p;  // upper-tail probability of |t|
    double hi = 1.0;
    while (studentTSf(hi, nu) > q) hi *= 2.0;
    const double t = bisect([&](double x) { return -studentTSf(x, nu); }, -q, 0.0, hi);
    return p > 0.5 ? t : -t;
}

double normalCdf(double z) { return 0.5 * std::erfc(-z / std::sqrt(2.0)); }
double normalSf(double z) { return 0.5 * std::erfc(z / std::sqrt(2.0)); }

double binomialPmf(int k, int n, double p) {
    if (n < 0 || !(p >= 0.0 && p <= 1.0)) throw ParamError("binomialPmf", "needs n >= 0 and 0 <= p <= 1");
    if (k < 0 || k > n) return 0.0;
    if (p == 0.0) return k == 0 ? 1.0 : 0.0;
    if (p == 1.0) return k == n ? 1.0 : 0.0;
    const double logChoose = std::lgamma(n + 1.0) - std::lgamma(k + 1.0) - std::lgamma(n - k + 1.0);
    return std::exp(logChoose + k * std::log(p) + (n - k) * std::log1p(-p));
}

}  // namespace earmark::listening
