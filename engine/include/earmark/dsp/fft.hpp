// Real-to-complex FFT of one fixed size, backed by FFTW (single precision).
//
// Contract:
// - forward(): X[k] = sum_n x[n] e^{-2πi kn/N}, k = 0..N/2. Not scaled.
// - inverse(): x[n] = sum_k X[k] e^{+2πi kn/N} (Hermitian). Not scaled: a
//   forward+inverse round trip multiplies by N.
// - Plans are created once per size for the whole process, under one mutex
//   (FFTW's planner is not thread-safe; its execute functions are). Each
//   RealFft owns its own aligned buffers, so one instance per thread is the
//   rule: an instance is reentrant-free (not thread-safe), the class is.
#pragma once

#include <complex>
#include <cstddef>
#include <span>

namespace earmark {

class RealFft {
public:
    explicit RealFft(int size);  // size >= 2 (even sizes are fastest); throws ParamError
    ~RealFft();
    RealFft(const RealFft&) = delete;
    RealFft& operator=(const RealFft&) = delete;
    RealFft(RealFft&&) noexcept;
    RealFft& operator=(RealFft&&) noexcept;

    int size() const { return size_; }
    int bins() const { return size_ / 2 + 1; }

    // Work in place on the instance's aligned buffers (fastest path):
    // fill timeBuffer(), call forward(), read spectrumBuffer(); or the reverse.
    std::span<float> timeBuffer() { return {time_, static_cast<std::size_t>(size_)}; }
    std::span<std::complex<float>> spectrumBuffer() {
        return {spectrum_, static_cast<std::size_t>(bins())};
    }
    void forward();   // timeBuffer -> spectrumBuffer
    void inverse();   // spectrumBuffer -> timeBuffer (destroys spectrumBuffer)

    // Convenience copies: in.size() == size(), out.size() == bins().
    void forward(std::span<const float> in, std::span<std::complex<float>> out);

    struct Plans;  // implementation detail: the shared FFTW plans of one size

private:
    int size_ = 0;
    const Plans* plans_ = nullptr;
    float* time_ = nullptr;
    std::complex<float>* spectrum_ = nullptr;
};

}  // namespace earmark
