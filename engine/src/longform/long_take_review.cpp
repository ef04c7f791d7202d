#include "earmark/longform/long_take_review.hpp"

#include "earmark/core/error.hpp"

namespace earmark {

LongTakeReview reviewLongTake(const Signal& take, const std::string& text, const LongformRules& rules,
                              const ChunkAligner& aligner, Progress progress) {
    const bool withText = text.find_first_not_of(" \t\r\n") != std::string::npos;
    LongTakeReview out;
    {
        LongformReport report = analyseLongform(take, {}, rules, progress.sub(0.0, withText ? 0.4 : 1.0));
        out.series = std::move(report.analysis.series);
        out.findings = std::move(report.findings);
    }  // the frame tracks go here
    if (!withText) return out;
    try {
        LongAlignResult aligned = alignLongText(take, text, aligner, {}, progress.sub(0.4, 1.0));
        out.textTiers = std::move(aligned.tiers);
        out.textChunks = aligned.chunks;
        out.meanWordConfidence = aligned.meanConfidence;
    } catch (const InputError& e) {
        out.textProblem = e.problem();
    }
    return out;
}

}  // namespace earmark
