#include "earmark/align/boundary_refine.hpp"

#include "earmark/core/error.hpp"
#include "earmark/level/energy.hpp"

#include <algorithm>
#include <cmath>
#include <optional>

namespace earmark {
namespace {

struct EnergyView {
    EnergyTrack track;
    double threshold = 0.0;  // onset/offset level, dB

    int frames() const { return static_cast<int>(track.db.size()); }
    double time(int f) const { return f * track.hopSeconds; }
    int frameAt(double t) const {
        return std::clamp(static_cast<int>(std::lround(t / track.hopSeconds)), 0, std::max(0, frames() - 1));
    }
};

EnergyView energyOf(const Signal& s, const RefineParams& p) {
    EnergyParams ep;
    ep.hopSeconds = p.hopSeconds;
    ep.windowSeconds = p.frameSeconds;
    EnergyView v{analyseEnergy(s, ep), 0.0};
    if (v.track.db.empty()) return v;
    std::vector<float> sorted = v.track.db;
    std::sort(sorted.begin(), sorted.end());
    const auto pct = [&](double q) { return sorted[static_cast<std::size_t>(q * (sorted.size() - 1))]; };
    v.threshold = std::max(pct(0.99) - p.edgeBelowLevelDb, pct(0.10) + 6.0);
    return v;
}

// Time of the landmark of `kind` nearest to t within ±window, if any.
std::optional<double> landmark(const EnergyView& e, double t, BoundaryKind kind, const RefineParams& p) {
    if (e.frames() < 3) return std::nullopt;
    const int w = std::max(1, static_cast<int>(std::lround(p.windowSeconds / e.track.hopSeconds)));
    const int c = e.frameAt(t);
    const int lo = std::max(1, c - w), hi = std::min(e.frames() - 1, c + w);
    const auto& db = e.track.db;
    std::optional<double> best;
    double bestDistance = 1e9;
    const auto consider = [&](double at) {
        if (std::fabs(at - t) < bestDistance) bestDistance = std::fabs(at - t), best = at;
    };
    if (kind == BoundaryKind::Join) {
        // The nearest dip: a local minimum minDipDb below the highest frame on each side.
        for (int f = lo; f < hi; ++f) {
            if (!(db[f] <= db[f - 1] && db[f] < db[f + 1])) continue;
            const float left = *std::max_element(db.begin() + std::max(0, f - w), db.begin() + f);
            const float right = *std::max_element(db.begin() + f + 1, db.begin() + std::min(e.frames(), f + w + 1));
            if (std::min(left, right) - db[f] >= p.minDipDb) consider(e.time(f));
        }
        return best;
    }
    const double thr = e.threshold;
    for (int f = lo; f <= hi; ++f) {
        const double a = db[f - 1], b = db[f];
        const bool up = a <= thr && b > thr, down = a > thr && b <= thr;
        if ((kind == BoundaryKind::Onset && up) || (kind == BoundaryKind::Offset && down)) {
            const double frac = (thr - a) / (b - a);  // linear crossing between frame centres
            consider(e.time(f - 1) + frac * e.track.hopSeconds);
        }
    }
    return best;
}

}  // namespace

void RefineParams::validate() const {
    if (!(windowSeconds > 0)) throw ParamError("RefineParams.windowSeconds", "must be positive");
    if (!(hopSeconds > 0)) throw ParamError("RefineParams.hopSeconds", "must be positive");
    if (!(frameSeconds > 0)) throw ParamError("RefineParams.frameSeconds", "must be positive");
    if (!(minDipDb >= 0)) throw ParamError("RefineParams.minDipDb", "must be >= 0");
    if (!(edgeBelowLevelDb > 0)) throw ParamError("RefineParams.edgeBelowLevelDb", "must be positive");
}

std::vector<double> refineBoundaries(const Signal& take, const Signal& reference,
                                     const std::vector<BoundaryToRefine>& boundaries, const RefineParams& params) {
    params.validate();
    const EnergyView takeEnergy = energyOf(take, params);
    const EnergyView refEnergy = energyOf(reference, params);
    std::vector<double> out;
    out.reserve(boundaries.size());
    for (const BoundaryToRefine& b : boundaries) {
        const auto inRef = landmark(refEnergy, b.referenceS, b.kind, params);
        if (!inRef) {
            out.push_back(b.takeS);
            continue;
        }
        const double offset = b.referenceS - *inRef;
        // Look for the take's landmark where the reference's would land.
        const auto inTake = landmark(takeEnergy, b.takeS - offset, b.kind, params);
        out.push_back(inTake ? *inTake + offset : b.takeS);
    }
    return out;
}

}  // namespace earmark
