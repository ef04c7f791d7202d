#include "earmark/pitch/noise_floor.hpp"

#include <cmath>
#include <limits>

namespace earmark {

namespace {

// The p-th percentile (0 … 1) of v, reordering v.
float percentile(std::vector<float>& v, double p) {
    const auto k = static_cast<std::size_t>(std::clamp(p, 0.0, 1.0) * static_cast<double>(v.size() - 1));
    std::nth_element(v.begin(), v.begin() + static_cast<std::ptrdiff_t>(k), v.end());
    return v[k];
}

}  // namespace

double steadyNoiseFloorDb(std::span<const float> energyDb, const NoiseFloorRule& rule) {
    constexpr double kNone = -std::numeric_limits<double>::infinity();
    if (energyDb.empty()) return kNone;
    std::vector<float> sorted(energyDb.begin(), energyDb.end());
    const double floorDb = percentile(sorted, rule.floorPercentile);
    const double lowDb = percentile(sorted, rule.checkPercentile);
    return floorDb - lowDb <= rule.maxSpreadDb ? floorDb : kNone;
}

std::vector<float> noiseShares(std::span<const float> energyDb, double floorDb, const NoiseFloorRule& rule) {
    std::vector<float> out(energyDb.size(), 0.0f);
    if (!std::isfinite(floorDb)) return out;
    for (std::size_t i = 0; i < energyDb.size(); ++i) {
        const double excessDb = energyDb[i] - floorDb;
        if (excessDb >= rule.minExcessDb) out[i] = static_cast<float>(std::pow(10.0, -excessDb / 10.0));
    }
    return out;
}

}  // namespace earmark
