// What is known about a take besides its audio: the script text and, when an
// aligner or the synthesiser supplied them, word and phone intervals.
// Times are seconds from the start of the take.
#pragma once

#include "earmark/tiers/tier.hpp"

#include <string>
#include <vector>

namespace earmark {

struct Transcript {
    std::string text;                 // the script line; may be empty
    std::vector<Interval> words;    // in time order; labels may carry punctuation ("late,"); may be empty
    std::vector<Interval> phones;   // in time order; may be empty
    bool hasWords() const { return !words.empty(); }
};

// Text plus the "words" and "phones" tiers of a tier set (either may be missing).
Transcript transcriptFrom(const TierSet& tiers, std::string text);

// Splits text into word tokens on white space, keeping punctuation attached
// ("late," stays one token). Tokens made only of punctuation are dropped.
std::vector<std::string> textTokens(const std::string& text);

// The punctuation that closes a token ('\0' if none): one of , ; : . ? !
char closingPunctuation(const std::string& token);

}  // namespace earmark
