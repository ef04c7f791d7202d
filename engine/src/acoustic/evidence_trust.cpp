#include "earmark/acoustic/evidence_trust.hpp"

#include <cmath>

namespace earmark {

double placedShare(const WordEvidenceResult& evidence) {
    if (evidence.words.empty()) return 0.0;
    std::size_t placed = 0;
    for (const WordEvidence& w : evidence.words) placed += w.spoken || w.substituted;
    return static_cast<double>(placed) / static_cast<double>(evidence.words.size());
}

std::string evidenceDoubt(const WordEvidenceResult& evidence, double minPlacedShare) {
    const double share = placedShare(evidence);
    if (share >= minPlacedShare) return {};
    std::size_t placed = static_cast<std::size_t>(std::lround(share * static_cast<double>(evidence.words.size())));
    return "the acoustic model placed only " + std::to_string(placed) + " of " + std::to_string(evidence.words.size()) +
           " script words: word evidence not shown (the voice or the audio may be outside what the model knows)";
}

}  // namespace earmark
