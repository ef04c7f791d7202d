#include "earmark/widgets/tier_editing.hpp"

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

namespace {
constexpr double kSameTime = 1e-6;  // s: boundaries closer than this are one
}

std::vector<TierBoundary> tierBoundaries(const Tier& tier) {
    std::vector<TierBoundary> out;
    const auto& v = tier.intervals;
    for (std::size_t i = 0; i < v.size(); ++i) {
        const int idx = static_cast<int>(i);
        if (!out.empty() && std::abs(out.back().time - v[i].startS) < kSameTime && out.back().startOf < 0)
            out.back().startOf = idx;
        else
            out.push_back({v[i].startS, -1, idx});
        out.push_back({v[i].endS, idx, -1});
    }
    return out;
}

int intervalAt(const Tier& tier, double t) {
    for (std::size_t i = 0; i < tier.intervals.size(); ++i)
        if (t >= tier.intervals[i].startS && t < tier.intervals[i].endS) return static_cast<int>(i);
    return -1;
}

std::optional<Tier> moveBoundary(const Tier& tier, const TierBoundary& b, double time, double durationS) {
    const auto& v = tier.intervals;
    const int n = static_cast<int>(v.size());
    if ((b.endOf < 0 && b.startOf < 0) || b.endOf >= n || b.startOf >= n) return std::nullopt;
    double lo = 0.0, hi = durationS > 0 ? durationS : 1e300;
    if (b.endOf >= 0) lo = v[static_cast<std::size_t>(b.endOf)].startS + kMinIntervalSeconds;
    else if (b.startOf > 0) lo = v[static_cast<std::size_t>(b.startOf - 1)].endS;
    if (b.startOf >= 0) hi = v[static_cast<std::size_t>(b.startOf)].endS - kMinIntervalSeconds;
    else if (b.endOf + 1 < n) hi = v[static_cast<std::size_t>(b.endOf + 1)].startS;
    if (!(hi >= lo)) return std::nullopt;
    const double t = std::clamp(time, lo, hi);
    Tier out = tier;
    if (b.endOf >= 0) out.intervals[static_cast<std::size_t>(b.endOf)].endS = t;
    if (b.startOf >= 0) out.intervals[static_cast<std::size_t>(b.startOf)].startS = t;
    return out;
}

std::optional<Tier> splitAt(const Tier& tier, double t) {
    const int i = intervalAt(tier, t);
    if (i < 0) return std::nullopt;
    const Interval& in = tier.intervals[static_cast<std::size_t>(i)];
    if (t - in.startS < kMinIntervalSeconds || in.endS - t < kMinIntervalSeconds) return std::nullopt;
    Tier out = tier;
    Interval right{t, in.endS, {}, std::nullopt};
    out.intervals[static_cast<std::size_t>(i)].endS = t;
    out.intervals.insert(out.intervals.begin() + i + 1, right);
    return out;
}

std::optional<Tier> mergeWithNext(const Tier& tier, int index, const std::string& joiner) {
    if (index < 0 || index + 1 >= static_cast<int>(tier.intervals.size())) return std::nullopt;
    Tier out = tier;
    Interval& a = out.intervals[static_cast<std::size_t>(index)];
    const Interval& b = tier.intervals[static_cast<std::size_t>(index + 1)];
    a.endS = b.endS;
    if (a.label.empty()) a.label = b.label;
    else if (!b.label.empty()) a.label += joiner + b.label;
    if (a.confidence && b.confidence) a.confidence = std::min(*a.confidence, *b.confidence);
    else a.confidence.reset();
    out.intervals.erase(out.intervals.begin() + index + 1);
    return out;
}

std::optional<Tier> relabel(const Tier& tier, int index, const std::string& label) {
    if (index < 0 || index >= static_cast<int>(tier.intervals.size())) return std::nullopt;
    if (tier.intervals[static_cast<std::size_t>(index)].label == label) return std::nullopt;
    Tier out = tier;
    out.intervals[static_cast<std::size_t>(index)].label = label;
    return out;
}

std::optional<Tier> insertInterval(const Tier& tier, double start, double end) {
    if (end - start < kMinIntervalSeconds || start < 0) return std::nullopt;
    std::size_t pos = 0;
    for (const Interval& in : tier.intervals) {
        if (in.endS <= start + kSameTime) {
            ++pos;
            continue;
        }
        if (in.startS < end - kSameTime) return std::nullopt;  // overlaps
        break;
    }
    Tier out = tier;
    out.intervals.insert(out.intervals.begin() + static_cast<std::ptrdiff_t>(pos), Interval{start, end, {}, std::nullopt});
    return out;
}

std::optional<Tier> removeInterval(const Tier& tier, int index) {
    if (index < 0 || index >= static_cast<int>(tier.intervals.size())) return std::nullopt;
    Tier out = tier;
    out.intervals.erase(out.intervals.begin() + index);
    return out;
}

}  // namespace earmark::widgets
