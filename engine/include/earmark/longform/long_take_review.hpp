// What the window shows of a long take, in one call: the per-window series,
// the long-form findings (findings.hpp, no known joins) and, when the take
// has text, its paragraph / sentence / word / phone tiers aligned chunk by
// chunk (long_alignment.hpp). The frame tracks are dropped: the result holds
// a few hundred windows, the findings and the tiers, not the hour's frames.
//
// Text that cannot be aligned (it covers only part of the take, runs past
// it, has no words) is not an error of the review: the series and findings
// stand, and `textProblem` says why there are no tiers.
//
// Errors: as analyseLongform (InputError("audio", …) for a take too short or
// without speech); Cancelled. Thread-safety: reentrant when the aligner is.
#pragma once

#include "earmark/longform/findings.hpp"
#include "earmark/longform/long_alignment.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct LongTakeReview {
    LongTakeSeries series;
    std::vector<Finding> findings;      // by start time
    std::optional<TierSet> textTiers;   // with text that aligned
    int textChunks = 0;
    double meanWordConfidence = 0.0;
    std::string textProblem;            // with text that did not align: why (one line)
};

// `text` empty: no alignment. Progress: the measures, then (with text) the alignment.
LongTakeReview reviewLongTake(const Signal& take, const std::string& text, const LongformRules& rules,
                              const ChunkAligner& aligner, Progress progress = {});

}  // namespace earmark
