#include "earmark/agreement/nominal.hpp"

#include "earmark/core/error.hpp"
#include "earmark/core/numeric.hpp"

#include <cmath>
#include <limits>
#include <string>

namespace earmark::agreement {
namespace {

// Category codes run 0 … categories − 1; returns that count.
int countCategories(const RatingTable& table) {
    int categories = 0;
    const std::size_t raters = table.empty() ? 0 : table.front().size();
    for (std::size_t u = 0; u < table.size(); ++u) {
        if (table[u].size() != raters)
            throw ParamError("RatingTable", "unit " + std::to_string(u) + " has " + std::to_string(table[u].size()) +
                                                " cells; unit 0 has " + std::to_string(raters));
        for (const auto& cell : table[u]) {
            if (!cell) continue;
            if (*cell < 0) throw ParamError("RatingTable", "category code " + std::to_string(*cell) + " is negative");
            categories = std::max(categories, *cell + 1);
        }
    }
    return categories;
}

// counts[u][c]: how many raters put unit u in category c (units with ≥ 2 ratings only).
std::vector<std::vector<double>> pairableCounts(const RatingTable& table, int categories) {
    std::vector<std::vector<double>> out;
    for (const auto& row : table) {
        std::vector<double> counts(static_cast<std::size_t>(categories), 0.0);
        int rated = 0;
        for (const auto& cell : row)
            if (cell) {
                counts[static_cast<std::size_t>(*cell)] += 1.0;
                ++rated;
            }
        if (rated >= 2) out.push_back(std::move(counts));
    }
    return out;
}

ChanceCorrected corrected(double observed, double expected, int units) {
    const bool defined = units > 0 && expected < 1.0;
    return {defined ? (observed - expected) / (1.0 - expected) : kNaN, observed, expected, units};
}

}  // namespace

ChanceCorrected cohenKappa(const std::vector<std::optional<int>>& raterA, const std::vector<std::optional<int>>& raterB) {
    if (raterA.size() != raterB.size())
        throw ParamError("cohenKappa", "the raters' columns differ in length (" + std::to_string(raterA.size()) +
                                           " and " + std::to_string(raterB.size()) + ")");
    RatingTable table;
    for (std::size_t u = 0; u < raterA.size(); ++u)
        if (raterA[u] && raterB[u]) table.push_back({raterA[u], raterB[u]});
    const int categories = countCategories(table);
    std::vector<double> shareA(static_cast<std::size_t>(categories), 0.0), shareB = shareA;
    double alike = 0.0;
    for (const auto& row : table) {
        shareA[static_cast<std::size_t>(*row[0])] += 1.0;
        shareB[static_cast<std::size_t>(*row[1])] += 1.0;
        if (*row[0] == *row[1]) alike += 1.0;
    }
    const double n = static_cast<double>(table.size());
    if (table.empty()) return {kNaN, kNaN, kNaN, 0};
    double expected = 0.0;
    for (int c = 0; c < categories; ++c) expected += (shareA[c] / n) * (shareB[c] / n);
    return corrected(alike / n, expected, static_cast<int>(table.size()));
}

ChanceCorrected fleissKappa(const RatingTable& table) {
    const int categories = countCategories(table);
    const auto counts = pairableCounts(table, categories);
    if (counts.empty()) return {kNaN, kNaN, kNaN, 0};
    std::vector<double> totals(static_cast<std::size_t>(categories), 0.0);
    double ratings = 0.0, sumP = 0.0;
    for (const auto& unit : counts) {
        double n = 0.0, pairsAlike = 0.0;
        for (int c = 0; c < categories; ++c) {
            n += unit[c];
            pairsAlike += unit[c] * (unit[c] - 1.0);
            totals[c] += unit[c];
        }
        ratings += n;
        sumP += pairsAlike / (n * (n - 1.0));
    }
    double expected = 0.0;
    for (double t : totals) expected += (t / ratings) * (t / ratings);
    return corrected(sumP / static_cast<double>(counts.size()), expected, static_cast<int>(counts.size()));
}

ChanceCorrected krippendorffAlphaNominal(const RatingTable& table) {
    const int categories = countCategories(table);
    const auto counts = pairableCounts(table, categories);
    if (counts.empty()) return {kNaN, kNaN, kNaN, 0};
    // Coincidences: o_cc (alike) summed, and n_c, the margins of the coincidence matrix.
    std::vector<double> margins(static_cast<std::size_t>(categories), 0.0);
    double alike = 0.0, n = 0.0;
    for (const auto& unit : counts) {
        double m = 0.0;
        for (double v : unit) m += v;
        for (int c = 0; c < categories; ++c) {
            alike += unit[c] * (unit[c] - 1.0) / (m - 1.0);
            margins[c] += unit[c];
        }
        n += m;
    }
    // D_o = Σ_{c≠k} o_ck / n = (n − Σ_c o_cc) / n; D_e = Σ_{c≠k} n_c n_k / (n(n − 1)).
    double sumSquares = 0.0;
    for (double nc : margins) sumSquares += nc * nc;
    const double disagreeObserved = (n - alike) / n;
    const double disagreeExpected = (n * n - sumSquares) / (n * (n - 1.0));
    const int units = static_cast<int>(counts.size());
    if (disagreeExpected <= 0.0) return {kNaN, 1.0 - disagreeObserved, 1.0 - disagreeExpected, units};
    return {1.0 - disagreeObserved / disagreeExpected, 1.0 - disagreeObserved, 1.0 - disagreeExpected, units};
}

}  // namespace earmark::agreement
