// Band-limited DTW against a naive full-matrix oracle written here from the
// recurrence of Sakoe & Chiba (IEEE Trans. ASSP 26(1), 1978), symmetric form
// without slope constraint: g(i,j) = min(g(i−1,j) + d, g(i−1,j−1) + 2d, g(i,j−1) + d).
#include "earmark/align/dtw.hpp"
#include "earmark/core/error.hpp"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <random>

namespace earmark {
namespace {

FeatureMatrix randomFeatures(int frames, int dims, std::uint32_t seed) {
    std::mt19937 gen(seed);
    std::normal_distribution<float> dist(0.0f, 1.0f);
    FeatureMatrix f{frames, dims, 0.01, {}};
    f.values.resize(static_cast<std::size_t>(frames) * dims);
    for (float& v : f.values) v = dist(gen);
    return f;
}

FeatureMatrix gather(const FeatureMatrix& a, const std::vector<int>& frames) {
    FeatureMatrix out{static_cast<int>(frames.size()), a.dims, a.hopSeconds, {}};
    out.values.resize(frames.size() * static_cast<std::size_t>(a.dims));
    for (std::size_t k = 0; k < frames.size(); ++k)
        for (int d = 0; d < a.dims; ++d) out.values[k * a.dims + d] = a.row(frames[k])[d];
    return out;
}

FeatureMatrix slice(const FeatureMatrix& a, int first, int end) {
    std::vector<int> frames;
    for (int i = first; i < end; ++i) frames.push_back(i);
    return gather(a, frames);
}

FeatureMatrix join(const std::vector<FeatureMatrix>& parts) {
    FeatureMatrix out{0, parts.front().dims, parts.front().hopSeconds, {}};
    for (const auto& p : parts) {
        out.frames += p.frames;
        for (float v : p.values) out.values.push_back(v);
    }
    return out;
}

double dist(const FeatureMatrix& a, int i, const FeatureMatrix& b, int j) {
    double acc = 0.0;
    for (int k = 0; k < a.dims; ++k) acc += (a.row(i)[k] - b.row(j)[k]) * (a.row(i)[k] - b.row(j)[k]);
    return std::sqrt(acc);
}

// Full matrix, optionally restricted to a band; anchored at both corners.
double naiveDtw(const FeatureMatrix& a, const FeatureMatrix& b, const DtwBand* band = nullptr) {
    const double inf = std::numeric_limits<double>::infinity();
    std::vector<std::vector<double>> g(a.frames, std::vector<double>(b.frames, inf));
    for (int i = 0; i < a.frames; ++i)
        for (int j = 0; j < b.frames; ++j) {
            if (band && (j < band->lo[i] || j > band->hi[i])) continue;
            const double d = dist(a, i, b, j);
            double best = (i == 0 && j == 0) ? d : inf;
            if (i > 0) best = std::min(best, g[i - 1][j] + d);
            if (i > 0 && j > 0) best = std::min(best, g[i - 1][j - 1] + 2 * d);
            if (j > 0) best = std::min(best, g[i][j - 1] + d);
            g[i][j] = best;
        }
    return g[a.frames - 1][b.frames - 1];
}

DtwBand fullBand(int takeFrames, int refFrames) {
    return DtwBand{std::vector<int>(takeFrames, 0), std::vector<int>(takeFrames, refFrames - 1)};
}

double pathCost(const DtwResult& r) {
    // Recompute the weighted cost from the path itself: 2d on diagonal steps.
    double c = r.path.front().distance;
    for (std::size_t k = 1; k < r.path.size(); ++k) {
        const bool diagonal = r.path[k].take != r.path[k - 1].take && r.path[k].ref != r.path[k - 1].ref;
        c += (diagonal ? 2.0 : 1.0) * r.path[k].distance;
    }
    return c;
}

TEST(Dtw, FullBandMatchesTheNaiveOracle) {
    for (std::uint32_t seed = 1; seed <= 5; ++seed) {
        const FeatureMatrix a = randomFeatures(37 + 3 * seed, 4, seed), b = randomFeatures(29 + 5 * seed, 4, 100 + seed);
        const DtwResult r = dtwAlign(a, b, fullBand(a.frames, b.frames));
        const double oracle = naiveDtw(a, b);
        EXPECT_NEAR(r.totalCost, oracle, 1e-3 * oracle) << seed;
        EXPECT_NEAR(pathCost(r), oracle, 1e-3 * oracle) << seed;
        EXPECT_EQ(r.cells, static_cast<std::size_t>(a.frames) * b.frames);
        // A path from corner to corner, every step moving by at most one frame on each axis.
        EXPECT_EQ(r.path.front().take, 0);
        EXPECT_EQ(r.path.front().ref, 0);
        EXPECT_EQ(r.path.back().take, a.frames - 1);
        EXPECT_EQ(r.path.back().ref, b.frames - 1);
        for (std::size_t k = 1; k < r.path.size(); ++k) {
            const int di = r.path[k].take - r.path[k - 1].take, dj = r.path[k].ref - r.path[k - 1].ref;
            EXPECT_TRUE((di == 0 || di == 1) && (dj == 0 || dj == 1) && di + dj > 0);
        }
    }
}

TEST(Dtw, BandedCostMatchesTheOracleInsideTheSameBandAndStoresOnlyTheBand) {
    const FeatureMatrix a = randomFeatures(120, 3, 7), b = randomFeatures(90, 3, 8);
    const DtwBand band = lineBand(a.frames, b.frames, 0, 0, a.frames - 1, b.frames - 1, 6);
    const DtwResult r = dtwAlign(a, b, band);
    const double oracle = naiveDtw(a, b, &band);
    EXPECT_NEAR(r.totalCost, oracle, 1e-3 * oracle);
    EXPECT_EQ(r.cells, band.cells());
    EXPECT_LT(r.cells, static_cast<std::size_t>(a.frames) * b.frames / 4);
    for (const auto& p : r.path) {
        EXPECT_GE(p.ref, band.lo[p.take]);
        EXPECT_LE(p.ref, band.hi[p.take]);
    }
}

TEST(Dtw, RecoversAKnownWarp) {
    // b is a played twice as slowly over its first quarter: frame j of b is frame warp(j) of a.
    const FeatureMatrix a = randomFeatures(60, 5, 21);
    std::vector<int> warp;
    for (int j = 0; j < 75; ++j) warp.push_back(j < 30 ? j / 2 : j - 15);
    const FeatureMatrix b = gather(a, warp);
    const DtwResult r = dtwAlign(b, a, fullBand(b.frames, a.frames));
    EXPECT_NEAR(r.totalCost, 0.0, 1e-4);
    for (const auto& p : r.path) EXPECT_EQ(p.ref, warp[p.take]) << "take frame " << p.take;
}

TEST(Dtw, FreeTakeEndsLeaveOutWhatTheReferenceDoesNotHave) {
    // The take is the reference with unrelated frames before and after.
    const FeatureMatrix ref = randomFeatures(40, 4, 31);
    const FeatureMatrix junk = randomFeatures(35, 4, 32);
    const FeatureMatrix take = join({slice(junk, 0, 20), ref, slice(junk, 20, 35)});
    DtwOptions free;
    free.ends = DtwEnds::FreeTakeEnds;
    free.skipCost.assign(75, 1.0f);  // cheaper than matching junk (distance ≈ 2.8 for unit normals in 4 dims)
    const DtwResult r = dtwAlign(take, ref, fullBand(75, 40), free);
    EXPECT_EQ(r.path.front().take, 20);
    EXPECT_EQ(r.path.back().take, 59);
    EXPECT_NEAR(r.totalCost, 35.0, 1e-3);  // 35 skipped frames at 1.0, a perfect match otherwise
    // Anchored, the same take must absorb the junk.
    EXPECT_GT(dtwAlign(take, ref, fullBand(75, 40)).totalCost, 35.0);
}

TEST(Dtw, SkipInsideLeavesOutAPauseTheReferenceLacks) {
    const FeatureMatrix ref = randomFeatures(30, 4, 41);
    FeatureMatrix pause{10, 4, 0.01, std::vector<float>(40, 5.0f)};  // unlike anything in ref
    const FeatureMatrix take = join({slice(ref, 0, 15), pause, slice(ref, 15, 30)});
    DtwOptions o;
    o.ends = DtwEnds::FreeTakeEnds;
    o.skipCost.assign(40, 0.5f);
    o.skipInside = true;
    const DtwResult r = dtwAlign(take, ref, fullBand(40, 30), o);
    EXPECT_NEAR(r.totalCost, 10 * 0.5, 1e-3);
    int skipped = 0;
    for (const auto& p : r.path) {
        if (p.skipped) {
            ++skipped;
            EXPECT_GE(p.take, 15);
            EXPECT_LT(p.take, 25);
        }
    }
    EXPECT_EQ(skipped, 10);
}

TEST(Dtw, LineAndCorridorBandsAreConnectedStrips) {
    const DtwBand line = lineBand(100, 300, 10, 20, 90, 280, 3);  // steep: 3.25 reference frames per take frame
    for (int i = 1; i < 100; ++i) {
        EXPECT_LE(line.lo[i - 1], line.lo[i]);
        EXPECT_LE(line.hi[i - 1], line.hi[i]);
        EXPECT_LE(line.lo[i], line.hi[i - 1] + 1);
    }
    const FeatureMatrix a = randomFeatures(100, 2, 5), b = randomFeatures(300, 2, 6);
    EXPECT_NO_THROW(dtwAlign(a, b, line));

    const std::vector<DtwPathPoint> coarse = {{0, 0}, {1, 1}, {1, 2}, {2, 3}, {3, 3}};
    const DtwBand corridor = corridorBand(coarse, 4, 16, 16, 2);
    for (int i = 0; i < 16; ++i) EXPECT_LE(corridor.lo[i], corridor.hi[i]) << i;
    EXPECT_EQ(corridor.lo[0], 0);
    EXPECT_EQ(corridor.hi[15], 15);
    EXPECT_EQ(corridor.hi[4], 13);   // rows 4…7 cover coarse columns 1…2 (fine 4…11) + 2
}

TEST(Dtw, RejectsBadInput) {
    const FeatureMatrix a = randomFeatures(10, 3, 1), b = randomFeatures(10, 4, 2), c = randomFeatures(10, 3, 3);
    EXPECT_THROW(dtwAlign(a, b, fullBand(10, 10)), ParamError);
    EXPECT_THROW(dtwAlign(a, c, fullBand(9, 10)), ParamError);
    DtwBand gap = fullBand(10, 10);
    gap.lo[5] = 8;
    gap.hi[4] = 2;
    EXPECT_THROW(dtwAlign(a, c, gap), ParamError);
    DtwOptions o;
    o.skipInside = true;
    EXPECT_THROW(dtwAlign(a, c, fullBand(10, 10), o), ParamError);
    // Anchored with the end corner outside the band: no path.
    DtwBand early = lineBand(10, 10, 0, 0, 9, 4, 0);
    EXPECT_THROW(dtwAlign(a, c, early), Error);
    EXPECT_THROW(lineBand(10, 10, 5, 0, 5, 9, 1), ParamError);
    EXPECT_THROW(corridorBand({}, 4, 10, 10, 1), ParamError);
}

}  // namespace
}  // namespace earmark
