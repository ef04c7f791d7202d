// A seeded random source whose sequence is the same on every platform and
// standard library (std::mt19937_64 is fully specified by the C++ standard;
// the distributions of <random> are not, so the mapping to ranges is ours).
#pragma once

#include <cstdint>
#include <random>
#include <utility>
#include <vector>

namespace earmark::listening {

class SeededRandom {
public:
    explicit SeededRandom(std::uint64_t seed) : engine_(seed) {}
    // Uniform in [0, n), n ≥ 1 (Lemire's multiply-shift; bias < n / 2^64).
    std::size_t below(std::size_t n) {
        return static_cast<std::size_t>((static_cast<unsigned __int128>(engine_()) * n) >> 64);
    }
    template <class T>
    void shuffle(std::vector<T>& v) {
        for (std::size_t i = v.size(); i > 1; --i) std::swap(v[i - 1], v[below(i)]);
    }

private:
    std::mt19937_64 engine_;
};

}  // namespace earmark::listening
