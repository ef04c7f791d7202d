// The thresholds of the scan's suspects, in one place. The defaults are
// documented in docs/scan.md and written out in docs/rules-default.json (a
// test checks the two agree). Values marked "common practice" in docs/scan.md
// are rules of thumb without a single published source.
//
// A rules file is a JSON object with any subset of the sections and keys of
// docs/rules-default.json; missing keys keep their defaults. Unknown sections
// or keys, wrong types and out-of-range values are errors naming the key.
#pragma once

#include "earmark/longform/longform_rules.hpp"
#include "earmark/artefacts/buzz.hpp"
#include "earmark/artefacts/clicks.hpp"
#include "earmark/artefacts/dropouts.hpp"
#include "earmark/artefacts/noise_bursts.hpp"
#include "earmark/prosody/prosody_context.hpp"

#include <cstdint>
#include <string>

namespace earmark {

struct RuleSwitch {
    bool enabled = true;
    double weight = 1.0;  // score weight of one suspect of this kind (≥ 0)
};

struct FlatRule : RuleSwitch {
    double maxRangeSt = 2.0;               // phrase F0 range (p5–p95) below this is flat
    int minWords = 4;                      // phrase length with a word tier
    double minSecondsWithoutWords = 1.5;   // phrase length without one
};
struct PitchJumpRule : RuleSwitch {
    double minStepSt = 8.0;                // step between neighbouring voiced frames
};
struct PauseTooLongRule : RuleSwitch {
    double maxSeconds = 1.0;               // pause inside a sentence
};
struct PauseMissingRule : RuleSwitch {
    double minAfterCommaS = 0.05;          // silence expected after , ; :
    double minAfterStopS = 0.12;           // silence expected after . ? ! (not the last word)
};
struct RateRule : RuleSwitch {
    double limitSyllablesPerS = 0.0;       // articulation rate limit (upper for rushed, lower for dragged)
    double minSpeechSeconds = 1.0;         // shorter takes are not judged
};
struct ClippingRule : RuleSwitch {
    std::int64_t maxClippedSamples = 3;
};
struct TruncationRule : RuleSwitch {
    double tailSeconds = 0.03;             // "the very end" of the file
    double maxTailDb = -25.0;              // tail energy relative to the speech level
    bool voicedTail = true;                // also flag a voiced frame in the tail
};
struct SilenceRule : RuleSwitch {
    double maxSeconds = 1.0;
};
struct LoudnessRule : RuleSwitch {
    double maxDeviationLu = 6.0;           // from the median of the set
    int minTakes = 5;                      // fewer measured takes: the rule is not applied
};
struct DcOffsetRule : RuleSwitch {
    double maxAbs = 0.01;                  // mean sample value, full scale 1.0
};

// Word evidence (earmark/acoustic/word_evidence.hpp) for takes with text in a
// voice the acoustic model covers. Pronunciation is judged against the set:
// a word scoring below median − maxMadsBelow × MAD of all word scores of the
// set (MAD floored at minMad) is off.
struct PronunciationRule : RuleSwitch {
    double maxMadsBelow = 8.0;             // k: median absolute deviations below the set median
    double minMad = 0.05;                  // nats/frame; floor of the set's MAD (a set of near-equal scores)
    int minWords = 50;                     // fewer scored words in the set: the rule is not applied
    int minSameWord = 8;                   // a word said this often in the set may widen its own limit
};
struct ExtraSpeechRule : RuleSwitch {
    double minSeconds = 0.15;              // shorter unscripted stretches are not reported
};

// The artefact detectors' rules: the detector's parameters (earmark/artefacts/).
struct ClickRule : RuleSwitch {
    ClickParams params;
};
struct NoiseBurstRule : RuleSwitch {
    NoiseBurstParams params;
};
struct BuzzRule : RuleSwitch {
    BuzzParams params;
};
struct DropoutRule : RuleSwitch {
    DropoutParams params;
};

struct ScanRules {
    PauseParams pause;                     // section "measure"
    FlatRule flat;
    PitchJumpRule pitchJump;
    PauseTooLongRule pauseTooLong;
    PauseMissingRule pauseMissing;
    RateRule rushed{{}, 7.0, 1.0};
    RateRule dragged{{}, 2.5, 1.0};
    ClippingRule clipping{{true, 2.0}};      // audible artefacts weigh double
    TruncationRule truncation{{true, 2.0}};
    SilenceRule leadingSilence{{}, 1.0};
    SilenceRule trailingSilence{{}, 1.5};
    LoudnessRule loudness;
    DcOffsetRule dcOffset;
    ClickRule click{{true, 2.0}, {}};
    NoiseBurstRule noiseBurst{{true, 2.0}, {}};
    BuzzRule buzz{{true, 2.0}, {}};
    DropoutRule dropout{{false, 2.0}, {}};        // off: below the detection bar (docs/scan.md)
    PronunciationRule pronunciation;       // set-level, like loudness
    RuleSwitch skippedWord;
    RuleSwitch repeatedWord;
    ExtraSpeechRule extraSpeech;
    RuleSwitch substitutedWord;
    RuleSwitch earlyEnd{true, 2.0};        // a take that stops before its script does weighs double
    double scoreCapPerSuspect = 3.0;       // section "score": one suspect adds at most weight × cap
    LongformRules longform;                // sections "longform", "seam", "level_drift", "pitch_drift",
                                           // "rate_drift", "timbre_shift", "monotone_stretch"

    ProsodyParams prosodyParams() const;
    // True when any word-evidence rule is on (the scan then aligns takes with text).
    bool wordEvidenceEnabled() const;
    void validate() const;  // throws ParamError("rules.<section>.<key>")
};

// Parses a rules document over the defaults. `origin` names the file in
// errors. Throws ParamError("rules.<section>.<key>", problem) for unknown or
// invalid keys (also whole numbers beyond their type), ParamError(origin) for
// text that is not JSON or holds a number beyond a double (exit 2, as docs/scan.md says).
ScanRules parseRules(const std::string& json, const std::string& origin = "rules");
// Reads and parses a rules file; InputError(path) when it cannot be read.
ScanRules loadRules(const std::string& path);
// The full document (every section and key), pretty-printed.
std::string rulesToJson(const ScanRules& rules);

}  // namespace earmark
