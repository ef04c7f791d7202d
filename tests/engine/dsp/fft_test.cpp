// The FFTW wrapper against a naive DFT oracle written here (direct summation
// of the DFT definition in long double), at several sizes and from threads.
#include "earmark/core/error.hpp"
#include "earmark/dsp/fft.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <numbers>
#include <random>
#include <thread>
#include <vector>

namespace earmark {
namespace {

std::vector<std::complex<double>> naiveDft(const std::vector<float>& x) {
    const std::size_t n = x.size();
    std::vector<std::complex<double>> out(n / 2 + 1);
    for (std::size_t k = 0; k < out.size(); ++k) {
        std::complex<long double> acc = 0;
        for (std::size_t t = 0; t < n; ++t) {
            const long double angle = -2.0L * std::numbers::pi_v<long double> * k * t / n;
            acc += std::complex<long double>(std::cos(angle), std::sin(angle)) * static_cast<long double>(x[t]);
        }
        out[k] = {static_cast<double>(acc.real()), static_cast<double>(acc.imag())};
    }
    return out;
}

std::vector<float> randomFrame(int n, unsigned seed) {
    std::mt19937 gen(seed);
    std::uniform_real_distribution<float> d(-1, 1);
    std::vector<float> x(static_cast<std::size_t>(n));
    for (auto& v : x) v = d(gen);
    return x;
}

class FftSizes : public ::testing::TestWithParam<int> {};

TEST_P(FftSizes, MatchesNaiveDft) {
    const int n = GetParam();
    RealFft fft(n);
    const auto x = randomFrame(n, static_cast<unsigned>(n));
    std::vector<std::complex<float>> got(static_cast<std::size_t>(fft.bins()));
    fft.forward(x, got);
    const auto want = naiveDft(x);
    // float32 FFT error grows ~ sqrt(log n) · eps · ||x||; sqrt(n) bounds ||x|| here.
    const double tol = 1e-5 * std::sqrt(static_cast<double>(n)) * std::log2(n);
    for (std::size_t k = 0; k < want.size(); ++k) {
        EXPECT_NEAR(got[k].real(), want[k].real(), tol) << "n=" << n << " k=" << k;
        EXPECT_NEAR(got[k].imag(), want[k].imag(), tol) << "n=" << n << " k=" << k;
    }
}

INSTANTIATE_TEST_SUITE_P(Sizes, FftSizes, ::testing::Values(2, 8, 30, 256, 1000, 1024, 2048));

TEST(Fft, InverseIsUnscaled) {
    RealFft fft(512);
    const auto x = randomFrame(512, 5);
    std::copy(x.begin(), x.end(), fft.timeBuffer().begin());
    fft.forward();
    fft.inverse();
    for (std::size_t i = 0; i < x.size(); ++i) EXPECT_NEAR(fft.timeBuffer()[i] / 512.0f, x[i], 1e-5);
}

TEST(Fft, SafeFromSeveralThreads) {
    const auto x = randomFrame(1024, 9);
    RealFft reference(1024);
    std::vector<std::complex<float>> want(513);
    reference.forward(x, want);
    std::vector<std::thread> threads;
    std::vector<int> mismatches(4, 0);
    for (int t = 0; t < 4; ++t) {
        threads.emplace_back([&, t] {
            for (int rep = 0; rep < 200; ++rep) {
                RealFft fft(rep % 2 ? 1024 : 384);  // plans for two sizes, created concurrently
                if (fft.size() != 1024) continue;
                std::vector<std::complex<float>> got(513);
                fft.forward(x, got);
                if (got != want) ++mismatches[static_cast<std::size_t>(t)];
            }
        });
    }
    for (auto& th : threads) th.join();
    for (int m : mismatches) EXPECT_EQ(m, 0);
}

TEST(Fft, RejectsBadSizes) {
    EXPECT_THROW(RealFft(1), ParamError);
    EXPECT_THROW(RealFft(0), ParamError);
    RealFft fft(16);
    std::vector<float> wrong(15);
    std::vector<std::complex<float>> out(9);
    EXPECT_THROW(fft.forward(wrong, out), ParamError);
}

}  // namespace
}  // namespace earmark
