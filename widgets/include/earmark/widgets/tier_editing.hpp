// Edits of one tier as pure functions, so the lanes and the undo stack share
// them and tests can check them without widgets. Each returns the edited tier,
// or nothing when the edit does not apply (no interval there, would leave an
// interval shorter than kMinIntervalSeconds, would overlap a neighbour).
// Times are seconds from the start of the take.
#pragma once

#include "earmark/tiers/tier.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark::widgets {

// Shortest interval an edit may leave (common practice: a few ms, below any real phone).
inline constexpr double kMinIntervalSeconds = 0.005;

// A boundary: where one interval ends and/or the next begins.
struct TierBoundary {
    double time = 0.0;  // s
    int endOf = -1;     // index of the interval ending here, −1 for none
    int startOf = -1;   // index of the interval starting here, −1 for none
};

// Every boundary in time order; touching intervals share one.
std::vector<TierBoundary> tierBoundaries(const Tier& tier);
// Index of the interval containing t (start ≤ t < end), −1 for none.
int intervalAt(const Tier& tier, double t);

// Moves a boundary (both sides of a shared one) to `time`, clamped so that
// no interval gets shorter than the minimum and none crosses a neighbour.
// `durationS` bounds the last end (no bound when ≤ 0).
std::optional<Tier> moveBoundary(const Tier& tier, const TierBoundary& boundary, double time, double durationS);
// Splits the interval containing t at t: the left part keeps the label, the right is unlabelled.
std::optional<Tier> splitAt(const Tier& tier, double t);
// Joins interval `index` with the next one (touching or across a gap); labels
// are joined with `joiner` (a space for words, nothing for phones).
std::optional<Tier> mergeWithNext(const Tier& tier, int index, const std::string& joiner);
std::optional<Tier> relabel(const Tier& tier, int index, const std::string& label);
// A new unlabelled interval over [start, end], which must lie in a gap.
std::optional<Tier> insertInterval(const Tier& tier, double start, double end);
std::optional<Tier> removeInterval(const Tier& tier, int index);

}  // namespace earmark::widgets
