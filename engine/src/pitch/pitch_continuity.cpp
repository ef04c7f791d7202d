#include "earmark/pitch/pitch_continuity.hpp"

#include "earmark/core/error.hpp"
#include "earmark/pitch/noise_floor.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace earmark {

void dropShortVoicedRuns(std::span<std::uint8_t> choice, int minRunFrames) {
    std::size_t i = 0;
    while (i < choice.size()) {
        if (choice[i] == kUnvoiced) {
            ++i;
            continue;
        }
        std::size_t end = i;
        while (end < choice.size() && choice[end] != kUnvoiced) ++end;
        if (end - i < static_cast<std::size_t>(std::max(0, minRunFrames)))
            std::fill(choice.begin() + static_cast<std::ptrdiff_t>(i), choice.begin() + static_cast<std::ptrdiff_t>(end),
                      kUnvoiced);
        i = end;
    }
}

std::vector<std::uint8_t> trackCandidates(std::span<const PitchCandidates> candidates,
                                          std::span<const std::uint8_t> allowed, const ContinuityCosts& costs) {
    const std::vector<float> clean(candidates.size(), 0.0f);
    return trackCandidates(candidates, allowed, clean, costs);
}

std::vector<std::uint8_t> trackCandidates(std::span<const PitchCandidates> candidates,
                                          std::span<const std::uint8_t> allowed,
                                          std::span<const float> noiseShare, const ContinuityCosts& costs) {
    if (candidates.size() != allowed.size())
        throw ParamError("trackCandidates.allowed", "must have one entry per frame of candidates");
    if (candidates.size() != noiseShare.size())
        throw ParamError("trackCandidates.noiseShare", "must have one entry per frame of candidates");
    constexpr int K = PitchCandidates::kMax;
    constexpr int S = K + 1;  // state 0 = unvoiced, state 1 + k = candidate k
    constexpr double kInf = std::numeric_limits<double>::infinity();
    const std::size_t n = candidates.size();
    std::vector<std::uint8_t> choice(n, kUnvoiced);
    if (n == 0) return choice;
    std::vector<std::uint8_t> back(n * S, 0);

    std::array<double, S> cost{}, next{}, logPrev{}, logCur{};
    const auto voicedStates = [&](std::size_t i) { return allowed[i] ? candidates[i].count : 0; };
    // Local costs of frame i. The shorter-lag preference only ranks the
    // candidates: the cheapest voiced state keeps its unbiased cost, so the
    // voicing decision is not shifted by it.
    const auto fillLocal = [&](std::size_t i, std::array<double, S>& local, std::array<double, S>& logs) {
        local.fill(kInf);
        local[0] = barInNoise(noiseShare[i], costs.unvoicedCost, costs.noisyUnvoicedCostMax);
        const int m = voicedStates(i);
        if (m == 0) return;
        double shortest = kInf;
        for (int k = 0; k < m; ++k) {
            logs[1 + k] = std::log2(static_cast<double>(candidates[i].dips[k].lag));
            shortest = std::min(shortest, logs[1 + k]);
        }
        double plainMin = kInf, biasedMin = kInf;
        for (int k = 0; k < m; ++k) {
            const double plain = candidates[i].dips[k].aperiodicity;
            plainMin = std::min(plainMin, plain);
            local[1 + k] = plain + costs.shorterLagPreference * (logs[1 + k] - shortest);
            biasedMin = std::min(biasedMin, local[1 + k]);
        }
        for (int k = 0; k < m; ++k) local[1 + k] -= biasedMin - plainMin;
    };
    fillLocal(0, cost, logPrev);
    std::array<double, S> local{};
    for (std::size_t i = 1; i < n; ++i) {
        fillLocal(i, local, logCur);
        const int prevStates = 1 + voicedStates(i - 1);
        for (int s = 0; s < 1 + voicedStates(i); ++s) {
            double best = kInf;
            int arg = 0;
            for (int p = 0; p < prevStates; ++p) {
                double c = cost[p];
                if ((s == 0) != (p == 0)) c += costs.switchCost;
                else if (s != 0)
                    c += costs.octaveJumpCost * std::max(0.0, std::fabs(logCur[s] - logPrev[p]) - costs.freeOctavesPerFrame);
                if (c < best) {
                    best = c;
                    arg = p;
                }
            }
            next[s] = best + local[s];
            back[i * S + static_cast<std::size_t>(s)] = static_cast<std::uint8_t>(arg);
        }
        for (int s = 1 + voicedStates(i); s < S; ++s) next[s] = kInf;
        // Keep the numbers small over long takes: only differences matter.
        const double floor = *std::min_element(next.begin(), next.end());
        for (auto& c : next) c -= floor;
        cost = next;
        logPrev = logCur;
    }
    int s = static_cast<int>(std::min_element(cost.begin(), cost.end()) - cost.begin());
    for (std::size_t i = n - 1;; --i) {
        choice[i] = s == 0 ? kUnvoiced : static_cast<std::uint8_t>(s - 1);
        if (i == 0) break;
        s = back[i * S + static_cast<std::size_t>(s)];
    }
    return choice;
}

}  // namespace earmark
