// Autoregressive (linear prediction) fit of a Hann-windowed stretch by the
// autocorrelation method and the Levinson–Durbin recursion (J. Makhoul,
// "Linear prediction: a tutorial review", Proc. IEEE 63(4), 1975, pp. 561–580).
// Used by the click detector and by tests that reshape noise to a spectral
// envelope. Not thread-safe (one instance per thread); no allocation per fit.
#pragma once

#include <cstddef>
#include <vector>

namespace earmark {

class ArFitter {
public:
    // order >= 1, window > order samples; throws ParamError("ArFitter.order"/".window").
    ArFitter(int order, std::size_t window);
    // Coefficients a[0..order] (a[0] = 1) of the prediction-error filter
    // e[n] = sum_k a[k] x[n−k] fitted on x[start, start + window) (zero
    // outside the signal). A silent stretch gives a = (1, 0, …, 0). A −40 dB
    // white-noise floor keeps the recursion stable. Returns the prediction
    // error power of the windowed stretch (per sample of the window).
    double fit(const std::vector<float>& x, std::ptrdiff_t start, std::vector<double>& a);
    int order() const { return order_; }

private:
    int order_;
    std::vector<double> hann_, segment_, r_, tmp_;
};

}  // namespace earmark
