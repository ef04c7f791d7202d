// What an attention matrix says about timing, and where it went wrong.
//
// Token timing: a monotonic path through the matrix, found by dynamic
// programming — the path maximises the summed attention weight of its cells
// and moves by 0 or +1 token per decoder frame, from token 0 at the first
// frame to the last token at the last frame (so every token gets at least
// one frame; needs frames >= tokens). This is the monotonic alignment
// search used by flow-based synthesis models, with summed weights instead
// of summed log-likelihoods (common practice for reading attention). Ties
// prefer staying on the token. Decoder frame f lasts [f·hop, (f+1)·hop)
// seconds, as in per-token durations (tiers/token_durations.hpp).
//
// Faults, from each frame's most-attended token (the argmax; ties take the
// lower token). Runs of equal argmax shorter than `minHoldFrames` are
// flicker and ignored. Walking the remaining runs in order, with `reached`
// the furthest token so far (−1 before the first run):
// - Skip: a run's token is at least `minSkipTokens` beyond `reached`: the
//   tokens in between were never attended. Tokens after `reached` when the
//   frames end count as skipped at the last frame by the same rule (the
//   end acts as a run on one past the last token).
// - Repeat: a run's token lies before `reached`: attention went back to an
//   earlier token after moving on. Consecutive such runs make one event.
// Both are classic failures of attention-based synthesis (skipped or
// repeated words).
//
// Pure functions; reentrant.
#pragma once

#include "earmark/model/attention.hpp"
#include "earmark/tiers/tier.hpp"
#include "earmark/tiers/token_durations.hpp"

#include <string>
#include <vector>

namespace earmark {

struct AttentionParams {
    TokenDurationsParams frame;  // samples per decoder frame and sample rate (256 at 22 050 Hz)
    int minSkipTokens = 2;       // forward jump that counts as a skip, >= 2
    int minHoldFrames = 2;       // shorter argmax runs are flicker, >= 1
    // Throws ParamError("AttentionParams.<field>").
    void validate() const;
    double hopSeconds() const { return frame.hopSize / frame.sampleRate; }
};

struct AttentionPath {
    std::vector<int> tokenOfFrame;           // one per frame, non-decreasing by 0 or 1
    std::vector<int> firstFrame, lastFrame;  // per token, inclusive
    double score = 0.0;                      // summed weight along the path
};

// Throws InputError("attention", …) when the matrix is empty or has fewer
// frames than tokens.
AttentionPath monotonicPath(const AttentionMatrix& matrix);

enum class AttentionFault { Skip, Repeat };
const char* attentionFaultName(AttentionFault fault);  // "skip", "repeat"

struct AttentionEvent {
    AttentionFault kind = AttentionFault::Skip;
    int firstFrame = 0, lastFrame = 0;  // Skip: the frame of the jump (both); Repeat: the run(s) back
    double startS = 0.0, endS = 0.0;    // firstFrame·hop, (lastFrame + 1)·hop
    int firstToken = 0, lastToken = 0;  // Skip: the tokens jumped over; Repeat: the tokens attended again
};

// Throws ParamError for invalid params; InputError("attention", …) for an
// empty matrix.
std::vector<AttentionEvent> attentionFaults(const AttentionMatrix& matrix, const AttentionParams& params = {});

struct AttentionAlignment {
    AttentionPath path;
    Tier tokens{
        "tokens",
        {}};  // one interval per token with a non-empty label; confidence = mean weight on the path (clamped to 0–1)
    std::vector<int> argmax;  // per frame
    std::vector<AttentionEvent> faults;
    double durationS = 0.0;  // frames · hop
};

// All of the above. `labels` has one entry per token (its text; an empty
// one makes no interval, like a pause token). Throws as the parts, and
// ParamError("alignAttention.labels") when the count differs from the matrix.
AttentionAlignment alignAttention(const AttentionMatrix& matrix, const std::vector<std::string>& labels,
                                  const AttentionParams& params = {});

}  // namespace earmark
