#include "earmark/dsp/autoregressive.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace earmark {

ArFitter::ArFitter(int order, std::size_t window)
    : order_(order), hann_(window), segment_(window), r_(static_cast<std::size_t>(order) + 1),
      tmp_(static_cast<std::size_t>(order) + 1) {
    if (order < 1) throw ParamError("ArFitter.order", "must be >= 1");
    if (window <= static_cast<std::size_t>(order)) throw ParamError("ArFitter.window", "must exceed the order");
    for (std::size_t i = 0; i < window; ++i)
        hann_[i] = 0.5 - 0.5 * std::cos(2.0 * std::numbers::pi * (static_cast<double>(i) + 0.5) /
                                        static_cast<double>(window));
}

double ArFitter::fit(const std::vector<float>& x, std::ptrdiff_t start, std::vector<double>& a) {
    const auto w = static_cast<std::ptrdiff_t>(segment_.size());
    const auto n = static_cast<std::ptrdiff_t>(x.size());
    for (std::ptrdiff_t i = 0; i < w; ++i) {
        const std::ptrdiff_t j = start + i;
        segment_[static_cast<std::size_t>(i)] = (j >= 0 && j < n) ? x[static_cast<std::size_t>(j)] * hann_[static_cast<std::size_t>(i)] : 0.0;
    }
    for (int k = 0; k <= order_; ++k) {
        double s = 0.0;
        for (std::ptrdiff_t i = k; i < w; ++i) s += segment_[static_cast<std::size_t>(i)] * segment_[static_cast<std::size_t>(i - k)];
        r_[static_cast<std::size_t>(k)] = s;
    }
    a.assign(static_cast<std::size_t>(order_) + 1, 0.0);
    a[0] = 1.0;
    // A small white-noise floor (−40 dB) keeps the recursion stable on
    // nearly silent or strictly band-limited stretches.
    double err = r_[0] * (1.0 + 1e-4);
    if (!(err > 1e-20)) return 0.0;
    for (int i = 1; i <= order_; ++i) {
        double acc = r_[static_cast<std::size_t>(i)];
        for (int k = 1; k < i; ++k) acc += a[static_cast<std::size_t>(k)] * r_[static_cast<std::size_t>(i - k)];
        const double reflection = -acc / err;
        std::copy(a.begin(), a.end(), tmp_.begin());
        for (int k = 1; k < i; ++k) a[static_cast<std::size_t>(k)] = tmp_[static_cast<std::size_t>(k)] + reflection * tmp_[static_cast<std::size_t>(i - k)];
        a[static_cast<std::size_t>(i)] = reflection;
        err *= 1.0 - reflection * reflection;
        if (!(err > 0)) break;
    }
    return std::max(err, 0.0) / static_cast<double>(w);
}

}  // namespace earmark
