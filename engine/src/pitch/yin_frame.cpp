#include "earmark/pitch/yin_frame.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <string>

namespace earmark {

namespace {

// The smallest 2^k, 3·2^k or 5·2^k >= n: with FFTW's estimated plans these
// run 2–3x faster than nearby sizes with larger odd factors (measured: 640
// takes 0.57 µs per forward + inverse pair, 540 takes 1.33 µs).
int fastFftSizeAtLeast(int n) {
    int best = 0;
    for (int odd : {1, 3, 5}) {
        int m = odd * 2;
        while (m < n) m *= 2;
        if (best == 0 || m < best) best = m;
    }
    return best;
}

}  // namespace

YinGeometry YinGeometry::forRange(double sampleRate, double minF0Hz, double maxF0Hz) {
    if (!(sampleRate > 0) || !std::isfinite(sampleRate))
        throw ParamError("YinGeometry.sampleRate", "must be positive and finite");
    if (!(minF0Hz > 0)) throw ParamError("YinGeometry.minF0Hz", "must be positive");
    if (!(maxF0Hz > minF0Hz) || !std::isfinite(maxF0Hz))
        throw ParamError("YinGeometry.maxF0Hz", "must be finite and above minF0Hz");
    if (maxF0Hz > sampleRate / 4)
        throw ParamError("YinGeometry.maxF0Hz", "must be at most a quarter of the sample rate");
    YinGeometry g;
    g.minLag = std::max(2, static_cast<int>(std::floor(sampleRate / maxF0Hz)));
    g.maxLag = static_cast<int>(std::ceil(sampleRate / minF0Hz)) + 1;
    if (g.maxLag > 1 << 16) throw ParamError("YinGeometry.minF0Hz", "too low for this sample rate");
    g.window = g.maxLag;
    g.span = g.window + g.maxLag + 1;
    g.fftSize = fastFftSizeAtLeast(g.span);
    return g;
}

YinFrame::YinFrame(const YinGeometry& geometry)
    : geometry_(geometry), fft_(geometry.fftSize),
      frameSpectrum_(static_cast<std::size_t>(fft_.bins())) {}

namespace {

// Σ x_j² in double with four independent partial sums (no serial dependency).
double squaresSum(const float* x, int count) {
    double acc[4] = {0.0, 0.0, 0.0, 0.0};
    int j = 0;
    for (; j + 4 <= count; j += 4)
        for (int u = 0; u < 4; ++u) acc[u] += static_cast<double>(x[j + u]) * x[j + u];
    for (; j < count; ++j) acc[0] += static_cast<double>(x[j]) * x[j];
    return (acc[0] + acc[1]) + (acc[2] + acc[3]);
}

}  // namespace

void YinFrame::compute(std::span<const float> frame, std::span<float> difference, std::span<float> normalised) {
    const auto& g = geometry_;
    const int lags = g.maxLag + 2;  // τ = 0 … maxLag+1
    if (frame.size() != static_cast<std::size_t>(g.span))
        throw ParamError("YinFrame.frame", "must hold exactly " + std::to_string(g.span) + " samples");
    if (difference.size() != static_cast<std::size_t>(lags) || normalised.size() != static_cast<std::size_t>(lags))
        throw ParamError("YinFrame.difference", "outputs must hold maxLag + 2 values");
    const int n = g.fftSize;
    const int w = g.window;
    auto time = fft_.timeBuffer();
    auto spectrum = fft_.spectrumBuffer();

    // d(τ) does not change when a constant is added to the frame, but the
    // FFT route (energies minus 2·r(τ)) loses it to rounding under a large
    // offset: pure DC came out as float noise with chance dips. The frame's
    // mean is taken out first; the energy reported stays the raw frame's.
    sumOfSquares_ = squaresSum(frame.data(), g.span);
    double sum = 0.0;
    for (float v : frame) sum += v;
    const auto mean = static_cast<float>(sum / g.span);
    centred_.resize(frame.size());
    for (std::size_t j = 0; j < frame.size(); ++j) centred_[j] = frame[j] - mean;
    frame = centred_;

    // Y = FFT(whole span), kept aside.
    std::copy(frame.begin(), frame.end(), time.begin());
    std::fill(time.begin() + g.span, time.end(), 0.0f);
    fft_.forward();
    std::copy(spectrum.begin(), spectrum.end(), frameSpectrum_.begin());

    // A = FFT(first W samples); r(τ) = Σ_{j<W} x_j x_{j+τ} = IFFT(conj(A)·Y)(τ).
    // The span is long enough that j + τ never wraps around the circle.
    std::copy(frame.begin(), frame.begin() + w, time.begin());
    std::fill(time.begin() + w, time.end(), 0.0f);
    fft_.forward();
    // Written out: std::complex's operator* takes a slow NaN-checking path.
    auto* a = reinterpret_cast<float*>(spectrum.data());
    const auto* y = reinterpret_cast<const float*>(frameSpectrum_.data());
    for (std::size_t k = 0; k < 2 * spectrum.size(); k += 2) {
        const float re = a[k] * y[k] + a[k + 1] * y[k + 1];
        const float im = a[k] * y[k + 1] - a[k + 1] * y[k];
        a[k] = re;
        a[k + 1] = im;
    }
    fft_.inverse();

    // Energy terms: r_t(0) = Σ_{j<W} x_j² is the same for every lag; the
    // shifted term Σ_{j<W} x_{j+τ}² slides by one sample per lag, in double so
    // the running update cannot drift.
    const double head = squaresSum(frame.data(), w);
    const double scale = 1.0 / n;
    double shifted = head;
    double cumulative = 0.0;
    difference[0] = 0.0f;
    normalised[0] = 0.0f;  // holds Σ_{k<=τ} d(k) until the last loop
    for (int tau = 1; tau < lags; ++tau) {
        const double out = frame[tau - 1];
        const double in = frame[tau + w - 1];
        shifted += in * in - out * out;
        const double d = std::max(0.0, head + shifted - 2.0 * scale * time[tau]);
        difference[tau] = static_cast<float>(d);
        cumulative += d;
        normalised[tau] = static_cast<float>(cumulative);
    }
    // Step 3, as a separate loop without a serial dependency. Branch-free so it
    // vectorises: where the cumulative sum is 0, every d(k<=τ) is 0 too and
    // (0 + 1) / (0 + 1) gives the defined value 1.
    normalised[0] = 1.0f;
    for (int tau = 1; tau < lags; ++tau) {
        const float c = normalised[tau];
        const float silent = c > 0.0f ? 0.0f : 1.0f;
        normalised[tau] = (difference[tau] * static_cast<float>(tau) + silent) / (c + silent);
    }
}

YinDip interpolateDip(std::span<const float> difference, std::span<const float> normalised, int lag) {
    const auto t = static_cast<std::size_t>(lag);
    const double a = difference[t - 1], b = difference[t], c = difference[t + 1];
    const double curvature = a - 2.0 * b + c;
    double offset = curvature > 0.0 ? 0.5 * (a - c) / curvature : 0.0;
    offset = std::clamp(offset, -1.0, 1.0);
    const double na = normalised[t - 1], nb = normalised[t], nc = normalised[t + 1];
    const double value = nb + 0.5 * (nc - na) * offset + 0.5 * (na - 2.0 * nb + nc) * offset * offset;
    YinDip dip;
    dip.lag = static_cast<float>(lag + offset);
    dip.aperiodicity = static_cast<float>(std::clamp(value, 0.0, nb));
    return dip;
}

YinDip pickDip(std::span<const float> difference, std::span<const float> normalised, int lo, int hi,
               float threshold) {
    for (int tau = lo; tau <= hi; ++tau) {
        if (normalised[static_cast<std::size_t>(tau)] < threshold) {
            while (tau < hi && normalised[static_cast<std::size_t>(tau) + 1] < normalised[static_cast<std::size_t>(tau)])
                ++tau;
            return interpolateDip(difference, normalised, tau);
        }
    }
    const auto first = normalised.begin() + lo;
    const auto best = std::min_element(first, normalised.begin() + hi + 1);
    return interpolateDip(difference, normalised, lo + static_cast<int>(best - first));
}

int deepestDips(std::span<const float> difference, std::span<const float> normalised, int lo, int hi,
                float exclude, std::span<YinDip> out) {
    constexpr int kMaxKept = 8;
    int lagsKept[kMaxKept];
    float valuesKept[kMaxKept];
    const int capacity = std::min<int>(kMaxKept, static_cast<int>(out.size()));
    if (capacity == 0) return 0;
    int kept = 0;
    for (int tau = lo; tau <= hi; ++tau) {
        const float v = normalised[static_cast<std::size_t>(tau)];
        if (!(v < normalised[static_cast<std::size_t>(tau) - 1] && v <= normalised[static_cast<std::size_t>(tau) + 1]))
            continue;
        if (std::fabs(static_cast<float>(tau) - exclude) < 1.5f) continue;
        if (kept == capacity && !(v < valuesKept[kept - 1])) continue;
        int pos = kept < capacity ? kept++ : kept - 1;  // insertion sort into a tiny list
        while (pos > 0 && valuesKept[pos - 1] > v) {
            lagsKept[pos] = lagsKept[pos - 1];
            valuesKept[pos] = valuesKept[pos - 1];
            --pos;
        }
        lagsKept[pos] = tau;
        valuesKept[pos] = v;
    }
    for (int k = 0; k < kept; ++k) out[static_cast<std::size_t>(k)] = interpolateDip(difference, normalised, lagsKept[k]);
    return kept;
}

bool periodicBelowLag(std::span<const float> normalised, int minLag, float threshold) {
    for (int tau = 2; tau < minLag && tau + 1 < static_cast<int>(normalised.size()); ++tau) {
        const float v = normalised[static_cast<std::size_t>(tau)];
        if (v < threshold && v < normalised[static_cast<std::size_t>(tau) - 1] &&
            v <= normalised[static_cast<std::size_t>(tau) + 1])
            return true;
    }
    return false;
}

namespace {

// Σ_{j<W} (x_{s+j} − x_{s+j+τ})² for τ−1, τ, τ+1 at once (shared loads); four
// partial sums per lag keep the additions independent.
void differenceAt3(const float* x, int window, int tau, double out[3]) {
    float acc[3][4] = {};
    int j = 0;
    for (; j + 4 <= window; j += 4) {
        for (int u = 0; u < 4; ++u) {
            const float v = x[j + u];
            const float a = v - x[j + u + tau - 1];
            const float b = v - x[j + u + tau];
            const float c = v - x[j + u + tau + 1];
            acc[0][u] += a * a;
            acc[1][u] += b * b;
            acc[2][u] += c * c;
        }
    }
    for (int k = 0; k < 3; ++k) out[k] = double(acc[k][0]) + acc[k][1] + acc[k][2] + acc[k][3];
    for (; j < window; ++j)
        for (int k = 0; k < 3; ++k) {
            const float e = x[j] - x[j + tau - 1 + k];
            out[k] += double(e) * e;
        }
}

}  // namespace

float refineLagCentred(std::span<const float> signal, double centre, int window, float lag) {
    if (!(lag >= 4.0f) || window < 1) return lag;
    // The d values at τ−1, τ, τ+1 over the region [s, s + W + τ + 1] centred on
    // `centre`; false if that region leaves the signal.
    const auto evaluate = [&](int tau, double d[3]) {
        const auto start = static_cast<std::int64_t>(std::llround(centre - 0.5 * (window + tau)));
        if (start < 0 || start + window + tau + 1 > static_cast<std::int64_t>(signal.size())) return false;
        differenceAt3(signal.data() + start, window, tau, d);
        return true;
    };
    int tau = static_cast<int>(std::lround(lag));
    double d[3];
    if (!evaluate(tau, d)) return lag;
    // Walk downhill: the first pass's window is off-centre for short lags, so
    // on a fast glide its lag can be several samples away from the centred one.
    const int maxSteps = std::max(2, static_cast<int>(std::ceil(0.2 * tau)));
    for (int step = 0; step < maxSteps; ++step) {
        int next = tau;
        if (d[0] < d[1] && tau > 3) next = tau - 1;
        else if (d[2] < d[1]) next = tau + 1;
        if (next == tau) break;
        if (!evaluate(next, d)) return lag;
        tau = next;
    }
    if (d[1] > d[0] || d[1] > d[2]) return lag;  // no minimum within reach: keep step 5's lag
    const double curvature = d[0] - 2.0 * d[1] + d[2];
    if (!(curvature > 0.0)) return static_cast<float>(tau);
    return static_cast<float>(tau + 0.5 * (d[0] - d[2]) / curvature);
}

}  // namespace earmark
