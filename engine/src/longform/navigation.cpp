#include "earmark/longform/navigation.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

namespace earmark {

std::vector<NavSpan> spansOf(const Tier& tier) {
    std::vector<NavSpan> out;
    out.reserve(tier.intervals.size());
    for (const Interval& i : tier.intervals) out.push_back({i.startS, i.endS, i.label});
    return out;
}

std::vector<NavSpan> spansOf(const std::vector<Finding>& findings) {
    std::vector<NavSpan> out;
    out.reserve(findings.size());
    for (const Finding& f : findings) out.push_back({f.startS, f.endS, f.reason});
    return out;
}

std::optional<std::size_t> stepSpan(const std::vector<NavSpan>& spans, double cursorS, int direction) {
    if (direction == 0 || spans.empty()) return std::nullopt;
    std::vector<std::size_t> order(spans.size());
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        if (spans[a].startS != spans[b].startS) return spans[a].startS < spans[b].startS;
        return spans[a].endS - spans[a].startS < spans[b].endS - spans[b].startS;
    });
    if (direction > 0) {
        for (std::size_t i : order)
            if (spans[i].startS > cursorS + kStepSlackS) return i;
        return std::nullopt;
    }
    for (auto it = order.rbegin(); it != order.rend(); ++it)
        if (spans[*it].startS < cursorS - kStepSlackS) return *it;
    return std::nullopt;
}

std::vector<int> containerOf(const std::vector<NavSpan>& outer, const std::vector<NavSpan>& inner) {
    std::vector<int> out;
    out.reserve(inner.size());
    for (const NavSpan& s : inner) {
        const double mid = 0.5 * (s.startS + s.endS);
        int found = -1;
        for (std::size_t k = 0; k < outer.size() && found < 0; ++k)
            if (outer[k].startS <= mid && mid <= outer[k].endS) found = static_cast<int>(k);
        out.push_back(found);
    }
    return out;
}

ViewSpan revealSpan(ViewSpan visible, ViewSpan span, double durationS) {
    if (span.endS < span.startS) std::swap(span.startS, span.endS);
    if (visible.startS <= span.startS && span.endS <= visible.endS) return visible;
    const double width = visible.endS - visible.startS;
    const double length = span.endS - span.startS;
    ViewSpan out;
    if (length <= 0.8 * width) {
        const double centre = 0.5 * (span.startS + span.endS);
        out = {centre - 0.5 * width, centre + 0.5 * width};
    } else {
        const double pad = std::max(0.2, 0.1 * length);
        out = {span.startS - pad, span.endS + pad};
    }
    const double w = out.endS - out.startS;
    if (durationS > 0.0) {
        if (w >= durationS) return {0.0, durationS};
        if (out.startS < 0.0) out = {0.0, w};
        if (out.endS > durationS) out = {durationS - w, durationS};
    }
    return out;
}

namespace {

DriftTrace trace(const LongTakeSeries& series, const char* measure, const char* unit, double WindowMeasures::*field) {
    DriftTrace t{measure, unit, {}, {}, 0.0, 0.0};
    double lo = std::numeric_limits<double>::infinity(), hi = -lo;
    for (const WindowMeasures& w : series.windows) {
        const double v = w.measured ? w.*field : std::numeric_limits<double>::quiet_NaN();
        t.timesS.push_back(0.5 * (w.startS + w.endS));
        t.values.push_back(v);
        if (std::isfinite(v)) {
            lo = std::min(lo, v);
            hi = std::max(hi, v);
        }
    }
    if (lo <= hi) {
        t.low = lo;
        t.high = hi;
    }
    return t;
}

}  // namespace

std::vector<DriftTrace> driftTraces(const LongTakeSeries& series) {
    return {trace(series, "speech_level_dbfs", "dBFS", &WindowMeasures::speechLevelDb),
            trace(series, "f0_median_hz", "Hz", &WindowMeasures::f0MedianHz),
            trace(series, "f0_range_st", "st", &WindowMeasures::f0RangeSt),
            trace(series, "articulation_rate", "syl/s", &WindowMeasures::articulationRate),
            trace(series, "timbre_distance", "nats", &WindowMeasures::timbreDistance)};
}

std::string driftTraceOf(FindingKind kind) {
    switch (kind) {
    case FindingKind::Seam: return {};
    case FindingKind::LevelDrift: return "speech_level_dbfs";
    case FindingKind::PitchDrift: return "f0_median_hz";
    case FindingKind::MonotoneStretch: return "f0_range_st";
    case FindingKind::RateDrift: return "articulation_rate";
    case FindingKind::TimbreShift: return "timbre_distance";
    }
    return {};
}

}  // namespace earmark
