// Alignment of a text to a take with the trained acoustic model, in the
// shape every aligner returns (AlignResult: word and phone tiers, mean word
// confidence), and the choice between it and the espeak-ng reference with
// DTW (text_aligner.hpp) that `align` and `longform` share.
//
// Thread-safety: as gatherWordEvidence (word_evidence.hpp).
#pragma once

#include "earmark/align/text_aligner.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <string>

namespace earmark {

// gatherWordEvidence(take, text, {voice}) as an AlignResult: its "words"
// (with confidence) and "phones" tiers, durationS the take's length,
// voiceName = `voice`, method "model". Throws as gatherWordEvidence.
AlignResult alignWithModel(const Signal& take, const std::string& text, const std::string& voice,
                           Progress progress = {});

// The model where it fits the take, else the espeak-ng reference with DTW.
// The model does not fit when it places under half of the text's words
// (evidence_trust.hpp), or places in its word tier fewer than
// kMinPlacedInOrder of the words up to the last one it placed (a voice far
// from the recorded speech it was trained on, such as a formant
// synthesiser, loses words — skipped or heard as something else — all along
// a long passage; a real reading loses one now and then). Then the text is aligned
// again with alignText (voice `voice`) and that result (method "reference")
// is returned.
// The project's own choice, from chunks of 40–55 s (tests/engine/longform):
// festival's HTS voice places all, espeak-ng's en-us voice 36–99 %.
inline constexpr double kMinPlacedInOrder = 0.95;
AlignResult alignWithModelOrReference(const Signal& take, const std::string& text, const std::string& voice,
                                      Progress progress = {});

// The method that runs for `requested` ("auto", "model" or "reference") and
// text read in `voice`: auto is the model where it covers the voice
// (modelCoversVoice), else the reference. Returns "model" or "reference".
// Throws ParamError("method", …) for another name or for "model" with a
// voice the model does not cover, InputError("acoustic model", …) for
// "model" when the model is not installed.
std::string resolveAlignMethod(const std::string& requested, const std::string& voice);

}  // namespace earmark
