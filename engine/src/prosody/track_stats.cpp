#include "track_stats.hpp"

#include <algorithm>
#include <cmath>

namespace earmark::detail {

FrameRange framesIn(double hopSeconds, std::size_t frames, double startS, double endS) {
    if (!(hopSeconds > 0) || !(endS > startS)) return {};
    const auto n = static_cast<double>(frames);
    const double b = std::clamp(std::ceil(startS / hopSeconds - 1e-9), 0.0, n);
    const double e = std::clamp(std::ceil(endS / hopSeconds - 1e-9), 0.0, n);
    return {static_cast<std::size_t>(b), static_cast<std::size_t>(std::max(b, e))};
}

double semitones(double aHz, double bHz) { return 12.0 * std::log2(aHz / bHz); }

F0Stats f0Stats(const PitchTrack& pitch, double startS, double endS) {
    F0Stats s;
    const auto r = framesIn(pitch.hopSeconds, pitch.size(), startS, endS);
    s.frames = static_cast<int>(r.end - r.begin);
    double sum = 0, st = 0, t = 0, sumT = 0, sumS = 0, sumTT = 0, sumTS = 0;
    for (std::size_t i = r.begin; i < r.end; ++i) {
        const double f = pitch.f0Hz[i];
        if (!(f > 0)) continue;
        t = pitch.timeSeconds(i);
        if (s.voiced == 0 || f < s.minHz) s.minHz = f;
        if (s.voiced == 0 || f > s.maxHz) {
            s.maxHz = f;
            s.maxAtS = t;
        }
        ++s.voiced;
        sum += f;
        st = semitones(f, 100.0);
        t -= startS;  // regress on time from the range start: better conditioned late in a take
        sumT += t;
        sumS += st;
        sumTT += t * t;
        sumTS += t * st;
    }
    if (s.voiced == 0) return s;
    s.meanHz = sum / s.voiced;
    const double n = s.voiced;
    const double denom = n * sumTT - sumT * sumT;
    if (s.voiced >= 2 && denom > 1e-12 * n * sumTT) s.slopeStPerS = (n * sumTS - sumT * sumS) / denom;
    return s;
}

std::optional<double> energyMeanDb(const EnergyTrack& energy, double startS, double endS) {
    const auto r = framesIn(energy.hopSeconds, energy.db.size(), startS, endS);
    if (r.end <= r.begin) return std::nullopt;
    double power = 0;
    for (std::size_t i = r.begin; i < r.end; ++i) power += std::pow(10.0, energy.db[i] / 10.0);
    return 10.0 * std::log10(power / static_cast<double>(r.end - r.begin));
}

std::optional<double> energyMaxDb(const EnergyTrack& energy, double startS, double endS) {
    const auto r = framesIn(energy.hopSeconds, energy.db.size(), startS, endS);
    if (r.end <= r.begin) return std::nullopt;
    return *std::max_element(energy.db.begin() + static_cast<long>(r.begin), energy.db.begin() + static_cast<long>(r.end));
}

std::vector<float> voicedF0(const PitchTrack& pitch, double startS, double endS) {
    std::vector<float> v;
    const auto r = framesIn(pitch.hopSeconds, pitch.size(), startS, endS);
    for (std::size_t i = r.begin; i < r.end; ++i)
        if (pitch.f0Hz[i] > 0) v.push_back(pitch.f0Hz[i]);
    return v;
}

double percentile(std::vector<float> v, double p) {
    std::sort(v.begin(), v.end());
    const double pos = p / 100.0 * static_cast<double>(v.size() - 1);
    const auto lo = static_cast<std::size_t>(std::floor(pos));
    const auto hi = std::min(lo + 1, v.size() - 1);
    return v[lo] + (pos - static_cast<double>(lo)) * (v[hi] - v[lo]);
}

}  // namespace earmark::detail
