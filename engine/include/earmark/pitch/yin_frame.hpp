// Frame-level building blocks of YIN (de Cheveigné & Kawahara, JASA 111(4),
// 2002), used by analysePitch and exposed so tests can check each step on
// its own against the paper's definitions.
//
// Units: lags are in samples at the analysis rate; the normalised difference
// d′ is dimensionless (0 = perfectly periodic at that lag, about 1 = noise).
#pragma once

#include "earmark/dsp/fft.hpp"

#include <complex>
#include <span>
#include <vector>

namespace earmark {

// The lag range and frame geometry implied by an F0 range at one sample rate.
struct YinGeometry {
    int minLag = 0;      // shortest lag searched: floor(rate / maxF0), at least 2
    int maxLag = 0;      // longest lag searched: ceil(rate / minF0) + 1 (one lag of margin
                         // so a dip at exactly 1/minF0 is still an interior minimum)
    int window = 0;      // integration window W = maxLag: one longest period
    int span = 0;        // samples one frame reads: W + maxLag + 1 (lags up to maxLag + 1
                         // are computed so the parabola at maxLag has a right neighbour)
    int fftSize = 0;     // smallest 2^k, 3·2^k or 5·2^k >= span (fast FFTW sizes); >= span,
                         // so the circular correlation never wraps

    // Throws ParamError if the F0 range is empty or does not fit the rate.
    static YinGeometry forRange(double sampleRate, double minF0Hz, double maxF0Hz);
};

// One dip of the normalised difference function.
struct YinDip {
    float lag = 0.0f;           // interpolated lag in samples (step 5); 0 = none
    float aperiodicity = 1.0f;  // d′ at the interpolated minimum (>= 0; can exceed 1 in noise)
};

// Steps 2 and 3 for one frame, with buffers made once so frames allocate nothing.
// An instance is not thread-safe (use one per thread); separate instances may
// run concurrently (RealFft's plans are shared safely).
class YinFrame {
public:
    explicit YinFrame(const YinGeometry& geometry);

    const YinGeometry& geometry() const { return geometry_; }

    int lags() const { return geometry_.maxLag + 2; }  // values per output: τ = 0 … maxLag+1

    // Steps 2 and 3 for one frame: frame.size() must be geometry().span and
    // both outputs lags() long (throws ParamError otherwise).
    // Step 2: difference[τ] = d(τ) = Σ_{j<W} (x_j − x_{j+τ})² (>= 0), expanded
    // as r(0) + shifted energy − 2·r(τ); the cross term r(τ) comes from one FFT
    // correlation, the energy terms from a running sum.
    // Step 3: normalised[τ] = d′(τ): d′(0) = 1, d′(τ) = d(τ) / ((1/τ)·Σ_{k=1..τ} d(k)),
    // and 1 where that mean is 0 (digital silence).
    void compute(std::span<const float> frame, std::span<float> difference, std::span<float> normalised);

    double sumOfSquares() const { return sumOfSquares_; }  // of the last frame, over its whole span

private:
    YinGeometry geometry_;
    RealFft fft_;
    std::vector<std::complex<float>> frameSpectrum_;
    std::vector<float> centred_;  // the frame minus its mean
    double sumOfSquares_ = 0.0;
};

// Step 5: parabolic interpolation through (τ−1, τ, τ+1). The abscissa comes
// from the raw difference d (the cumulative normalisation of d′ tilts the
// dip and so biases the abscissa); the ordinate from d′. Needs 1 <= lag and
// lag + 1 < size.
YinDip interpolateDip(std::span<const float> difference, std::span<const float> normalised, int lag);

// Step 4 within [lo, hi]: the smallest lag whose dip goes below `threshold`
// (following the dip down to its local minimum), else the lag of the global
// minimum of d′ in [lo, hi]; then step 5 on it. Needs 1 <= lo <= hi < size − 1.
YinDip pickDip(std::span<const float> difference, std::span<const float> normalised, int lo, int hi,
               float threshold);

// The `out.size()` (at most 8) deepest local minima of d′ in [lo, hi] (d′(τ) < d′(τ−1) and
// d′(τ) <= d′(τ+1)), interpolated, deepest first; returns how many were found.
// Dips within 1.5 lags of `exclude` (an already chosen dip) are skipped.
int deepestDips(std::span<const float> difference, std::span<const float> normalised, int lo, int hi,
                float exclude, std::span<YinDip> out);

// Whether the frame repeats at a lag shorter than the search range: a local
// minimum of d′ in [2, minLag) below `threshold` — its F0 lies above the
// range, and every dip in range is a subharmonic of it (a 1 kHz tone searched
// up to 500 Hz dips at 2 ms), so the frame has no F0 in range.
bool periodicBelowLag(std::span<const float> normalised, int minLag, float threshold);

// Earmark's timing refinement (yin.hpp, step 5): d(τ) summed over `window`
// pairs whose region [s, s + window + τ) is centred on `centre` (a sample
// index into `signal`), for τ = round(lag) and its neighbours, walking
// downhill at most max(2, 20 % of the lag) lags, then step 5's parabola on
// those values. Returns `lag` unchanged if the region would leave `signal`,
// if the walk finds no minimum, or if lag < 4.
float refineLagCentred(std::span<const float> signal, double centre, int window, float lag);

}  // namespace earmark
