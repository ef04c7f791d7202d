#include "earmark/marks/mark_measures.hpp"

#include <cmath>

namespace earmark {

MeasureSnapshot toMeasureSnapshot(const SpanMeasures& m) {
    MeasureSnapshot s;
    s["duration_s"] = m.durationS;
    auto put = [&](const char* name, const std::optional<double>& v) {
        if (v && std::isfinite(*v)) s[name] = *v;
    };
    put("f0_mean_hz", m.f0MeanHz);
    put("f0_min_hz", m.f0MinHz);
    put("f0_max_hz", m.f0MaxHz);
    put("f0_range_st", m.f0RangeSt);
    put("f0_slope_st_per_s", m.f0SlopeStPerS);
    put("energy_mean_db", m.energyMeanDb);
    put("syllables_per_s", m.syllablesPerS);
    put("pause_s", m.pauseS);
    return s;
}

MeasureSnapshot measureMarkSpan(const ProsodyContext& context, double startSeconds, double endSeconds) {
    return toMeasureSnapshot(measureSpan(context, startSeconds, endSeconds));
}

AnalysisParams markMeasureAnalysisParams() {
    AnalysisParams p;
    p.tracks = TrackSelection{.f0 = true, .energy = true, .mel = false, .loudness = false};
    return p;
}

}  // namespace earmark
