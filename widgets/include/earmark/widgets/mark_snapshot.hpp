// Measures for a new or moved mark, from what the window has already computed
// for the take (its F0 and energy tracks, its tiers and text), so a mark gets
// its snapshot at once without analysing the take again.
#pragma once

#include "earmark/marks/mark.hpp"
#include "earmark/tiers/tier.hpp"
#include "earmark/widgets/take_data.hpp"

#include <QString>

#include <string>
#include <utility>
#include <vector>

namespace earmark::widgets {

// The mark measures (earmark/marks/mark_measures.hpp) of [startS, endS];
// empty when the tracks lack F0 or energy or the span is empty in the take.
MeasureSnapshot snapshotForSpan(const TakeTracks& tracks, double durationS, const TierSet& tiers,
                                const std::string& text, double startS, double endS);

// The snapshot as readable rows ("F0 range", "4.2 st"), in a fixed order.
std::vector<std::pair<QString, QString>> describeMeasures(const MeasureSnapshot& measures);

}  // namespace earmark::widgets
