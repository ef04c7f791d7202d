#include "earmark/acoustic/pronunciation_score.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace earmark {
namespace {

constexpr double kNone = -std::numeric_limits<double>::infinity();
constexpr int S = AcousticModel::kStates;

// Best path through one phone's states over [start, end), entering state 0
// at `start` and leaving after the last state at `end`.
double forcedPhone(const AcousticModel& model, const float* scores, std::size_t perFrame, int phone,
                   std::size_t start, std::size_t end) {
    const auto& A = model.transitions(phone);
    double sc[S] = {kNone, kNone, kNone};
    for (std::size_t t = start; t < end; ++t) {
        const float* ci = scores + t * perFrame + static_cast<std::size_t>(phone * S);
        double next[S];
        for (int j = 0; j < S; ++j) {
            double best = (t == start && j == 0) ? 0.0 : kNone;
            for (int i = 0; i <= j; ++i)
                if (sc[i] != kNone && A[static_cast<std::size_t>(i)][static_cast<std::size_t>(j)] != -INFINITY)
                    best = std::max(best, sc[i] + A[static_cast<std::size_t>(i)][static_cast<std::size_t>(j)]);
            next[j] = best == kNone ? kNone : best + ci[j];
        }
        std::copy(next, next + S, sc);
    }
    double exit = kNone;
    for (int j = 0; j < S; ++j)
        if (sc[j] != kNone && A[static_cast<std::size_t>(j)][S] != -INFINITY) exit = std::max(exit, sc[j] + A[static_cast<std::size_t>(j)][S]);
    if (exit == kNone) {
        // Too short for the phone's topology: frame-wise best state instead.
        exit = 0;
        for (std::size_t t = start; t < end; ++t) {
            const float* ci = scores + t * perFrame + static_cast<std::size_t>(phone * S);
            exit += *std::max_element(ci, ci + S);
        }
    }
    return exit;
}

// Best path through a sequence of context-free phones over [start, end):
// each phone's states left to right, its exit into the next phone's first
// state; the path starts in the first phone and leaves after the last.
// kNone when the stretch is too short for the sequence.
double forcedSequence(const AcousticModel& model, const float* scores, std::size_t perFrame,
                      const std::vector<int>& phones, std::size_t start, std::size_t end) {
    const std::size_t n = phones.size() * S;
    std::vector<double> sc(n, kNone), next(n);
    for (std::size_t t = start; t < end; ++t) {
        for (std::size_t m = 0; m < phones.size(); ++m) {
            const auto& A = model.transitions(phones[m]);
            const float* ci = scores + t * perFrame + static_cast<std::size_t>(phones[m] * S);
            // Entering this phone: the start of the path, or the previous phone's exit.
            double enter = kNone;
            if (m == 0 && t == start) enter = 0.0;
            if (m > 0) {
                const auto& P = model.transitions(phones[m - 1]);
                for (int j = 0; j < S; ++j) {
                    const double v = sc[(m - 1) * S + static_cast<std::size_t>(j)];
                    if (v != kNone && P[static_cast<std::size_t>(j)][S] != -INFINITY)
                        enter = std::max(enter, v + P[static_cast<std::size_t>(j)][S]);
                }
            }
            for (int j = 0; j < S; ++j) {
                double best = j == 0 ? enter : kNone;
                for (int i = 0; i <= j; ++i) {
                    const double v = sc[m * S + static_cast<std::size_t>(i)];
                    const float a = A[static_cast<std::size_t>(i)][static_cast<std::size_t>(j)];
                    if (v != kNone && a != -INFINITY) best = std::max(best, v + a);
                }
                next[m * S + static_cast<std::size_t>(j)] = best == kNone ? kNone : best + ci[j];
            }
        }
        sc.swap(next);
    }
    double exit = kNone;
    const auto& A = model.transitions(phones.back());
    for (int j = 0; j < S; ++j) {
        const double v = sc[n - S + static_cast<std::size_t>(j)];
        if (v != kNone && A[static_cast<std::size_t>(j)][S] != -INFINITY) exit = std::max(exit, v + A[static_cast<std::size_t>(j)][S]);
    }
    return exit;
}

}  // namespace

namespace {

struct FreeLoop {
    double logLikelihood = kNone;  // of the best free sequence, with its insertion penalties
    std::vector<int> heard;
};

// The best free phone sequence over [start, end): any phone after any other,
// `insertionPenalty` nats per phone entered.
FreeLoop freeLoop(const AcousticModel& model, const std::vector<float>& contextFree, std::size_t start,
                  std::size_t end, double insertionPenalty) {
    const int nPhones = model.basePhoneCount();
    const std::size_t perFrame = static_cast<std::size_t>(nPhones) * S;
    const float* scores = contextFree.data();
    FreeLoop out;

    // Phone loop with back-pointers to phone entries.
    struct Entry {
        int prev;
        int phone;
    };
    std::vector<Entry> entries;
    std::vector<double> sc(perFrame, kNone), next(perFrame);
    std::vector<int> back(perFrame, -1), nextBack(perFrame);
    double loopExit = 0.0;  // score available to enter a phone at this frame
    int loopBack = -1;
    for (std::size_t t = start; t < end; ++t) {
        const float* ci = scores + t * perFrame;
        double bestExit = kNone;
        int bestExitBack = -1;
        for (int p = 0; p < nPhones; ++p) {
            if (model.isFiller(p) && p != model.silencePhone()) continue;
            const auto& A = model.transitions(p);
            const std::size_t o = static_cast<std::size_t>(p * S);
            for (int j = 0; j < S; ++j) {
                double best = kNone;
                int b = -1;
                for (int i = 0; i <= j; ++i) {
                    const float a = A[static_cast<std::size_t>(i)][static_cast<std::size_t>(j)];
                    if (sc[o + static_cast<std::size_t>(i)] == kNone || a == -INFINITY) continue;
                    if (sc[o + static_cast<std::size_t>(i)] + a > best) {
                        best = sc[o + static_cast<std::size_t>(i)] + a;
                        b = back[o + static_cast<std::size_t>(i)];
                    }
                }
                if (j == 0 && loopExit != kNone && loopExit - insertionPenalty > best) {
                    best = loopExit - insertionPenalty;
                    entries.push_back({loopBack, p});
                    b = static_cast<int>(entries.size()) - 1;
                }
                next[o + static_cast<std::size_t>(j)] = best == kNone ? kNone : best + ci[o + static_cast<std::size_t>(j)];
                nextBack[o + static_cast<std::size_t>(j)] = b;
            }
            for (int j = 0; j < S; ++j) {
                const double v = next[o + static_cast<std::size_t>(j)];
                const float a = A[static_cast<std::size_t>(j)][S];
                if (v != kNone && a != -INFINITY && v + a > bestExit) {
                    bestExit = v + a;
                    bestExitBack = nextBack[o + static_cast<std::size_t>(j)];
                }
            }
        }
        sc.swap(next);
        back.swap(nextBack);
        std::fill(next.begin(), next.end(), kNone);
        loopExit = bestExit;
        loopBack = bestExitBack;
    }
    out.logLikelihood = loopExit;
    for (int e = loopBack; e >= 0; e = entries[static_cast<std::size_t>(e)].prev)
        out.heard.push_back(entries[static_cast<std::size_t>(e)].phone);
    std::reverse(out.heard.begin(), out.heard.end());
    return out;
}

// GOP of a forced path against the free loop, the loop given back `penalties` insertion penalties
// (those the forced path does not pay for the phones it has).
double gop(double forced, const FreeLoop& loop, int penalties, double insertionPenalty, std::size_t frames) {
    const double denominator = loop.logLikelihood == kNone ? forced : loop.logLikelihood;
    const double loopWithout = denominator + penalties * insertionPenalty;
    return (forced - std::max(forced, loopWithout)) / static_cast<double>(frames);
}

}  // namespace

PhoneScore scorePhone(const AcousticModel& model, const std::vector<float>& contextFree, int expected,
                      std::size_t start, std::size_t end, double insertionPenalty) {
    PhoneScore out;
    if (end <= start) return out;
    const std::size_t perFrame = static_cast<std::size_t>(model.basePhoneCount()) * S;
    const double numerator = forcedPhone(model, contextFree.data(), perFrame, expected, start, end);
    FreeLoop loop = freeLoop(model, contextFree, start, end, insertionPenalty);
    // The loop pays one insertion penalty per phone; give one back so a
    // single-phone match compares evenly with the forced phone.
    out.score = gop(numerator, loop, 1, insertionPenalty, end - start);
    out.heard = std::move(loop.heard);
    return out;
}

PhoneScore scorePhones(const AcousticModel& model, const std::vector<float>& contextFree,
                       const std::vector<int>& expected, std::size_t start, std::size_t end, double insertionPenalty) {
    PhoneScore out;
    if (end <= start || expected.empty()) return out;
    const std::size_t perFrame = static_cast<std::size_t>(model.basePhoneCount()) * S;
    const double forced = forcedSequence(model, contextFree.data(), perFrame, expected, start, end);
    FreeLoop loop = freeLoop(model, contextFree, start, end, insertionPenalty);
    out.heard = std::move(loop.heard);
    if (forced == kNone) {  // too short for the sequence: as far off as the loop allows
        out.score = -std::numeric_limits<double>::infinity();
        return out;
    }
    out.score = gop(forced, loop, static_cast<int>(expected.size()), insertionPenalty, end - start);
    return out;
}

}  // namespace earmark
