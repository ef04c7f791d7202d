#include "earmark/store/session.hpp"

#include <algorithm>

namespace earmark {

std::string wordsCovered(const std::vector<TierRow>& tiers, double startSeconds, double endSeconds) {
    std::vector<const TierRow*> words;
    for (const TierRow& row : tiers)
        if ((row.tier == "words" || row.tier == "word") && !row.label.empty()) words.push_back(&row);
    std::stable_sort(words.begin(), words.end(),
                     [](const TierRow* a, const TierRow* b) { return a->startSeconds < b->startSeconds; });

    auto join = [&](auto&& take) {
        std::string out;
        for (const TierRow* w : words)
            if (take(*w)) out += (out.empty() ? "" : " ") + w->label;
        return out;
    };
    // A word counts when its middle is inside the span: a span drawn a little
    // wide or narrow still names the words a listener would name.
    std::string byMiddle = join([&](const TierRow& w) {
        const double mid = 0.5 * (w.startSeconds + w.endSeconds);
        return mid >= startSeconds && mid <= endSeconds;
    });
    if (!byMiddle.empty()) return byMiddle;
    // A span inside one word, or across a boundary without reaching either
    // middle: the words it really overlaps — at least a quarter of the shorter
    // of span and word, so a pause that grazes the next word by a few
    // milliseconds names no word.
    return join([&](const TierRow& w) {
        const double overlap = std::min(w.endSeconds, endSeconds) - std::max(w.startSeconds, startSeconds);
        const double shorter = std::min(endSeconds - startSeconds, w.endSeconds - w.startSeconds);
        return overlap > 0 && overlap >= 0.25 * shorter;
    });
}

}  // namespace earmark
