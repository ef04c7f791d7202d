// Percentile bootstrap over raters and lines, and box-plot quantiles.
#include "earmark/core/error.hpp"
#include "earmark/core/numeric.hpp"
#include "earmark/listening/analysis.hpp"
#include "seeded_random.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace earmark::listening {

double quantileSorted(const std::vector<double>& v, double q) {
    if (v.empty()) return std::numeric_limits<double>::quiet_NaN();
    const double h = (static_cast<double>(v.size()) - 1.0) * q;
    const auto lo = static_cast<std::size_t>(std::floor(h));
    if (lo + 1 >= v.size()) return v.back();
    return v[lo] + (h - static_cast<double>(lo)) * (v[lo + 1] - v[lo]);
}

BoxFigures boxFigures(const std::vector<double>& v) {
    return {quantileSorted(v, 0.0), quantileSorted(v, 0.25), quantileSorted(v, 0.5), quantileSorted(v, 0.75),
            quantileSorted(v, 1.0)};
}

BootstrapResult bootstrapMeans(const std::vector<double>& cells, int raters, int lines, int systems, double alpha,
                               int rounds, std::uint64_t seed, Progress progress) {
    if (rounds < 0) throw ParamError("AnalysisParams.bootstrapRounds", "must not be negative");
    if (!(alpha > 0 && alpha < 1)) throw ParamError("AnalysisParams.alpha", "must be in (0, 1)");
    if (cells.size() != static_cast<std::size_t>(raters) * lines * systems)
        throw ParamError("bootstrapMeans.cells", "must hold raters × lines × systems values");
    const auto S = static_cast<std::size_t>(systems);
    std::vector<std::vector<double>> means(S);
    SeededRandom rng(seed);
    std::vector<std::size_t> rs(static_cast<std::size_t>(raters)), ls(static_cast<std::size_t>(lines));
    std::vector<double> sum(S), count(S);
    for (int b = 0; b < rounds; ++b) {
        if ((b & 63) == 0) progress.report(static_cast<double>(b) / rounds);
        for (auto& r : rs) r = rng.below(static_cast<std::size_t>(raters));
        for (auto& l : ls) l = rng.below(static_cast<std::size_t>(lines));
        std::fill(sum.begin(), sum.end(), 0.0);
        std::fill(count.begin(), count.end(), 0.0);
        for (std::size_t r : rs)
            for (std::size_t l : ls) {
                const double* cell = &cells[(r * static_cast<std::size_t>(lines) + l) * S];
                for (std::size_t s = 0; s < S; ++s)
                    if (!std::isnan(cell[s])) {
                        sum[s] += cell[s];
                        count[s] += 1;
                    }
            }
        for (std::size_t s = 0; s < S; ++s)
            if (count[s] > 0) means[s].push_back(sum[s] / count[s]);
    }
    progress.report(1.0);
    BootstrapResult out{std::vector<double>(S, kNaN), std::vector<double>(S, kNaN), std::vector<double>(S, kNaN)};
    for (std::size_t s = 0; s < S; ++s) {
        auto& m = means[s];
        if (m.size() < 2) continue;
        std::sort(m.begin(), m.end());
        out.low[s] = quantileSorted(m, alpha / 2);
        out.high[s] = quantileSorted(m, 1 - alpha / 2);
        double mean = 0, ss = 0;
        for (double x : m) mean += x;
        mean /= static_cast<double>(m.size());
        for (double x : m) ss += (x - mean) * (x - mean);
        out.sd[s] = std::sqrt(ss / static_cast<double>(m.size() - 1));
    }
    return out;
}

}  // namespace earmark::listening
