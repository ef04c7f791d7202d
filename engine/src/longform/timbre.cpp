#include "earmark/longform/timbre.hpp"

#include <cmath>
#include <limits>
#include <utility>

namespace earmark {
namespace {

// Inverse of a symmetric positive-definite matrix by Gauss–Jordan elimination
// with partial pivoting; empty when singular.
std::vector<double> invert(std::vector<double> a, int n) {
    std::vector<double> inv(static_cast<std::size_t>(n) * n, 0.0);
    for (int i = 0; i < n; ++i) inv[i * n + i] = 1.0;
    for (int c = 0; c < n; ++c) {
        int pivot = c;
        for (int r = c + 1; r < n; ++r)
            if (std::fabs(a[r * n + c]) > std::fabs(a[pivot * n + c])) pivot = r;
        if (!(std::fabs(a[pivot * n + c]) > 1e-300)) return {};
        if (pivot != c)
            for (int k = 0; k < n; ++k) {
                std::swap(a[c * n + k], a[pivot * n + k]);
                std::swap(inv[c * n + k], inv[pivot * n + k]);
            }
        const double d = a[c * n + c];
        for (int k = 0; k < n; ++k) {
            a[c * n + k] /= d;
            inv[c * n + k] /= d;
        }
        for (int r = 0; r < n; ++r) {
            if (r == c) continue;
            const double f = a[r * n + c];
            if (f == 0.0) continue;
            for (int k = 0; k < n; ++k) {
                a[r * n + k] -= f * a[c * n + k];
                inv[r * n + k] -= f * inv[c * n + k];
            }
        }
    }
    return inv;
}

// tr(A·B) for symmetric A and B.
double traceOfProduct(const std::vector<double>& a, const std::vector<double>& b) {
    double t = 0;
    for (std::size_t i = 0; i < a.size(); ++i) t += a[i] * b[i];
    return t;
}

}  // namespace

TimbreAccumulator::TimbreAccumulator(int dims)
    : dims_(dims), sum_(static_cast<std::size_t>(dims), 0.0), outer_(static_cast<std::size_t>(dims) * dims, 0.0) {}

void TimbreAccumulator::add(const float* v) {
    ++frames_;
    for (int i = 0; i < dims_; ++i) {
        sum_[i] += v[i];
        for (int j = i; j < dims_; ++j) outer_[i * dims_ + j] += static_cast<double>(v[i]) * v[j];
    }
}

void TimbreAccumulator::add(const TimbreAccumulator& other) {
    frames_ += other.frames_;
    for (std::size_t i = 0; i < sum_.size(); ++i) sum_[i] += other.sum_[i];
    for (std::size_t i = 0; i < outer_.size(); ++i) outer_[i] += other.outer_[i];
}

TimbreModel TimbreModel::fit(const TimbreAccumulator& acc, double ridge) {
    TimbreModel m;
    const int d = acc.dims_;
    m.dims = d;
    m.frames = acc.frames_;
    if (acc.frames_ <= d) return m;
    const double n = static_cast<double>(acc.frames_);
    m.mean.resize(d);
    for (int i = 0; i < d; ++i) m.mean[i] = acc.sum_[i] / n;
    m.cov.assign(static_cast<std::size_t>(d) * d, 0.0);
    double meanVariance = 0;
    for (int i = 0; i < d; ++i)
        for (int j = i; j < d; ++j) {
            const double c = (acc.outer_[i * d + j] - n * m.mean[i] * m.mean[j]) / (n - 1);
            m.cov[i * d + j] = m.cov[j * d + i] = c;
            if (i == j) meanVariance += c / d;
        }
    const double add = ridge * std::max(meanVariance, 1e-12);
    for (int i = 0; i < d; ++i) m.cov[i * d + i] += add;
    m.inverse = invert(m.cov, d);
    return m;
}

double symmetricKl(const TimbreModel& a, const TimbreModel& b) {
    if (!a.valid() || !b.valid() || a.dims != b.dims) return std::numeric_limits<double>::quiet_NaN();
    const int d = a.dims;
    double quad = 0;
    for (int i = 0; i < d; ++i)
        for (int j = 0; j < d; ++j)
            quad += (a.mean[i] - b.mean[i]) * (a.inverse[i * d + j] + b.inverse[i * d + j]) * (a.mean[j] - b.mean[j]);
    return 0.5 * (traceOfProduct(b.inverse, a.cov) + traceOfProduct(a.inverse, b.cov) - 2.0 * d + quad);
}

}  // namespace earmark
