// Whether a take's word evidence is worth showing at all. When the model
// places only a few of the script's words (a voice far from the recorded
// speech it was trained on, or audio that is not the script), every word
// would read as skipped or extra: one quiet sentence says so instead of a
// lane full of suspects.
//
// Plain values; thread-safe as values are.
#pragma once

#include "earmark/acoustic/word_evidence.hpp"

#include <string>

namespace earmark {

// Share of the script's words the model placed (spoken or said as
// something else), 0…1; 0 for no words.
double placedShare(const WordEvidenceResult& evidence);

// Common practice: below half of the script placed, the alignment is not
// to be trusted word by word.
inline constexpr double kMinPlacedShare = 0.5;

// "" when the evidence can be shown, else one sentence for people saying why not.
std::string evidenceDoubt(const WordEvidenceResult& evidence, double minPlacedShare = kMinPlacedShare);

}  // namespace earmark
