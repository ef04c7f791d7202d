#include "earmark/level/energy.hpp"

#include "earmark/core/error.hpp"
#include "earmark/dsp/frames.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

namespace {

double sumOfSquares(const float* x, std::int64_t n) {
    double acc[4] = {0.0, 0.0, 0.0, 0.0};  // four chains: no wait on one add per sample
    std::int64_t i = 0;
    for (; i + 4 <= n; i += 4)
        for (int k = 0; k < 4; ++k) acc[k] += static_cast<double>(x[i + k]) * x[i + k];
    for (; i < n; ++i) acc[0] += static_cast<double>(x[i]) * x[i];
    return (acc[0] + acc[1]) + (acc[2] + acc[3]);
}

// Sum of x[0..end)², compensated (Neumaier) so that the difference of two such
// sums keeps the frame's own precision: a plain running sum over a long loud
// take swallows the squares of a later quiet passage (after a minute of full
// scale, every sample below ≈ −96 dBFS adds nothing).
//
// Frame starts lie on one grid (≡ −win/2 mod hop), frame ends on another
// (≡ win − win/2). Every running sum stops at every point of both grids, so two
// of them add the same chunks in the same order and agree bit for bit where
// they meet: a frame of digital silence gives exactly 0.
struct RunningSquares {
    const float* x;
    std::int64_t hop;
    std::int64_t startPhase;  // in [0, hop)
    std::int64_t endPhase;    // in [0, hop)
    std::int64_t end = 0;
    double sum = 0.0;
    double carry = 0.0;  // rounding error of `sum`, accumulated

    // Smallest grid point after p.
    std::int64_t nextStop(std::int64_t p) const {
        const auto after = [&](std::int64_t phase) { return p + 1 + ((phase - p - 1) % hop + hop) % hop; };
        return std::min(after(startPhase), after(endPhase));
    }

    void advanceTo(std::int64_t to) {  // `to` is 0, the signal's end, or a grid point
        while (end < to) {
            const std::int64_t stop = std::min(to, nextStop(end));
            const double v = sumOfSquares(x + end, stop - end);
            const double t = sum + v;
            carry += std::fabs(sum) >= std::fabs(v) ? (sum - t) + v : (v - t) + sum;
            sum = t;
            end = stop;
        }
    }
};

}  // namespace

EnergyTrack analyseEnergy(const Signal& signal, const EnergyParams& params, Progress progress) {
    if (!(params.hopSeconds > 0)) throw ParamError("EnergyParams.hopSeconds", "must be positive");
    if (!(params.windowSeconds > 0)) throw ParamError("EnergyParams.windowSeconds", "must be positive");
    if (!(signal.sampleRate > 0)) throw ParamError("Signal.sampleRate", "must be positive");
    const int hop = hopSamples(params.hopSeconds, signal.sampleRate);
    const int win = std::max(1, static_cast<int>(std::lround(params.windowSeconds * signal.sampleRate)));
    const FrameLayout layout(static_cast<std::int64_t>(signal.size()), win, hop);

    EnergyTrack track;
    track.hopSeconds = static_cast<double>(hop) / signal.sampleRate;
    const std::int64_t frames = layout.count();
    track.db.resize(static_cast<std::size_t>(frames));

    const auto n = static_cast<std::int64_t>(signal.size());
    const double floorPower = std::pow(10.0, params.floorDb / 10.0);
    // Frame sum = (squares before the frame's end) − (squares before its start);
    // both bounds only move forward, so each sample is read twice in all
    // whatever the window.
    const std::int64_t startPhase = ((-(win / 2)) % hop + hop) % hop;
    const std::int64_t endPhase = ((win - win / 2) % hop + hop) % hop;
    RunningSquares lead{signal.samples.data(), hop, startPhase, endPhase};
    RunningSquares trail{signal.samples.data(), hop, startPhase, endPhase};
    for (std::int64_t f = 0; f < frames; ++f) {
        const std::int64_t a = std::clamp<std::int64_t>(layout.firstSample(f), 0, n);
        const std::int64_t b = std::clamp<std::int64_t>(layout.firstSample(f) + win, 0, n);
        lead.advanceTo(b);
        trail.advanceTo(a);
        const double sum = (lead.sum - trail.sum) + (lead.carry - trail.carry);
        const double power = std::max(0.0, sum) / win;  // zeros outside count
        track.db[static_cast<std::size_t>(f)] =
            static_cast<float>(power > floorPower ? 10.0 * std::log10(power) : params.floorDb);
        if ((f & 0xFFFF) == 0) progress.report(static_cast<double>(f) / frames);
    }
    progress.report(1.0);
    return track;
}

}  // namespace earmark
