// Findings over a long take: long-form suspects with a time span, the
// measured value and the threshold it crossed (rules: longform_rules.hpp).
//
// - seam: one per join and measure past its threshold (seams.hpp); level
//   and envelope steps keep only the largest within contextSeconds (a step
//   shows, weaker, at the neighbouring joins too). Span: the pause holding
//   the join (a click: ±5 ms of it).
// - level-drift, pitch-drift, rate-drift: a "hinge" least-squares fit of the
//   window series (level constant up to t0, then linear; t0 first on the
//   window centres, at least driftMinSpanSeconds before the end, then on a
//   0.1 s grid between the best centre's neighbours); the change over
//   [t0, end] must pass the rule and the Theil–Sen slope of the windows after
//   t0 must be significant (95 %) with the same sign. Span [t0, end of the
//   last window]; a knee at the first centre is a plain line, spanning from
//   the first window's start.
//   Value: dB of loudness, semitones of F0 median, percent of the
//   articulation rate at t0. Windows of a timbre shift are left out.
// - timbre-shift: speech segments (between pauses) whose timbre model
//   (timbre.hpp) is far from the take's voice — the pooled model of the
//   segments no farther than the median, fitted twice — by more than
//   minRatio × the median segment's distance; runs of such segments at least
//   minSeconds long. Value: the run's median ratio.
// - monotone-stretch: windows whose F0 range is below maxRangeSt, joined,
//   then widened or narrowed to whole speech segments by each segment's own
//   range; stretches at least minSeconds long. Value: the stretch's F0 range.
//
// Thread-safety: pure functions.
#pragma once

#include "earmark/longform/long_take.hpp"
#include "earmark/longform/longform_rules.hpp"
#include "earmark/longform/seams.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark {

enum class FindingKind { Seam, LevelDrift, PitchDrift, RateDrift, TimbreShift, MonotoneStretch };

// "seam", "level-drift", "pitch-drift", "rate-drift", "timbre-shift", "monotone-stretch".
const char* findingName(FindingKind kind);
std::optional<FindingKind> findingKindFromName(const std::string& name);

struct Finding {
    FindingKind kind = FindingKind::Seam;
    std::string measure;      // e.g. "level_step_db", "click_db", "loudness_change_db"
    std::string unit;         // "dB", "st", "%", "ratio"
    double startS = 0.0, endS = 0.0;
    double value = 0.0;       // the measured value (signed where a direction means something)
    double threshold = 0.0;   // the rule's limit (compared with |value|)
    std::string reason;       // one line in words
};

std::vector<Finding> findSeams(const std::vector<JoinMeasures>& joins, const LongformRules& rules);
// Windows overlapping an `excluded` span (e.g. a timbre shift: another
// voice's level and F0) are left out of the drift fits.
std::vector<Finding> findDrifts(const LongTakeSeries& series, const LongformRules& rules,
                                const std::vector<Finding>& excluded = {});
std::vector<Finding> findTimbreShifts(const LongTakeTracks& tracks, const LongformRules& rules);
std::vector<Finding> findMonotoneStretches(const LongTakeTracks& tracks, const LongTakeSeries& series,
                                           const LongformRules& rules);

struct LongformReport {
    LongTakeAnalysis analysis;
    std::vector<JoinMeasures> joins;
    std::vector<Finding> findings;  // by start time
};

// The long-take measures with the rules' window settings, the joins, and all
// findings. Errors as analyseLongTake and measureJoins (`joinsOrigin` names
// the chunk list in its errors).
LongformReport analyseLongform(const Signal& take, const std::vector<double>& knownJoins, const LongformRules& rules,
                               Progress progress = {}, const std::string& joinsOrigin = "chunks");

}  // namespace earmark
