#include "earmark/acoustic/model_aligner.hpp"

#include "earmark/acoustic/evidence_trust.hpp"
#include "earmark/acoustic/word_evidence.hpp"
#include "earmark/core/error.hpp"

namespace earmark {

namespace {

WordEvidenceResult modelEvidence(const Signal& take, const std::string& text, const std::string& voice,
                                 Progress progress) {
    WordEvidenceParams params;
    params.voice = voice;
    return gatherWordEvidence(take, text, params, progress);
}

AlignResult asAlignResult(WordEvidenceResult evidence, const Signal& take, const std::string& voice) {
    AlignResult result;
    result.tiers = std::move(evidence.tiers);
    result.tiers.durationS = take.durationSeconds();
    result.meanConfidence = evidence.meanConfidence;
    result.voiceName = voice;
    result.method = "model";
    return result;
}

}  // namespace

AlignResult alignWithModel(const Signal& take, const std::string& text, const std::string& voice, Progress progress) {
    return asAlignResult(modelEvidence(take, text, voice, progress), take, voice);
}

AlignResult alignWithModelOrReference(const Signal& take, const std::string& text, const std::string& voice,
                                      Progress progress) {
    WordEvidenceResult evidence = modelEvidence(take, text, voice, progress.sub(0.0, 0.6));
    // Words the model placed in its word tier among those up to the last one it placed (words after
    // it may simply not be in this stretch of audio; words it hears as something else have no place).
    std::size_t placed = 0, upToLast = 0;
    for (std::size_t i = 0; i < evidence.words.size(); ++i)
        if (evidence.words[i].spoken) {
            ++placed;
            upToLast = i + 1;
        }
    const bool fits = evidenceDoubt(evidence).empty() &&
                      static_cast<double>(placed) >= kMinPlacedInOrder * static_cast<double>(upToLast);
    if (fits) return asAlignResult(std::move(evidence), take, voice);
    AlignParams params;
    params.speech.voice = voice;
    return alignText(take, text, params, progress.sub(0.6, 1.0));
}

std::string resolveAlignMethod(const std::string& requested, const std::string& voice) {
    if (requested != "auto" && requested != "model" && requested != "reference")
        throw ParamError("method", "expects auto, model or reference, not '" + requested + "'");
    if (requested == "reference") return requested;
    if (modelCoversVoice(voice)) return "model";
    if (requested == "auto") return "reference";
    if (!modelCoversVoice("en"))
        throw InputError("acoustic model", "not installed (Debian package pocketsphinx-en-us); use --method reference");
    throw ParamError("method", "model covers English only; voice '" + voice + "' needs the reference method");
}

}  // namespace earmark
