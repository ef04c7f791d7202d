// Word evidence in the scan: what a scan row keeps of a take's forced
// alignment with the trained acoustic model (earmark/acoustic/word_evidence.hpp),
// the coverage suspects of one take (skipped-word, repeated-word,
// extra-speech, substituted-word, early-end) and the set-level
// pronunciation suspect.
//
// Pronunciation is judged against the set, not a fixed constant: a word is
// off when its goodness-of-pronunciation score (Witt & Young 2000, Speech
// Communication 30(2–3):95–108; nats per frame) lies below
//     limit = median − k × max(MAD, minMad)
// of all word scores of the set (k = rules.pronunciation.maxMadsBelow). The
// median absolute deviation is a robust spread (Hampel 1974, JASA 69:383–393);
// it is used unscaled. A word's score is a mean over its frames, and a mean of
// n frames spreads as 1/√n (standard error of a mean): a word shorter than the
// set's median word is held to k × spread × √(typical / its seconds); longer
// words keep the set's limit. A word the set holds at least
// rules.pronunciation.minSameWord times (a function word such as "the", said
// "thuh" or "thee" by context) is held to the larger of the set's MAD and the
// MAD of its own scores: a voice that says a word in many ways is not faulted
// for the variety, while a word it always says wrong (low scores, small
// spread) keeps the set's limit. A scan sharded with --shard calibrates on the takes
// of its own shard unless a calibration is supplied (docs/scan.md).
//
// Thread-safety: pure functions.
#pragma once

#include "earmark/acoustic/word_evidence.hpp"
#include "earmark/prosody/suspects.hpp"

#include <map>
#include <optional>
#include <string>
#include <vector>

namespace earmark {

// One spoken word of a take as the scan keeps it.
struct ScannedWord {
    std::string label;
    double startS = 0, endS = 0;
    double score = 0;           // GOP, nats/frame (<= 0 up to the phone loop's penalties)
    std::string offPhones;      // the phones most off, e.g. "IH heard as AA, T heard as P"; may be empty
};

struct TakeWords {
    std::string method;                     // "model" when word evidence was gathered, else empty
    bool scoresKnown = false;               // `words` holds every spoken word (false when read back from a CSV)
    std::vector<ScannedWord> words;         // spoken words in script order (from a CSV: only the lowest)
    std::vector<CoverageFinding> coverage;  // in time order (from a CSV: kinds and words, times NaN
                                            // except the early end's start)

    bool gathered() const { return !method.empty(); }
    // The spoken word with the lowest score, or nullptr.
    const ScannedWord* lowest() const;
    // Script words of one coverage kind, in order (Skipped also lists Substituted ones: both are missing).
    std::vector<std::string> wordsOf(CoverageFinding::Kind kind) const;
};

// The scan's summary of a word-evidence result.
TakeWords summariseWords(const WordEvidenceResult& evidence);

// Coverage suspects of one take, one per kind (naming every word of that
// kind and the first one's time): skipped-word, repeated-word, extra-speech
// (stretches of at least rules.extraSpeech.minSeconds; value = their total
// seconds), substituted-word, early-end. Value = words concerned (threshold 0)
// except extra-speech. Rules switched off raise nothing.
std::vector<TakeSuspect> coverageSuspects(const TakeWords& words, const ScanRules& rules);

struct WordScoreCalibration {
    double medianScore = 0;     // nats/frame
    double mad = 0;             // median absolute deviation, nats/frame (before the floor)
    std::size_t words = 0;      // scores it was made from
    double typicalWordSeconds = 0;  // median duration of those words (0: unknown, no allowance for short words)
    bool supplied = false;      // given by the caller rather than measured on this set
    struct SameWord {
        double mad = 0;         // MAD of this word's scores, nats/frame
        std::size_t count = 0;  // how often the set holds it
    };
    std::map<std::string, SameWord> sameWords;  // by lower-case label; only words said >= minSameWord times

    // median − maxMadsBelow × max(mad, minMad)
    double limit(const PronunciationRule& rule) const;
    // The limit for a word `label` lasting `seconds`: lower for words shorter than the typical
    // word, and for words whose own scores spread wider than the set's (above).
    double limitFor(const PronunciationRule& rule, double seconds, const std::string& label = {}) const;
    // The spread the limit of `label` uses: max(mad, minMad, that word's own MAD).
    double spreadFor(const PronunciationRule& rule, const std::string& label) const;
    const SameWord* sameWord(const std::string& label) const;
    // √(typical / seconds) for a shorter word, else 1.
    double shortWordAllowance(double seconds) const;
};

// Median and MAD of `scores`, median of `seconds` (the words' durations, same
// order; may be empty), the MAD of each label said at least rule.minSameWord
// times (`labels`: same order; may be empty); nullopt for fewer than rule.minWords scores.
std::optional<WordScoreCalibration> calibrateWordScores(std::vector<double> scores, const PronunciationRule& rule,
                                                        std::vector<double> seconds = {},
                                                        std::vector<std::string> labels = {});

// The pronunciation suspect of one take: the word furthest below its limit
// (limitFor), naming the word, its time, the phones most off and the other
// words below their limits. nullopt when no word is below.
std::optional<TakeSuspect> pronunciationSuspect(const TakeWords& words, const WordScoreCalibration& calibration,
                                                const ScanRules& rules);

}  // namespace earmark
