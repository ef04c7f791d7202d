#include "earmark/compare/word_comparison.hpp"

#include "earmark/core/error.hpp"

#include <cmath>

namespace earmark {

const char* wordDifferenceName(WordDifference d) {
    switch (d) {
    case WordDifference::Duration: return "duration";
    case WordDifference::F0Mean: return "f0-mean";
    case WordDifference::F0Range: return "f0-range";
    case WordDifference::Prominence: return "prominence";
    }
    return "duration";
}

void WordFlagParams::validate() const {
    if (!(durationRatio > 1)) throw ParamError("WordFlagParams.durationRatio", "must be above 1");
    if (!(f0MeanSt > 0)) throw ParamError("WordFlagParams.f0MeanSt", "must be positive");
    if (!(f0RangeSt > 0)) throw ParamError("WordFlagParams.f0RangeSt", "must be positive");
    if (!(prominence > 0)) throw ParamError("WordFlagParams.prominence", "must be positive");
}

WordTable compareWords(const std::vector<WordMeasures>& a, const std::vector<WordMeasures>& b,
                       const WordFlagParams& params) {
    params.validate();
    if (a.size() != b.size()) throw ParamError("compareWords.b", "both takes need the same number of words");
    WordTable table;
    std::array<double, kWordDifferenceCount> largestSize{};
    for (std::size_t i = 0; i < a.size(); ++i) {
        WordComparison w;
        w.text = a[i].text;
        w.a = a[i];
        w.b = b[i];
        w.durationRatio = b[i].durationS / a[i].durationS;
        if (a[i].f0MeanHz && b[i].f0MeanHz) w.f0MeanDiffSt = 12.0 * std::log2(*b[i].f0MeanHz / *a[i].f0MeanHz);
        if (a[i].f0RangeSt && b[i].f0RangeSt) w.f0RangeDiffSt = *b[i].f0RangeSt - *a[i].f0RangeSt;
        w.prominenceDiff = b[i].prominence - a[i].prominence;

        // Size of each difference relative to its threshold; >= 1 is flagged.
        const std::array<double, kWordDifferenceCount> size = {
            std::abs(std::log(w.durationRatio)) / std::log(params.durationRatio),
            w.f0MeanDiffSt ? std::abs(*w.f0MeanDiffSt) / params.f0MeanSt : 0.0,
            w.f0RangeDiffSt ? std::abs(*w.f0RangeDiffSt) / params.f0RangeSt : 0.0,
            std::abs(w.prominenceDiff) / params.prominence,
        };
        for (std::size_t k = 0; k < kWordDifferenceCount; ++k) {
            if (!(size[k] >= 1.0 - 1e-12)) continue;
            w.flags.push_back(static_cast<WordDifference>(k));
            if (size[k] > largestSize[k]) largestSize[k] = size[k], table.largest[k] = i;
        }
        table.words.push_back(std::move(w));
    }
    return table;
}

}  // namespace earmark
