// Rater screening before analysis. Every exclusion carries its rule and a
// sentence with the figures, so a report says who was left out and why.
//
// Rules:
// - "rated-nothing": a rater expected (from the plan or the file) who gave
//   no score at all.
// - "mushra-reference" / "mushra-anchor" (ITU-R BS.1534-3, post-screening):
//   a rater who scored the hidden reference below 90 on more than 15 % of the
//   lines they rated, or the mid-range anchor above 90 on more than 15 % of
//   them. A design with only low anchors applies the anchor rule to them
//   (common practice: a low anchor above 90 is a stronger failure still).
//   Strict comparisons, as the Recommendation words them: exactly 15 %
//   keeps the rater, a score of exactly 90 is neither below nor above.
// - "repeat-consistency": mean |first − repeat| over the rater's repeated
//   trials above maxRepeatDifference (default: a quarter of the scale's
//   range — common practice).
// - "attention": more than maxAttentionFailures attention answers outside
//   the attention system's accepted range.
//
// Pure and thread-safe. ParamError for thresholds out of range.
#pragma once

#include "earmark/listening/answers.hpp"

#include <string>
#include <vector>

namespace earmark::listening {

struct ScreeningParams {
    bool mushraPostScreening = true;
    double referenceBelow = 90;      // BS.1534-3
    double anchorAbove = 90;         // BS.1534-3
    double maxFailShare = 0.15;      // BS.1534-3: "more than 15 %"
    double maxRepeatDifference = -1; // < 0: a quarter of the scale's range
    int maxAttentionFailures = 0;
};

struct Exclusion {
    std::string rater;
    std::string rule;    // see above
    std::string reason;  // a sentence with the figures
};

struct Screening {
    std::vector<std::string> kept;  // sorted
    std::vector<Exclusion> excluded;  // by rater; one entry per rule failed
    bool isKept(const std::string& rater) const;
};

// `answers` must have passed checkAnswers. `expectedRaters` adds raters who
// may have no answer at all (from the plan's bound raters).
Screening screenRaters(const TestDesign& design, const std::vector<Answer>& answers, const ScreeningParams& params,
                       const std::vector<std::string>& expectedRaters = {});

}  // namespace earmark::listening
