// Time ↔ pixel maths shared by every lane, and the range operations (zoom,
// scroll, clamp) the view state applies. Plain C++ with no Qt, so it can be
// tested on its own.
//
// Times are seconds from the start of the take; x is in device-independent
// pixels, measured from the left edge of a lane's plotting area.
#pragma once

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

struct TimeRange {
    double start = 0.0;  // s
    double end = 0.0;    // s, > start for a non-empty range
    double span() const { return end - start; }
    bool contains(double t) const { return t >= start && t <= end; }
    bool operator==(const TimeRange&) const = default;
};

// Linear map between a time range and a pixel width.
struct TimeMapping {
    TimeRange range;
    double width = 1.0;  // px of the plotting area

    double pixelsPerSecond() const { return range.span() > 0 ? width / range.span() : 0.0; }
    double secondsPerPixel() const { return width > 0 ? range.span() / width : 0.0; }
    double timeToX(double t) const { return (t - range.start) * pixelsPerSecond(); }
    double xToTime(double x) const { return range.start + x * secondsPerPixel(); }
};

// Limits on what a view may show.
struct RangeLimits {
    double duration = 0.0;         // s; the take's length (the view never goes past it)
    double minSpanSeconds = 0.002; // deepest zoom: a few dozen samples across a lane
};

// Moves `r` (keeping its span where possible) so it lies inside [0, duration];
// spans shorter than minSpanSeconds are widened about their centre, longer
// than the take are cut to the take.
inline TimeRange clampRange(TimeRange r, const RangeLimits& limits) {
    const double duration = std::max(limits.duration, 0.0);
    double span = std::clamp(r.span(), std::min(limits.minSpanSeconds, duration), duration);
    if (!(span > 0.0)) return {0.0, duration};
    double centre = 0.5 * (r.start + r.end);
    double start = centre - 0.5 * span;
    start = std::clamp(start, 0.0, duration - span);
    return {start, start + span};
}

// Zooms by `factor` (> 1 zooms in, < 1 out) keeping the time under `anchor`
// (s) at the same place on screen, then clamps.
inline TimeRange zoomAbout(TimeRange r, double factor, double anchor, const RangeLimits& limits) {
    if (!(factor > 0.0) || !(r.span() > 0.0)) return clampRange(r, limits);
    const double duration = std::max(limits.duration, 0.0);
    const double span = std::clamp(r.span() / factor, std::min(limits.minSpanSeconds, duration), duration);
    const double frac = std::clamp((anchor - r.start) / r.span(), 0.0, 1.0);
    double start = anchor - frac * span;
    start = std::clamp(start, 0.0, std::max(duration - span, 0.0));
    return {start, start + span};
}

// Shifts by `seconds` (positive = later), clamped to the take, span kept.
inline TimeRange scrollBy(TimeRange r, double seconds, const RangeLimits& limits) {
    return clampRange({r.start + seconds, r.end + seconds}, limits);
}

// Orders two times into a range (a drag may go either way).
inline TimeRange spanOf(double a, double b) { return {std::min(a, b), std::max(a, b)}; }

// A pleasant tick step (1, 2 or 5 × 10^k) so that ticks are at least
// `minStep` apart.
inline double niceStep(double minStep) {
    if (!(minStep > 0.0)) return 1.0;
    const double p = std::pow(10.0, std::floor(std::log10(minStep)));
    for (double m : {1.0, 2.0, 5.0, 10.0})
        if (m * p >= minStep) return m * p;
    return 10.0 * p;
}

}  // namespace earmark::widgets
