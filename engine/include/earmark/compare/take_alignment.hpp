// Aligning two takes of the same text frame by frame, with dynamic time
// warping (Sakoe & Chiba 1978, align/dtw.hpp) on cepstral features.
//
// - Frame-wise: one anchored path from the start of each take's speech to
//   its end, inside a Sakoe–Chiba band around the straight line joining
//   them (so a take spoken uniformly slower stays in the band).
// - Word by word, when both takes have the same words: each word of A is
//   warped onto the same word of B (anchored at both word boundaries), and
//   each pause between two words onto the pause of B when both have one.
//   Word boundaries then match exactly; the path is free only inside words.
//
// Frames follow Earmark's convention (frame i centred at i·hop). A word
// owns the frames whose centres lie in [start, end) (at least the frame
// nearest its middle).
//
// The pairs never decrease in either frame; inside a segment each step
// moves each take by at most one frame (a very short word may share its
// first frame with the word before). Frames of a take's pause that the other take
// lacks, and frames outside the speech, are in no pair.
//
// Memory: 4 bytes per band cell, at most frames × (2·radius + 1) with
// radius ≤ maxBandRadiusSeconds/hop. Pure functions; reentrant.
#pragma once

#include "earmark/align/mfcc.hpp"
#include "earmark/compare/frame_pair.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/tiers/tier.hpp"

#include <cstddef>
#include <vector>

namespace earmark {

struct TakeAlignParams {
    double bandRadiusFraction = 0.2;     // band half-width: this share of the longer segment…
    double minBandRadiusSeconds = 0.25;  // … but at least this …
    double maxBandRadiusSeconds = 3.0;   // … and at most this (memory stays linear in length)
    // Frame-wise: the spans are widened by this on each side (within the
    // take), so weak onsets and final bursts that an energy span misses are
    // still on the path; silence matches silence at the ends. >= 0.
    double spanMarginSeconds = 0.15;
    // Throws ParamError("TakeAlignParams.<field>") for negative or inverted values.
    void validate() const;
};

enum class AlignmentMethod {
    WordByWord,  // both takes have the same words: warped inside words
    FrameWise,   // one path over the whole speech
};

struct TakeAlignment {
    AlignmentMethod method = AlignmentMethod::FrameWise;
    double hopSeconds = 0.0;
    std::vector<FramePair> pairs;  // in path order, see above
    std::size_t dtwCells = 0;      // cells of the largest DTW matrix (4 bytes each)
};

// Frames of `a` and `b` (same dims and hop) between the given times
// (seconds; the speech spans, widened by spanMarginSeconds). Throws
// ParamError for dims/hop that differ or invalid params, InputError("A"/"B",
// …) when a take has no frames.
TakeAlignment alignFrameWise(const FeatureMatrix& a, const FeatureMatrix& b, double aStartS, double aEndS,
                             double bStartS, double bEndS, const TakeAlignParams& params = {}, Progress progress = {});

// Word by word. The tiers must have the same number of words (labels are
// the caller's business). Throws ParamError as above and
// InputError("wordsB", …) when the counts differ or a tier is empty.
TakeAlignment alignWordByWord(const FeatureMatrix& a, const FeatureMatrix& b, const Tier& wordsA, const Tier& wordsB,
                              const TakeAlignParams& params = {}, Progress progress = {});

// The time in take B matching `timeA` in take A along the pairs (linear
// between paired frames, the pair's own offset beyond the ends). With
// `fromB` the other way round. Throws ParamError("TakeAlignment.pairs")
// when there are no pairs.
double mapTime(const TakeAlignment& alignment, double time, bool fromB = false);

// The intervals of `tier` (of take A, or of B with `fromB`) carried to the
// other take through mapTime. Each carried interval lasts at least one hop
// and starts no earlier than the previous one ends; all of it lies within
// [0, otherDurationS]. Labels and confidences are kept.
Tier carryTier(const Tier& tier, const TakeAlignment& alignment, double otherDurationS, bool fromB = false);

}  // namespace earmark
