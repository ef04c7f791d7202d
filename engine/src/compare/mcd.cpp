#include "earmark/compare/mcd.hpp"

#include "earmark/core/error.hpp"

#include <cmath>
#include <numbers>

namespace earmark {

FeatureMatrix mcdCepstra(const Signal& signal, MfccParams params, Progress progress) {
    params.meanNormalise = false;
    FeatureMatrix c = computeMfcc(signal, params, progress);
    // Orthonormal DCT of ln power → cosine-series cepstrum of ln amplitude (see the header).
    const auto scale = static_cast<float>(1.0 / std::sqrt(8.0 * params.bands));
    for (float& v : c.values) v *= scale;
    return c;
}

double mcdFrameDb(const float* a, const float* b, int dims) {
    double acc = 0.0;
    for (int d = 1; d < dims; ++d) {
        const double diff = static_cast<double>(a[d]) - static_cast<double>(b[d]);
        acc += diff * diff;
    }
    return 10.0 / std::numbers::ln10 * std::sqrt(2.0 * acc);
}

std::vector<double> mcdPerPairDb(const FeatureMatrix& a, const FeatureMatrix& b, const std::vector<FramePair>& pairs) {
    if (a.dims != b.dims || a.dims < 2)
        throw ParamError("mcd.b", "both takes need the same number of coefficients, at least 2 (c0 and c1)");
    std::vector<double> out;
    out.reserve(pairs.size());
    for (const FramePair& p : pairs) {
        if (p.a < 0 || p.a >= a.frames || p.b < 0 || p.b >= b.frames)
            throw ParamError("mcd.pairs", "frame pair (" + std::to_string(p.a) + ", " + std::to_string(p.b) +
                                              ") lies outside the cepstra");
        out.push_back(mcdFrameDb(a.row(p.a), b.row(p.b), a.dims));
    }
    return out;
}

double meanMcdDb(const FeatureMatrix& a, const FeatureMatrix& b, const std::vector<FramePair>& pairs) {
    if (pairs.empty()) throw ParamError("mcd.pairs", "there are no aligned frames");
    double sum = 0.0;
    for (double v : mcdPerPairDb(a, b, pairs)) sum += v;
    return sum / static_cast<double>(pairs.size());
}

}  // namespace earmark
