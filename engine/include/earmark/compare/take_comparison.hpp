// Comparing two takes of the same text as a pair: align them
// (compare/take_alignment.hpp), then set their prosody side by side word by
// word (compare/word_comparison.hpp) and sum the pair up in a few figures.
//
// Words of each take come, in this order of preference, from:
// 1. timings given with the take;
// 2. the text, aligned to the take (align/text_aligner.hpp), when a text is
//    given;
// 3. the other take's words carried through a frame-wise alignment, when
//    only one take has words;
// and otherwise there are none: the pair is compared frame-wise only and
// there is no per-word table (a note says so). When both takes have words
// they must be the same words (compared without case and punctuation) and
// the alignment runs word by word.
//
// Overall figures (B against A):
// - durationRatio: length of B's speech over A's. Speech runs from the
//   first word's start to the last word's end, or over the speech span
//   found from energy (align/speech_span.hpp) when there are no words.
// - f0MeanDiffSt: mean over the aligned frame pairs voiced in both takes of
//   12·log2(F0_B / F0_A), signed (positive: B is higher).
// - f0MeanAbsDiffSt: the same mean of the absolute value.
// - f0RangeDiffSt: B's F0 range minus A's, each 12·log2(p95/p5) of its F0
//   over the same aligned pairs (voiced in both; summarisePitch of
//   analysis/take_analysis.hpp), so a frame only one take voices moves no
//   percentile.
// - mcdDb: mel-cepstral distortion (Kubichek 1993, compare/mcd.hpp) averaged
//   over the aligned frame pairs.
//
// F0 frames are matched to cepstral frames by time (nearest frame).
// Pure function; reentrant except that text alignment serialises on the
// renderer (align/speech_render.hpp).
#pragma once

#include "earmark/align/text_aligner.hpp"
#include "earmark/analysis/take_analysis.hpp"
#include "earmark/compare/take_alignment.hpp"
#include "earmark/compare/word_comparison.hpp"
#include "earmark/prosody/prosody_context.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct CompareParams {
    // Cepstra for both the warping path and MCD: 25 coefficients (c0 … c24;
    // MCD uses c1 … c24, common practice) from 40 HTK-scale bands at 16 kHz,
    // 5 ms hop. Mean normalisation is ignored here (see dtwCoefficients).
    MfccParams cepstra = defaultCepstra();
    // The path is found on the first this many coefficients, each with its
    // mean over the take subtracted (a fixed voice or channel colouring
    // then does not pull the path); 1 … cepstra.coefficients.
    int dtwCoefficients = 13;
    TakeAlignParams alignment;
    AlignParams text;  // words from the text (reference voice, rate)
    PitchParams pitch;
    EnergyParams energy;
    ProsodyParams prosody;
    WordFlagParams flags;

    static MfccParams defaultCepstra() {
        MfccParams p;
        p.coefficients = 25;
        return p;
    }
    // Throws ParamError naming the field.
    void validate() const;
};

struct TakeInput {
    Signal audio;
    std::optional<Tier> words;  // word timings of this take, seconds from its start
};

enum class WordSource {
    None,      // no words: frame-wise only
    Given,     // timings given with the take
    FromText,  // aligned from the text
    Carried,   // the other take's words carried through the frame alignment
};
const char* wordSourceName(WordSource s);  // "none", "given", "text", "carried"

struct TakeSide {
    double durationS = 0.0;
    double speechStartS = 0.0, speechEndS = 0.0;  // see durationRatio above
    WordSource wordSource = WordSource::None;
    Tier words{"words", {}};    // empty when wordSource is None
    PitchTrack pitch;           // the F0 track used (for lanes)
    PitchSummary pitchSummary;  // of the whole take
};

struct OverallFigures {
    double durationRatio = 1.0;
    std::optional<double> f0MeanDiffSt;     // empty when no pair is voiced in both
    std::optional<double> f0MeanAbsDiffSt;  // ditto
    std::optional<double> f0RangeDiffSt;    // empty when no pair is voiced in both
    double mcdDb = 0.0;
    int alignedPairs = 0;
    int voicedPairs = 0;  // pairs voiced in both takes
};

struct TakeComparison {
    TakeSide a, b;
    TakeAlignment alignment;
    // One entry per alignment pair: F0 of B above A in semitones (NaN where
    // either frame is unvoiced) and the pair's MCD in dB. For a lane.
    std::vector<float> pairF0DiffSt;
    std::vector<float> pairMcdDb;
    OverallFigures overall;
    std::optional<WordTable> words;  // empty when neither take has words
    std::vector<std::string> notes;  // how the pair was aligned, in words
};

// Throws:
// - InputError("A" / "B", …): empty audio, audio without speech, too short;
// - InputError("wordsA" / "wordsB", …): words that do not fit the take, or
//   words that differ between the takes (naming the first that differs);
// - InputError("text", …): text the aligner cannot use (see alignText);
// - ParamError for invalid params; Cancelled if `progress` asks.
TakeComparison compareTakes(const TakeInput& a, const TakeInput& b, const std::string& text = {},
                            const CompareParams& params = {}, Progress progress = {});

}  // namespace earmark
