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

}  // namespace

PhoneScore scorePhone(const AcousticModel& model, const std::vector<float>& contextFree, int expected,
                      std::size_t start, std::size_t end, double insertionPenalty) {
    PhoneScore out;
    if (end <= start) return out;
    const int nPhones = model.basePhoneCount();
    const std::size_t perFrame = static_cast<std::size_t>(nPhones) * S;
    const float* scores = contextFree.data();
    const double numerator = forcedPhone(model, scores, perFrame, expected, start, end);

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
    // The loop pays one insertion penalty per phone; give it back so a
    // single-phone match compares evenly with the forced phone.
    const double denominator = loopExit == kNone ? numerator : loopExit;
    for (int e = loopBack; e >= 0; e = entries[static_cast<std::size_t>(e)].prev)
        out.heard.push_back(entries[static_cast<std::size_t>(e)].phone);
    std::reverse(out.heard.begin(), out.heard.end());
    const double loopWithoutFirstPenalty = denominator + insertionPenalty;
    out.score = (numerator - std::max(numerator, loopWithoutFirstPenalty)) / static_cast<double>(end - start);
    return out;
}

}  // namespace earmark
