// Per-word prosody: duration, F0 level, range, peak position and slope,
// energy, voicing, neighbouring pauses and a prominence score.
//
// F0 figures use the voiced frames whose centres lie in [startS, endS); they
// are empty when fewer than ProsodyParams::minVoicedFrames are voiced.
#pragma once

#include "earmark/prosody/prosody_context.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct WordMeasures {
    std::string text;
    double startS = 0.0, endS = 0.0, durationS = 0.0;
    int syllables = 0;
    std::optional<double> f0MeanHz, f0MinHz, f0MaxHz;
    std::optional<double> f0RangeSt;        // 12·log2(max/min)
    std::optional<double> f0PeakPosition;   // (time of the F0 maximum − start) / duration, 0–1
    std::optional<double> f0SlopeStPerS;    // least-squares slope of F0 in semitones over time (voiced frames)
    std::optional<double> energyMeanDb;     // 10·log10 of the mean power of the energy frames (dBFS)
    std::optional<double> energyMaxDb;      // loudest energy frame (dBFS)
    double voicedFraction = 0.0;            // voiced frames / frames inside the word
    std::optional<double> pauseBeforeS;     // gap to the previous word (0 if they touch); empty for the first
    std::optional<double> pauseAfterS;      // gap to the next word; empty for the last
    // Σ weight·z over (F0 max in st, mean energy dB, duration per syllable),
    // z-scores within the take (ProminenceWeights; common practice). A part
    // that is undefined for this word contributes 0; all words have 0 when
    // the take has fewer than 2 words.
    double prominence = 0.0;
};

// One entry per word of the context's word tier (empty when there is none).
std::vector<WordMeasures> measureWords(const ProsodyContext& context);

}  // namespace earmark
