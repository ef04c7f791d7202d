// Scoring of F0 tracks against synthetic truth, with the error measures of
// Chu & Alwan, "Reducing F0 frame error of F0 tracking algorithms under noisy
// conditions with an unvoiced/voiced classification frontend", ICASSP 2009:
// - GPE (gross pitch error): share of frames voiced in both truth and
//   estimate where |f̂/f − 1| > 20 %;
// - VDE (voicing decision error): share of frames whose voiced/unvoiced
//   decision differs from the truth;
// plus the median relative fine error |f̂/f − 1| over the non-gross frames
// (as in de Cheveigné & Kawahara, JASA 2002, which reports gross and fine
// errors separately).
//
// Only frames whose whole analysis window lies inside ONE segment of the
// synthetic signal are scored (no segment boundary within ±halfWindow of the
// frame time): at a boundary the truth itself is ambiguous. This covers
// voiced frames (like SyntheticVoice::fullyVoicedAround, and also excluding
// voiced-to-voiced F0 steps) and unvoiced ones (silence or noise) alike.
#pragma once

#include "support/test_signals.hpp"

#include <algorithm>
#include <cmath>
#include <span>
#include <vector>

namespace earmark::test {

// Scoring half-window: covers the frames of Earmark's YIN at its defaults
// (33.6 ms span) and aubio's (17.4 ms), plus margin.
inline constexpr double kScoringHalfWindowSeconds = 0.02;
// Rate of the synthetic voices of the YIN comparisons.
inline constexpr double kSyntheticVoiceRate = 22050.0;

struct FrameEstimate {
    double timeSeconds = 0.0;  // time the estimate describes (frame centre)
    double f0Hz = 0.0;         // 0 = unvoiced
};

struct PitchScores {
    double gpe = 0.0;        // fraction
    double fineError = 0.0;  // median relative error, fraction
    double vde = 0.0;        // fraction
    int scoredFrames = 0;
    int bothVoiced = 0;
};

// Segment boundaries (seconds) of a synthesised voice, as synthesiseVoice lays them out.
inline std::vector<double> segmentBoundaries(const std::vector<VoiceSegment>& segments, double rate) {
    std::vector<double> b{0.0};
    long long samples = 0;
    for (const auto& s : segments) {
        samples += std::llround(s.seconds * rate);
        b.push_back(static_cast<double>(samples) / rate);
    }
    return b;
}

inline PitchScores scoreTrack(const SyntheticVoice& truth, const std::vector<double>& boundaries,
                              std::span<const FrameEstimate> frames, double halfWindowSeconds) {
    PitchScores s;
    const double duration = truth.signal.durationSeconds();
    int decisionErrors = 0, gross = 0;
    std::vector<double> fine;
    for (const auto& f : frames) {
        const double a = f.timeSeconds - halfWindowSeconds, b = f.timeSeconds + halfWindowSeconds;
        if (a < 0.0 || b > duration) continue;
        const bool crossesBoundary = std::any_of(boundaries.begin(), boundaries.end(),
                                                 [&](double x) { return x > a && x < b; });
        if (crossesBoundary) continue;
        ++s.scoredFrames;
        const double ref = truth.f0At(f.timeSeconds);
        const bool refVoiced = ref > 0.0, estVoiced = f.f0Hz > 0.0;
        if (refVoiced != estVoiced) ++decisionErrors;
        if (refVoiced && estVoiced) {
            ++s.bothVoiced;
            const double rel = std::fabs(f.f0Hz / ref - 1.0);
            if (rel > 0.2) ++gross;
            else fine.push_back(rel);
        }
    }
    if (s.scoredFrames > 0) s.vde = static_cast<double>(decisionErrors) / s.scoredFrames;
    if (s.bothVoiced > 0) s.gpe = static_cast<double>(gross) / s.bothVoiced;
    if (!fine.empty()) {
        auto mid = fine.begin() + static_cast<std::ptrdiff_t>(fine.size() / 2);
        std::nth_element(fine.begin(), mid, fine.end());
        s.fineError = *mid;
    }
    return s;
}

}  // namespace earmark::test
