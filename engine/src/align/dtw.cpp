#include "earmark/align/dtw.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace earmark {
namespace {

constexpr float kInf = std::numeric_limits<float>::infinity();

float distance(const float* a, const float* b, int dims) {
    float acc = 0.0f;
    for (int k = 0; k < dims; ++k) {
        const float d = a[k] - b[k];
        acc += d * d;
    }
    return std::sqrt(acc);
}

void checkBand(const DtwBand& band, int takeFrames, int refFrames) {
    if (band.lo.size() != static_cast<std::size_t>(takeFrames) || band.hi.size() != band.lo.size())
        throw ParamError("DtwBand.lo", "needs one row per take frame");
    int prevLo = -1, prevHi = -1;
    bool seen = false, ended = false;
    for (int i = 0; i < takeFrames; ++i) {
        const int lo = band.lo[i], hi = band.hi[i];
        if (hi < lo) {
            ended = ended || seen;
            continue;
        }
        if (lo < 0 || hi >= refFrames) throw ParamError("DtwBand.hi", "row " + std::to_string(i) + " leaves the reference");
        if (ended) throw ParamError("DtwBand.lo", "rows with cells are not contiguous (row " + std::to_string(i) + ")");
        if (seen && (lo < prevLo || hi < prevHi || lo > prevHi + 1))
            throw ParamError("DtwBand.lo", "the band is not one connected strip at row " + std::to_string(i));
        seen = true;
        prevLo = lo;
        prevHi = hi;
    }
    if (!seen) throw ParamError("DtwBand.lo", "the band has no cells");
}

}  // namespace

std::size_t DtwBand::cells() const {
    std::size_t n = 0;
    for (std::size_t i = 0; i < lo.size(); ++i)
        if (hi[i] >= lo[i]) n += static_cast<std::size_t>(hi[i] - lo[i] + 1);
    return n;
}

DtwBand lineBand(int takeFrames, int refFrames, double takeA, double refA, double takeB, double refB, int radius) {
    if (takeFrames < 1 || refFrames < 1) throw ParamError("lineBand.frames", "both sequences need frames");
    if (radius < 0) throw ParamError("lineBand.radius", "must be >= 0");
    if (!(takeB > takeA)) throw ParamError("lineBand.takeB", "must be after takeA");
    const double slope = (refB - refA) / (takeB - takeA);
    DtwBand band;
    band.lo.resize(takeFrames);
    band.hi.resize(takeFrames);
    for (int i = 0; i < takeFrames; ++i) {
        const double centre = std::clamp(refA + (i - takeA) * slope, 0.0, refFrames - 1.0);
        band.lo[i] = std::max(0, static_cast<int>(std::floor(centre)) - radius);
        band.hi[i] = std::min(refFrames - 1, static_cast<int>(std::ceil(centre)) + radius);
    }
    // Steep lines could leave gaps between rows; widen to keep the strip connected.
    for (int i = 1; i < takeFrames; ++i) band.hi[i - 1] = std::max(band.hi[i - 1], band.lo[i] - 1);
    return band;
}

DtwBand corridorBand(const std::vector<DtwPathPoint>& coarsePath, int factor, int takeFrames, int refFrames,
                     int radius) {
    if (factor < 1) throw ParamError("corridorBand.factor", "must be >= 1");
    if (coarsePath.empty()) throw ParamError("corridorBand.coarsePath", "is empty");
    if (radius < 0) throw ParamError("corridorBand.radius", "must be >= 0");
    DtwBand band;
    band.lo.assign(takeFrames, std::numeric_limits<int>::max());
    band.hi.assign(takeFrames, -1);
    // Cover each coarse cell's fine block, widened by the radius in both directions.
    for (const DtwPathPoint& p : coarsePath) {
        const int r0 = std::max(0, p.take * factor - radius);
        const int r1 = std::min(takeFrames - 1, p.take * factor + factor - 1 + radius);
        const int c0 = std::max(0, p.ref * factor - radius);
        const int c1 = std::min(refFrames - 1, p.ref * factor + factor - 1 + radius);
        for (int i = r0; i <= r1; ++i) {
            band.lo[i] = std::min(band.lo[i], c0);
            band.hi[i] = std::max(band.hi[i], c1);
        }
    }
    // Make it one monotone, connected strip; rows outside stay empty.
    int first = 0, last = takeFrames - 1;
    while (first < takeFrames && band.hi[first] < 0) ++first;
    while (last >= 0 && band.hi[last] < 0) --last;
    for (int i = 0; i < takeFrames; ++i)
        if (i < first || i > last) band.lo[i] = 0, band.hi[i] = -1;
    for (int i = first + 1; i <= last; ++i) band.hi[i] = std::max(band.hi[i], band.hi[i - 1]);
    for (int i = last - 1; i >= first; --i) band.lo[i] = std::min(band.lo[i], band.lo[i + 1]);
    for (int i = first + 1; i <= last; ++i) band.hi[i - 1] = std::max(band.hi[i - 1], band.lo[i] - 1);
    return band;
}

DtwResult dtwAlign(const FeatureMatrix& take, const FeatureMatrix& ref, const DtwBand& band,
                   const DtwOptions& options, Progress progress) {
    if (take.dims != ref.dims) throw ParamError("dtwAlign.ref", "feature sizes differ");
    if (take.frames < 1 || ref.frames < 1) throw ParamError("dtwAlign.take", "both sequences need frames");
    const int N = take.frames, M = ref.frames, dims = take.dims;
    checkBand(band, N, M);
    const bool freeEnds = options.ends == DtwEnds::FreeTakeEnds;
    if (!options.skipCost.empty() && options.skipCost.size() != static_cast<std::size_t>(N))
        throw ParamError("DtwOptions.skipCost", "needs one cost per take frame");
    if (options.skipInside && options.skipCost.empty())
        throw ParamError("DtwOptions.skipInside", "needs skipCost");
    // Cost of a step along the take alone into row i.
    const auto alongTake = [&](int i, float d) {
        return options.skipInside ? std::min(d, options.skipCost[i]) : d;
    };
    // prefix[i] = cost of leaving out take frames 0 … i−1 (double: long sums).
    std::vector<double> prefix(static_cast<std::size_t>(N) + 1, 0.0);
    for (int i = 0; i < N; ++i) prefix[i + 1] = prefix[i] + (options.skipCost.empty() ? 0.0 : options.skipCost[i]);

    std::vector<std::size_t> offset(static_cast<std::size_t>(N) + 1, 0);
    for (int i = 0; i < N; ++i)
        offset[i + 1] = offset[i] + (band.hi[i] >= band.lo[i] ? static_cast<std::size_t>(band.hi[i] - band.lo[i] + 1) : 0);
    std::vector<float> D(offset[N], kInf);
    const auto inRow = [&](int i, int j) { return i >= 0 && j >= band.lo[i] && j <= band.hi[i]; };
    const auto at = [&](int i, int j) -> float& { return D[offset[i] + static_cast<std::size_t>(j - band.lo[i])]; };
    const auto startCost = [&](int i, float d) { return static_cast<float>(prefix[i]) + d; };

    for (int i = 0; i < N; ++i) {
        if ((i & 1023) == 0) progress.report(0.95 * i / N);
        const float* x = take.row(i);
        for (int j = band.lo[i]; j <= band.hi[i]; ++j) {
            const float d = distance(x, ref.row(j), dims);
            float best = kInf;
            if (inRow(i - 1, j)) best = at(i - 1, j) + alongTake(i, d);
            if (inRow(i - 1, j - 1)) best = std::min(best, at(i - 1, j - 1) + 2.0f * d);
            if (j - 1 >= band.lo[i]) best = std::min(best, at(i, j - 1) + d);
            if (j == 0 && (freeEnds || i == 0)) best = std::min(best, startCost(i, d));
            at(i, j) = best;
        }
    }

    int endRow = -1;
    double endCost = std::numeric_limits<double>::infinity();
    if (freeEnds) {
        for (int i = 0; i < N; ++i) {
            if (!inRow(i, M - 1)) continue;
            const double total = at(i, M - 1) + (prefix[N] - prefix[i + 1]);
            if (total < endCost) endCost = total, endRow = i;
        }
    } else if (inRow(N - 1, M - 1) && std::isfinite(at(N - 1, M - 1))) {
        endRow = N - 1;
        endCost = at(N - 1, M - 1);
    }
    if (endRow < 0 || !std::isfinite(endCost)) throw Error("DTW", "no warping path fits inside the band");

    DtwResult result;
    result.cells = offset[N];
    result.totalCost = endCost;
    int i = endRow, j = M - 1;
    for (;;) {
        const float d = distance(take.row(i), ref.row(j), dims);
        result.path.push_back({i, j, d, false});
        float best = kInf;
        int bi = -1, bj = -1;
        bool skip = false;
        if (inRow(i - 1, j - 1) && at(i - 1, j - 1) + 2.0f * d < best) best = at(i - 1, j - 1) + 2.0f * d, bi = i - 1, bj = j - 1;
        if (inRow(i - 1, j) && at(i - 1, j) + alongTake(i, d) < best) {
            best = at(i - 1, j) + alongTake(i, d), bi = i - 1, bj = j;
            skip = alongTake(i, d) < d;
        }
        if (j - 1 >= band.lo[i] && at(i, j - 1) + d < best) best = at(i, j - 1) + d, bi = i, bj = j - 1, skip = false;
        if (j == 0 && (freeEnds || i == 0) && startCost(i, d) <= best) break;  // the path starts here
        if (bi < 0) throw Error("DTW", "warping path broke off during traceback");
        result.path.back().skipped = skip;
        i = bi;
        j = bj;
    }
    std::reverse(result.path.begin(), result.path.end());
    progress.report(1.0);
    return result;
}

}  // namespace earmark
