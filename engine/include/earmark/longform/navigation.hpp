// Moving through a long take: stepping from the cursor to the next or
// previous span of a list (sentences, paragraphs, long-form findings), the
// view that shows a span, and the per-window series as traces to draw.
//
// Stepping (stepSpan): spans are taken in order of start time (ties: the
// shorter first). "Next" is the first span starting after the cursor
// (by more than kStepSlackS); "previous" is the last span starting before it
// (by more than kStepSlackS), so from the middle of a sentence "previous"
// goes back to that sentence's start, and from its start to the one before.
// Spans with an empty label count (a finding has none).
//
// Thread-safety: pure functions.
#pragma once

#include "earmark/longform/findings.hpp"
#include "earmark/longform/long_take.hpp"
#include "earmark/tiers/tier.hpp"

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace earmark {

inline constexpr double kStepSlackS = 0.001;  // a cursor this close to a span's start is at it

struct NavSpan {
    double startS = 0.0, endS = 0.0;
    std::string label;
};

std::vector<NavSpan> spansOf(const Tier& tier);
std::vector<NavSpan> spansOf(const std::vector<Finding>& findings);  // label: the finding's reason

// Index (into `spans`) of the next (direction > 0) or previous (direction < 0)
// span from `cursorS`; nullopt when there is none that way.
std::optional<std::size_t> stepSpan(const std::vector<NavSpan>& spans, double cursorS, int direction);

// For each span of `inner` (sentences), the index of the span of `outer`
// (paragraphs) holding its middle, or -1.
std::vector<int> containerOf(const std::vector<NavSpan>& outer, const std::vector<NavSpan>& inner);

struct ViewSpan {
    double startS = 0.0, endS = 0.0;
};

// The visible range after jumping to [startS, endS]: `visible` unchanged when
// it holds the span; otherwise the same width centred on the span when the
// span fits in 80 % of it, else the span with a tenth of its length (at least
// 0.2 s) on each side. Clamped to [0, durationS] keeping the width.
ViewSpan revealSpan(ViewSpan visible, ViewSpan span, double durationS);

// One per-window measure over the take, as points at the windows' centres
// (NaN where a window is not measured).
struct DriftTrace {
    std::string measure;       // "speech_level_dbfs", "f0_median_hz", "f0_range_st", "articulation_rate", "timbre_distance"
    std::string unit;          // "dBFS", "Hz", "st", "syl/s", "nats"
    std::vector<double> timesS;
    std::vector<double> values;
    double low = 0.0, high = 0.0;  // range of the finite values (low == high == 0 without any)
};

std::vector<DriftTrace> driftTraces(const LongTakeSeries& series);

// The trace a finding of this kind is read on ("" for a seam: it is a point
// on all of them): level-drift → speech level, pitch-drift → F0 median,
// monotone-stretch → F0 range, rate-drift → rate, timbre-shift → timbre.
std::string driftTraceOf(FindingKind kind);

}  // namespace earmark
