// Suspects: automatic hints that a take may be defective, each with the
// measured value, the threshold it crossed, a time span and a reason in words.
// One suspect per kind per take, the worst instance (e.g. the flattest
// phrase) — except the artefacts, where every event is a suspect.
//
// Thread-safety: pure functions.
#pragma once

#include "earmark/prosody/rules.hpp"
#include "earmark/prosody/take_measures.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark {

enum class SuspectKind {
    Flat, PitchJump, PauseTooLong, PauseMissing, Rushed, Dragged, Clipping, Truncation,
    LeadingSilence, TrailingSilence, Loud, Quiet, DcOffset,
    Click, NoiseBurst, Buzz, Dropout,  // artefacts of the samples (findArtefactSuspects)
    // Word evidence against the script (earmark/scan/word_checks.hpp); Pronunciation is set-level.
    Pronunciation, SkippedWord, RepeatedWord, ExtraSpeech, SubstitutedWord, EarlyEnd,
};

// Names match the subtypes of the mark categories where one exists:
// "flat", "pitch-jump", "pause-too-long", "pause-missing", "rushed", "dragged",
// "clipping", "truncation", "leading-silence", "trailing-silence", "loud",
// "quiet", "dc-offset", "click", "noise-burst", "buzz", "dropout",
// "pronunciation", "skipped-word", "repeated-word", "extra-speech",
// "substituted-word", "early-end".
const char* suspectName(SuspectKind kind);
std::optional<SuspectKind> suspectKindFromName(const std::string& name);
// Loud, Quiet and Pronunciation compare a take with the whole set (second pass).
bool isSetLevel(SuspectKind kind);

struct TakeSuspect {
    SuspectKind kind = SuspectKind::Flat;
    double value = 0.0;       // the measured value, in `unit`
    double threshold = 0.0;   // the rule's limit, in `unit`
    std::string unit;         // "st", "s", "syl/s", "samples", "dB", "LU", "FS", "words", "nats/frame"
    double startS = 0.0, endS = 0.0;
    std::string reason;       // e.g. "flat: 1.4 st over 'open until late on Tuesday' (< 2 st)"
};

// The per-take rules (everything but loudness against the set).
std::vector<TakeSuspect> findSuspects(const ProsodyContext& context, const TakeMeasures& measures,
                                  const ScanRules& rules);

// The artefact rules (click, noise-burst, buzz, dropout) over the take's
// samples (earmark/artefacts/), with the context's F0 track and speech
// level; one suspect per event, each kind in time order (a take with three
// clicks gets three click suspects, each adding its score).
// Throws ParamError for invalid rules, Cancelled via `progress`.
std::vector<TakeSuspect> findArtefactSuspects(const Signal& signal, const ProsodyContext& context,
                                              const ScanRules& rules, Progress progress = {});

// The set-level loudness rule for one take: Loud or Quiet when |lufs − median|
// exceeds the limit; empty otherwise. [0, durationS] is the span.
std::optional<TakeSuspect> loudnessSuspect(double lufs, double setMedianLufs, double durationS,
                                       const ScanRules& rules);

// Score of one suspect: weight × (1 + min(cap − 1, |value − threshold| / scale)),
// scale = |threshold| (at least 1 sample for clipping, 0.001 for DC offset,
// 1 dB for truncation and the dB-valued artefacts, 1 word for the word
// counts, 0.1 nats/frame for pronunciation). So a suspect just past its threshold adds its weight,
// and one far past adds at most weight × cap.
double suspectScore(const TakeSuspect& suspect, const ScanRules& rules);
double totalScore(const std::vector<TakeSuspect>& suspects, const ScanRules& rules);

}  // namespace earmark
