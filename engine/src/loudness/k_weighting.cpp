#include "earmark/core/error.hpp"
#include "earmark/loudness/bs1770.hpp"

#include <cmath>
#include <numbers>
#include <string>

namespace earmark {

namespace {

// Analogue prototypes of the two K-weighting stages. The values come from
// inverting the bilinear transform on the BS.1770-4 48 kHz tables (done once
// offline): with p = K², q = K/Q and a0 = 1 + q + p, the table's denominator
// gives a0 = 4 / (1 − a1 + a2), p = (1 + a1 + a2) / (1 − a1 + a2) and
// q = a0 (1 − a2) / 2; the shelf numerator then gives the high-frequency gain
// Vh = a0 (b0 − b1 + b2) / 4 and the mid gain Vb = a0 (b0 − b2) / (2q).
// The forward design below is checked against the tables in the tests.
constexpr double kShelfF0Hz = 1681.974450955533;
constexpr double kShelfQ = 0.7071752369554196;
constexpr double kShelfHighGain = 1.584864701130855;  // Vh: +3.99984 dB above the shelf
constexpr double kShelfMidGain = 1.258720930232562;   // Vb: gain of the s¹ term (≈ √Vh)
constexpr double kHighPassF0Hz = 38.13547087602444;
constexpr double kHighPassQ = 0.5003270373238773;

// Bilinear transform of H(s) = (hi·s² + mid·(s/Q) + lo) / (s² + s/Q + 1), with s
// normalised to the prewarped centre, i.e. s → (1/K)(1 − z⁻¹)/(1 + z⁻¹).
Biquad secondOrderSection(double f0Hz, double q, double hi, double mid, double lo, double rate) {
    const double k = std::tan(std::numbers::pi * f0Hz / rate);
    const double kk = k * k;
    const double a0 = 1.0 + k / q + kk;
    Biquad s;
    s.b0 = (hi + mid * k / q + lo * kk) / a0;
    s.b1 = 2.0 * (lo * kk - hi) / a0;
    s.b2 = (hi - mid * k / q + lo * kk) / a0;
    s.a1 = 2.0 * (kk - 1.0) / a0;
    s.a2 = (1.0 - k / q + kk) / a0;
    return s;
}

}  // namespace

KWeighting kWeighting(double sampleRate) {
    if (!(sampleRate >= kMinKWeightingRateHz) || !std::isfinite(sampleRate))
        throw ParamError("kWeighting.sampleRate",
                         "must be at least " + std::to_string(kMinKWeightingRateHz) + " Hz and finite");
    KWeighting w;
    w.shelf = secondOrderSection(kShelfF0Hz, kShelfQ, kShelfHighGain, kShelfMidGain, 1.0, sampleRate);
    // RLB high-pass H(s) = s² / (s² + s/Q + 1). The BS.1770-4 table leaves its
    // numerator at [1, −2, 1] instead of dividing by a0; keep that at every rate.
    const double k = std::tan(std::numbers::pi * kHighPassF0Hz / sampleRate);
    const double a0 = 1.0 + k / kHighPassQ + k * k;
    w.highPass = secondOrderSection(kHighPassF0Hz, kHighPassQ, a0, 0.0, 0.0, sampleRate);
    return w;
}

}  // namespace earmark
