#include "earmark/dsp/fft.hpp"

#include "earmark/core/error.hpp"

#include <fftw3.h>

#include <algorithm>
#include <map>
#include <memory>
#include <mutex>
#include <string>
#include <utility>

namespace earmark {

struct RealFft::Plans {
    fftwf_plan forward = nullptr;
    fftwf_plan inverse = nullptr;
};

namespace {

std::mutex& plannerMutex() {
    static std::mutex m;
    return m;
}

// Plans live for the whole process: creating them is the slow part, and a
// handful of sizes are used over and over.
const RealFft::Plans* plansFor(int n, float* time, std::complex<float>* spectrum) {
    // Never destroyed, so the FFTW plans stay reachable (no leak report at exit).
    static auto& cache = *new std::map<int, std::unique_ptr<RealFft::Plans>>;
    std::lock_guard lock(plannerMutex());
    auto it = cache.find(n);
    if (it != cache.end()) return it->second.get();
    auto plans = std::make_unique<RealFft::Plans>();
    auto* cplx = reinterpret_cast<fftwf_complex*>(spectrum);
    // FFTW_ESTIMATE keeps start-up instant and results deterministic; the
    // buffers are fftwf_malloc'ed, so new-array execution keeps SIMD alignment.
    plans->forward = fftwf_plan_dft_r2c_1d(n, time, cplx, FFTW_ESTIMATE | FFTW_DESTROY_INPUT);
    plans->inverse = fftwf_plan_dft_c2r_1d(n, cplx, time, FFTW_ESTIMATE | FFTW_DESTROY_INPUT);
    if (!plans->forward || !plans->inverse)
        throw Error("RealFft", "FFTW could not plan a transform of size " + std::to_string(n));
    return cache.emplace(n, std::move(plans)).first->second.get();
}
}  // namespace

RealFft::RealFft(int size) : size_(size) {
    if (size < 2) throw ParamError("RealFft.size", "must be at least 2, got " + std::to_string(size));
    time_ = static_cast<float*>(fftwf_malloc(sizeof(float) * static_cast<std::size_t>(size)));
    spectrum_ = reinterpret_cast<std::complex<float>*>(
        fftwf_malloc(sizeof(fftwf_complex) * static_cast<std::size_t>(bins())));
    if (!time_ || !spectrum_) {
        fftwf_free(time_);
        fftwf_free(spectrum_);
        throw Error("RealFft", "out of memory for size " + std::to_string(size));
    }
    std::fill(time_, time_ + size, 0.0f);
    std::fill(spectrum_, spectrum_ + bins(), std::complex<float>{});
    plans_ = plansFor(size, time_, spectrum_);
}

RealFft::~RealFft() {
    fftwf_free(time_);
    fftwf_free(spectrum_);
}

RealFft::RealFft(RealFft&& other) noexcept
    : size_(std::exchange(other.size_, 0)), plans_(std::exchange(other.plans_, nullptr)),
      time_(std::exchange(other.time_, nullptr)), spectrum_(std::exchange(other.spectrum_, nullptr)) {}

RealFft& RealFft::operator=(RealFft&& other) noexcept {
    if (this != &other) {
        fftwf_free(time_);
        fftwf_free(spectrum_);
        size_ = std::exchange(other.size_, 0);
        plans_ = std::exchange(other.plans_, nullptr);
        time_ = std::exchange(other.time_, nullptr);
        spectrum_ = std::exchange(other.spectrum_, nullptr);
    }
    return *this;
}

void RealFft::forward() {
    fftwf_execute_dft_r2c(plans_->forward, time_, reinterpret_cast<fftwf_complex*>(spectrum_));
}

void RealFft::inverse() {
    fftwf_execute_dft_c2r(plans_->inverse, reinterpret_cast<fftwf_complex*>(spectrum_), time_);
}

void RealFft::forward(std::span<const float> in, std::span<std::complex<float>> out) {
    if (in.size() != static_cast<std::size_t>(size_) || out.size() != static_cast<std::size_t>(bins()))
        throw ParamError("RealFft.forward", "buffer sizes do not match the transform size");
    std::copy(in.begin(), in.end(), time_);
    forward();
    std::copy(spectrum_, spectrum_ + bins(), out.begin());
}

}  // namespace earmark
