#include "earmark/model/attention_alignment.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cstdint>
#include <limits>

namespace earmark {
namespace {

void checkMatrix(const AttentionMatrix& m) {
    if (m.frames < 1 || m.tokens < 1) throw InputError("attention", "the matrix is empty");
}

std::vector<int> argmaxPerFrame(const AttentionMatrix& m) {
    std::vector<int> out(static_cast<std::size_t>(m.frames));
    for (int f = 0; f < m.frames; ++f) {
        const float* row = m.weights.data() + static_cast<std::size_t>(f) * m.tokens;
        out[f] = static_cast<int>(std::max_element(row, row + m.tokens) - row);  // first of equal maxima
    }
    return out;
}

}  // namespace

void AttentionParams::validate() const {
    frame.validate();
    if (minSkipTokens < 2) throw ParamError("AttentionParams.minSkipTokens", "must be at least 2");
    if (minHoldFrames < 1) throw ParamError("AttentionParams.minHoldFrames", "must be at least 1");
}

const char* attentionFaultName(AttentionFault fault) { return fault == AttentionFault::Skip ? "skip" : "repeat"; }

AttentionPath monotonicPath(const AttentionMatrix& m) {
    checkMatrix(m);
    const int T = m.frames, K = m.tokens;
    if (T < K)
        throw InputError("attention", "has " + std::to_string(T) + " frames for " + std::to_string(K) +
                                          " tokens: a monotonic path needs at least one frame per token");
    constexpr double kNone = -std::numeric_limits<double>::infinity();
    // Q[k] after frame t = best sum ending on token k; `advanced` keeps the step taken into each cell.
    std::vector<double> q(static_cast<std::size_t>(K), kNone), next(static_cast<std::size_t>(K));
    std::vector<std::uint8_t> advanced(static_cast<std::size_t>(T) * K, 0);
    q[0] = m.at(0, 0);
    for (int t = 1; t < T; ++t) {
        // Token k is reachable at frame t only if k <= t, and the last token only if K − 1 − k <= T − 1 − t.
        const int kLo = std::max(0, K - (T - t)), kHi = std::min(K - 1, t);
        std::fill(next.begin(), next.end(), kNone);
        for (int k = kLo; k <= kHi; ++k) {
            const double stay = q[k];
            const double move = k > 0 ? q[k - 1] : kNone;
            const bool up = move > stay;  // ties stay
            next[k] = (up ? move : stay) + m.at(t, k);
            advanced[static_cast<std::size_t>(t) * K + k] = up ? 1 : 0;
        }
        q.swap(next);
    }
    AttentionPath path;
    path.score = q[K - 1];
    path.tokenOfFrame.resize(static_cast<std::size_t>(T));
    int k = K - 1;
    for (int t = T - 1; t >= 0; --t) {
        path.tokenOfFrame[t] = k;
        if (t > 0 && advanced[static_cast<std::size_t>(t) * K + k]) --k;
    }
    path.firstFrame.assign(static_cast<std::size_t>(K), -1);
    path.lastFrame.assign(static_cast<std::size_t>(K), -1);
    for (int t = 0; t < T; ++t) {
        const int tok = path.tokenOfFrame[t];
        if (path.firstFrame[tok] < 0) path.firstFrame[tok] = t;
        path.lastFrame[tok] = t;
    }
    return path;
}

std::vector<AttentionEvent> attentionFaults(const AttentionMatrix& m, const AttentionParams& params) {
    params.validate();
    checkMatrix(m);
    const std::vector<int> arg = argmaxPerFrame(m);
    const double hop = params.hopSeconds();
    std::vector<AttentionEvent> events;
    const auto event = [&](AttentionFault kind, int f0, int f1, int k0, int k1) {
        events.push_back({kind, f0, f1, f0 * hop, (f1 + 1) * hop, k0, k1});
    };
    int reached = -1;
    bool inRepeat = false;
    for (int start = 0; start < m.frames;) {
        int end = start;
        while (end + 1 < m.frames && arg[end + 1] == arg[start]) ++end;
        const int token = arg[start];
        if (end - start + 1 >= params.minHoldFrames) {
            if (token < reached) {
                if (inRepeat) {  // continue the event
                    AttentionEvent& e = events.back();
                    e.lastFrame = end;
                    e.endS = (end + 1) * hop;
                    e.firstToken = std::min(e.firstToken, token);
                    e.lastToken = std::max(e.lastToken, token);
                } else {
                    event(AttentionFault::Repeat, start, end, token, token);
                }
                inRepeat = true;
            } else {
                if (token - reached >= params.minSkipTokens)
                    event(AttentionFault::Skip, start, start, reached + 1, token - 1);
                reached = std::max(reached, token);
                inRepeat = false;
            }
        }
        start = end + 1;
    }
    if (m.tokens - reached >= params.minSkipTokens)
        event(AttentionFault::Skip, m.frames - 1, m.frames - 1, reached + 1, m.tokens - 1);
    return events;
}

AttentionAlignment alignAttention(const AttentionMatrix& m, const std::vector<std::string>& labels,
                                  const AttentionParams& params) {
    params.validate();
    if (labels.size() != static_cast<std::size_t>(m.tokens))
        throw ParamError("alignAttention.labels",
                         "has " + std::to_string(labels.size()) + " tokens, the matrix " + std::to_string(m.tokens));
    AttentionAlignment out;
    out.path = monotonicPath(m);
    out.argmax = argmaxPerFrame(m);
    out.faults = attentionFaults(m, params);
    const double hop = params.hopSeconds();
    out.durationS = m.frames * hop;
    out.tokens.name = std::string(kTokensTier);
    for (int k = 0; k < m.tokens; ++k) {
        if (labels[k].empty()) continue;
        const int f0 = out.path.firstFrame[k], f1 = out.path.lastFrame[k];
        double sum = 0.0;
        for (int f = f0; f <= f1; ++f) sum += m.at(f, k);
        const double confidence = std::clamp(sum / (f1 - f0 + 1), 0.0, 1.0);
        out.tokens.intervals.push_back(Interval{f0 * hop, (f1 + 1) * hop, labels[k], confidence});
    }
    return out;
}

}  // namespace earmark
