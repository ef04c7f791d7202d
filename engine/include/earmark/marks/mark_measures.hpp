// The measure snapshot a mark carries: the prosody module's measures of the
// marked span (earmark/prosody/span_measures.hpp) as a flat name → number map.
//
// Names (a measure undefined for the span is left out):
//   duration_s         span length, seconds
//   f0_mean_hz, f0_min_hz, f0_max_hz     over voiced frames, Hz
//   f0_range_st        12·log2(max/min), semitones
//   f0_slope_st_per_s  least-squares F0 slope, semitones per second
//   energy_mean_db     10·log10(mean frame power), dBFS
//   syllables_per_s    speaking rate over the span (when the span is not a pause)
//   pause_s            length of the pause the span lies in
// Pure functions; thread-safe.
#pragma once

#include "earmark/analysis/take_analysis.hpp"
#include "earmark/marks/mark.hpp"
#include "earmark/prosody/prosody_context.hpp"
#include "earmark/prosody/span_measures.hpp"

namespace earmark {

MeasureSnapshot toMeasureSnapshot(const SpanMeasures& measures);

// measureSpan on the context, as a snapshot. Throws ParamError when the span
// is empty inside the take.
MeasureSnapshot measureMarkSpan(const ProsodyContext& context, double startSeconds, double endSeconds);

// Analysis settings for mark snapshots: the defaults with only the F0 and
// energy tracks (what the prosody measures read).
AnalysisParams markMeasureAnalysisParams();

}  // namespace earmark
