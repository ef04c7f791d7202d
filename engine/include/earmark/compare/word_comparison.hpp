// The per-word table of a take pair: each word's measures in take A and
// take B (prosody/word_measures.hpp) side by side, their differences, and
// flags on the differences large enough to hear.
//
// Differences are B against A: duration ratio B/A, mean F0 of B in
// semitones above A's (12·log2(meanB/meanA)), F0 range of B minus A's
// (semitones), prominence of B minus A's (z units within each take).
// Thresholds are common practice (no single source): a 30 % change of a
// word's length, 2 semitones of level, 3 semitones of range, one standard
// deviation of prominence are each about where listeners start to hear a
// different reading.
//
// Pure function; reentrant.
#pragma once

#include "earmark/prosody/word_measures.hpp"

#include <array>
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace earmark {

enum class WordDifference { Duration, F0Mean, F0Range, Prominence };
inline constexpr std::size_t kWordDifferenceCount = 4;

// "duration", "f0-mean", "f0-range", "prominence".
const char* wordDifferenceName(WordDifference d);

struct WordFlagParams {
    double durationRatio = 1.3;  // flag when B/A >= this or <= 1/this; > 1
    double f0MeanSt = 2.0;       // flag when |mean F0 difference| >= this, semitones; > 0
    double f0RangeSt = 3.0;      // flag when |F0 range difference| >= this, semitones; > 0
    double prominence = 1.0;     // flag when |prominence difference| >= this, z units; > 0
    // Throws ParamError("WordFlagParams.<field>").
    void validate() const;
};

struct WordComparison {
    std::string text;  // take A's word
    WordMeasures a, b;
    double durationRatio = 1.0;           // B/A
    std::optional<double> f0MeanDiffSt;   // empty unless both words have F0 figures
    std::optional<double> f0RangeDiffSt;  // ditto
    double prominenceDiff = 0.0;          // B − A
    std::vector<WordDifference> flags;    // differences at or beyond their thresholds
};

struct WordTable {
    std::vector<WordComparison> words;
    // Per WordDifference (by its value): the word with the largest flagged
    // difference of that kind, if any word is flagged for it.
    std::array<std::optional<std::size_t>, kWordDifferenceCount> largest;
};

// Word i of `a` against word i of `b`. Throws ParamError for invalid params
// and ParamError("compareWords.b") when the lists differ in length.
WordTable compareWords(const std::vector<WordMeasures>& a, const std::vector<WordMeasures>& b,
                       const WordFlagParams& params = {});

}  // namespace earmark
