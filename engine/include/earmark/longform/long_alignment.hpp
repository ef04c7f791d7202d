// Aligning a long text (a chapter) to a long take in bounded memory.
//
// The text is outlined into paragraphs and sentences (text_outline.hpp) and
// cut into chunks of whole sentences of about `chunkTargetSeconds` of
// expected speech (syllables, syllables.hpp, × the seconds per syllable
// measured so far). Chunks are aligned in order, each on its own stretch of
// the take: from the end of the previous chunk's last word (the anchor) over
// the expected length of the chunk and the next `lookaheadSentences`
// sentences (× `spanFactor` + `spanSlackSeconds`), moved to the nearest
// pause; the last chunk gets 25 % + 3 s more than expected. The chunk's text is given
// to the aligner with those next sentences, which soak up the error of the
// expected length either way; only the chunk's own words are kept, and its
// last word's end is the next anchor. So errors do not add up over the take,
// and memory is that of one chunk's alignment.
//
// The aligner is a parameter (ChunkAligner), so any word aligner can be
// used; referenceWarpingAligner wraps alignText (text_aligner.hpp),
// modelChunkAligner the trained acoustic model's forced alignment.
//
// Result tiers: "paragraphs" and "sentences" (from their first word's start
// to their last word's end; labels: the paragraph's first sentence, or the
// sentence), "words" (with confidence) and "phones".
//
// Errors: InputError("text", …) for text without words, text longer than the
// take (sentences left when the take's speech is used up), and text that
// leaves more than `maxUncoveredSeconds` of the take's speech after its last
// word ("covers only …"); errors of the aligner; Cancelled.
// Thread-safety: reentrant when the aligner is.
#pragma once

#include "earmark/align/text_aligner.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/tiers/tier.hpp"

#include <functional>
#include <string>

namespace earmark {

inline constexpr std::string_view kParagraphsTier = "paragraphs";
inline constexpr std::string_view kSentencesTier = "sentences";

// Words (and phones) of `text` in `audio`; times from the start of `audio`.
using ChunkAligner = std::function<AlignResult(const Signal& audio, const std::string& text, Progress progress)>;

// alignText with these params.
ChunkAligner referenceWarpingAligner(const AlignParams& params = {});
// The trained acoustic model's forced alignment of text read in `voice`
// (English voices), falling back to the reference for a chunk the model does
// not fit (alignWithModelOrReference, acoustic/model_aligner.hpp).
ChunkAligner modelChunkAligner(const std::string& voice);
// The aligner of a resolved method ("model" or "reference", see
// resolveAlignMethod) for text read in `voice`. Throws ParamError("method", …) for another name.
ChunkAligner chunkAlignerFor(const std::string& method, const std::string& voice);

struct LongAlignParams {
    double chunkTargetSeconds = 40.0;     // expected speech per chunk, s. Valid: [5, 600]
    int lookaheadSentences = 2;           // sentences after the chunk given to the aligner. Valid: [0, 10]
    double spanFactor = 1.0;              // audio given to a chunk: expected length × this … Valid: [0.5, 4]
    double spanSlackSeconds = 0.0;        // … + this, s. Valid: [0, 60]
    double initialSecondsPerSyllable = 0.2;  // before the first chunk is aligned. Valid: (0, 2]
    double maxUncoveredSeconds = 15.0;    // speech after the last word allowed, s. Valid: > 0
    void validate() const;  // throws ParamError("LongAlignParams.<field>")
};

struct LongAlignResult {
    TierSet tiers;
    int chunks = 0;
    double meanConfidence = 0.0;  // over words
    // Which aligner made the tiers: the chunks' AlignResult::method when all agree ("model",
    // "reference"), else "model, reference for K of N chunks".
    std::string method;
    int referenceChunks = 0;      // chunks the reference aligner placed
};

LongAlignResult alignLongText(const Signal& take, const std::string& text, const ChunkAligner& aligner,
                              const LongAlignParams& params = {}, Progress progress = {});

}  // namespace earmark
