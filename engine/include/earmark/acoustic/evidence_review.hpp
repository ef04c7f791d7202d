// Word evidence (word_evidence.hpp) read for review: which words to show as
// well, doubtful or poorly pronounced, the expected-vs-heard phone rows of
// one word, and the suspects a take's evidence raises (coverage findings and
// poorly pronounced words), each naming its words. The window only draws
// what these return.
//
// Score bands are in GOP units (Witt & Young 2000, Speech Communication
// 30(2–3):95–108): nats per frame, <= 0. The defaults are common practice
// for a display, checked in tests against festival-rendered takes (clean
// takes vs planted faults); a scan calibrates its own per voice.
//
// Plain values; thread-safe as values are.
#pragma once

#include "earmark/acoustic/word_evidence.hpp"
#include "earmark/store/suspect.hpp"

#include <string>
#include <vector>

namespace earmark {

// How a script word came out. Unspoken: not in the take (skipped, said as
// something else, or after an early end).
enum class WordScoreClass { Good, Doubtful, Poor, Unspoken };

// "good", "doubtful", "poor", "unspoken" (for people and files).
const char* wordScoreClassName(WordScoreClass c);

struct ScoreBands {
    double doubtfulBelow = -1.0;  // nats/frame: a word scoring below this is doubtful
    double poorBelow = -2.0;      // nats/frame: … and below this, poor (< doubtfulBelow)
    void validate() const;        // throws ParamError("ScoreBands.<field>")
};

WordScoreClass classifyWord(const WordEvidence& word, const ScoreBands& bands = {});

// Where a word's class is drawn: every script word that has a span in the
// take (spoken, or said as something else), in script order.
struct WordScoreSpan {
    std::size_t index = 0;  // into WordEvidenceResult::words
    double startS = 0, endS = 0;
    WordScoreClass cls = WordScoreClass::Good;
};

std::vector<WordScoreSpan> wordScoreSpans(const WordEvidenceResult& evidence, const ScoreBands& bands = {});

// One row of a word's expected-vs-heard table.
struct PhoneRow {
    std::string expected;  // model phone
    std::string heard{};   // best free phone sequence over its frames, space-separated ("" = no frames)
    double score = 0;      // GOP, nats per frame
    double startS = 0, endS = 0;
    bool matches = false;  // heard is exactly the expected phone
    bool worst = false;    // the word's lowest-scoring phone (first of equals)
};

std::vector<PhoneRow> phoneRows(const WordEvidence& word);

// The script word whose span (first occurrence, or what was said in its
// place) holds time t (seconds), else -1.
int wordAt(const WordEvidenceResult& evidence, double t);

// Suspect names raised from word evidence: the scan's ("skipped-word",
// "repeated-word", "extra-speech", "early-end", "substituted-word",
// "pronunciation"), so mergeSuspects recognises a scanned session's own.
inline constexpr const char* kWordScoreSuspect = "pronunciation";
std::string coverageSuspectName(CoverageFinding::Kind kind);

// One suspect per coverage finding (value: its length in seconds, reason:
// its detail) and one per poorly pronounced word that coverage did not
// already report (value: the word's score, threshold: bands.poorBelow,
// reason naming the word and its phones most off), sorted by start time.
std::vector<Suspect> evidenceSuspects(const WordEvidenceResult& evidence, const ScoreBands& bands = {});

// `stored` (e.g. a session's scan suspects) plus those of `computed` that do
// not repeat a stored one (same name, overlapping span).
std::vector<Suspect> mergeSuspects(std::vector<Suspect> stored, const std::vector<Suspect>& computed);

}  // namespace earmark
