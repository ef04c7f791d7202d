// HMM forced alignment of a script's words to a take's feature frames, with
// paths for the ways a take can differ from its script.
//
// The search graph (one token-passing Viterbi pass, beam-pruned, frame
// synchronous): between every two words, and before the first and after
// the last, a junction where the take may pass straight on, pause (the
// model's silence phone, any length) or say something that is not in the
// script (a garbage unit whose per-frame score is the best context-free
// state's score less a penalty — an "online garbage" model). Each word is a
// chain of triphone HMMs (cross-word contexts; alternative pronunciations
// side by side). When `coverage` is on, a word may also be left out
// (skipped), said again (repeated), and the take may end early — after any
// word or inside one — each at a fixed log-penalty, so the path takes them
// only where the audio is better explained that way.
//
// Memory: the back-trace keeps one record per phone entry that survives the
// beam, so it grows with the take's length, not with length × script.
// Thread-safety: pure function of its inputs.
#pragma once

#include "earmark/acoustic/acoustic_model.hpp"
#include "earmark/acoustic/model_features.hpp"
#include "earmark/acoustic/pronunciations.hpp"
#include "earmark/acoustic/senone_scorer.hpp"
#include "earmark/core/progress.hpp"

#include <cstddef>
#include <vector>

namespace earmark {

struct ForcedAlignmentParams {
    bool coverage = true;              // allow skipped / repeated / extra words and an early end
    double skipPenalty = 30.0;         // nats for leaving a word out
    double repeatPenalty = 30.0;       // nats for saying a word again
    double extraPenalty = 25.0;        // nats for entering the garbage unit
    double garbageFramePenalty = 3.0;  // nats per frame spent in it
    double earlyEndPenalty = 28.0;     // nats for leaving the script before its end
    double silencePenalty = 0.0;       // nats for a pause between words
    double beam = 300.0;               // nats below the best token that survive
    // true: `contextFree` already holds contextFreeScores(model, features) of
    // the same features (from an earlier pass); they are reused, not recomputed.
    bool contextFreeGiven = false;
    // Nats taken from a pause's (silence's) score at each frame it covers; empty, or one value per
    // feature frame (ParamError otherwise). Lets the caller rule out pauses over loud speech,
    // which the silence model can fit better than a formant synthesiser's vowel.
    std::vector<float> pauseFramePenalty;
    // Optional: Gaussian evaluations kept across passes over the same features (built with
    // SenoneScorer::kDefaultTopDensities); a later pass reads what an earlier one computed.
    CodebookTopCache* codebookCache = nullptr;
    // Throws ParamError("ForcedAlignmentParams.<field>") for negative values or a beam <= 0.
    void validate() const;
};

// One stretch of the best path: a phone of a script word, a pause, or
// something that is not in the script.
struct PathSegment {
    enum class Kind { Phone, Pause, Extra };
    Kind kind = Kind::Phone;
    int word = -1;            // index into the script's words (Phone)
    int pronunciation = 0;    // which of its pronunciations
    int phoneInWord = 0;      // position of the phone in that pronunciation
    int basePhone = -1;       // model base phone (Phone, Pause)
    std::size_t startFrame = 0, endFrame = 0;  // [start, end)
    double logLikelihood = 0;  // path score gained over the stretch, nats
};

struct ForcedAlignment {
    std::vector<PathSegment> path;  // in time order, covering every frame
    double logLikelihood = 0;       // of the whole path
    bool reachedEnd = true;         // false when no path survived (the result is then empty)
};

// Aligns `words` (at least one) to `features`. Fills `contextFree` with
// contextFreeScores(model, features) on the way (the garbage unit needs
// them every frame, and pronunciation scores reuse them), so each frame's
// Gaussians are evaluated once; with params.contextFreeGiven it reads them
// instead (ParamError when their size does not match the features).
ForcedAlignment forceAlign(const AcousticModel& model, const ModelFeatures& features,
                           const std::vector<ScriptWord>& words, std::vector<float>& contextFree,
                           const ForcedAlignmentParams& params = {}, Progress progress = {});

}  // namespace earmark
