// Word evidence for a take and its script, from a trained acoustic model:
// forced alignment (forced_alignment.hpp) into word and phone tiers, a
// goodness-of-pronunciation score per phone and word
// (pronunciation_score.hpp), and the script's coverage — words skipped,
// said twice, speech that is not in the script, and an early end (the last
// words never spoken, or the take cut inside a word), each with its time.
//
// Thread-safety: the model and dictionary are loaded once per process and
// shared read-only; gatherWordEvidence may run on several threads at once
// (guesses of unknown words are serialised by espeak-ng's lock).
#pragma once

#include "earmark/acoustic/forced_alignment.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/tiers/tier.hpp"

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct WordEvidenceParams {
    std::string voice = "en-us";        // espeak-ng voice for phones of words the dictionary lacks
    std::optional<std::filesystem::path> modelFolder;  // default: the installed pocketsphinx-en-us model
    std::optional<std::filesystem::path> dictionary;   // default: the dictionary shipped beside it
    ForcedAlignmentParams search;
    double insertionPenalty = 3.0;      // nats per phone in the free phone loop of the scores
    double minExtraSeconds = 0.15;      // shorter stretches of unscripted sound are not reported
    // A stretch of unscripted speech whose sound, forced through the phones of the script word
    // said before it (or of the next word, said after it), scores within this margin of the take's
    // median word score (GOP, nats/frame) is that word said again. Measured on festival's voices:
    // a repeated word 1.0 below the median, the neighbours of other unscripted speech 4 and more.
    double repeatMargin = 2.0;
    // The take is aligned twice: first to the script as written, which
    // measures how loosely the model fits this voice (the frame-weighted
    // median, over the script's phones, of best free state score − path
    // score, nats/frame); then with the coverage paths, the garbage unit's
    // per-frame penalty raised by that mismatch and the skip, repeat, extra
    // and early-end penalties multiplied by max(1, mismatch / referenceMismatch).
    // Measured: festival's voices 0–2.1 nats/frame, espeak-ng's formant
    // voices 2.3–3.8; 1.5 keeps festival's planted faults found (15 of 15).
    double referenceMismatch = 1.5;     // nats/frame

    // A pause (silence between words) over a frame within 4 dB of the take's speech level (a loud
    // vowel) costs this many nats per frame, falling linearly to nothing 8 dB below it, where
    // nasals, voiced consonants and a phrase's fading end lie: the silence model can fit a formant
    // synthesiser's vowel better than the vowel's own model, and a pause over a loud vowel moved
    // the next word's start up to 0.17 s late (espeak-ng "two old").
    double loudPausePenalty = 100.0;    // nats/frame

    // Word confidence = clamp(1 + score / confidenceScale, 0, 1): a word whose
    // phones match as well as any free phone sequence gets 1.
    double confidenceScale = 4.0;
    void validate() const;  // throws ParamError("WordEvidenceParams.<field>")
};

struct PhoneEvidence {
    std::string expected;             // model phone
    std::vector<std::string> heard;   // best free phone sequence over the same frames
    double startS = 0, endS = 0;
    double score = 0;                 // GOP, nats per frame (<= 0)
};

struct WordEvidence {
    std::string label;                // as written in the script
    std::size_t index = 0;            // position in the script
    bool guessed = false;             // phones guessed with espeak-ng (not in the dictionary)
    bool spoken = false;              // aligned (at least partly)
    bool complete = false;            // all of its phones aligned
    bool substituted = false;         // not said; something else was said in its place
    int occurrences = 0;              // times it was said (2+ = repeated)
    double startS = 0, endS = 0;      // of its first occurrence
    double score = 0;                 // frame-weighted mean of its phones' scores
    double confidence = 0;            // 0…1 from the score
    std::vector<PhoneEvidence> phones;
};

struct CoverageFinding {
    enum class Kind { Skipped, Repeated, Extra, EarlyEnd, Substituted };
    Kind kind = Kind::Skipped;
    std::vector<std::string> words;   // the script words concerned (Extra: the words around it)
    double startS = 0, endS = 0;
    std::string detail;               // one line for people, naming the words and the time
};

// "skipped", "repeated", "extra", "early-end", "substituted" (a script word
// said as something else: its place holds unscripted speech).
const char* coverageKindName(CoverageFinding::Kind kind);

struct WordEvidenceResult {
    TierSet tiers;                    // "words" (with confidence) and "phones"
    std::string method = "model";     // which aligner made the tiers
    std::vector<WordEvidence> words;  // every script word, in script order
    std::vector<CoverageFinding> coverage;
    std::vector<std::string> guessedWords;
    double meanConfidence = 0;
    double logLikelihoodPerFrame = 0;
};

// Throws InputError("text", …) for text with no pronounceable word,
// InputError("audio", …) for audio shorter than one frame, InputError naming
// the model file when the model is missing or damaged, ParamError,
// Cancelled.
WordEvidenceResult gatherWordEvidence(const Signal& take, const std::string& text,
                                      const WordEvidenceParams& params = {}, Progress progress = {});

// True when the installed model can align text read in `voice` (an English voice).
bool modelCoversVoice(const std::string& voice);

}  // namespace earmark
