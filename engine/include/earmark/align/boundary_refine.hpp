// Fine-tuning aligned boundaries on the take's own energy.
//
// A boundary carried through a DTW path is only as exact as the path's
// frames. Each boundary has an acoustic landmark nearby: the edge of a pause
// (energy rising at an onset, falling at an offset) or the energy dip
// between two sounding segments. The landmark is found twice — near the
// boundary in the reference, and near the carried time in the take — and the
// boundary is set at the take's landmark plus the boundary's offset from the
// landmark in the reference. So the rule the renderer used to place its
// boundary (e.g. a word starts with its stop's closure, before the burst)
// carries over, instead of every boundary being snapped onto the landmark.
// When either landmark is missing within the window, the boundary stays.
//
// Energy: RMS in dB on short frames (level/energy.hpp). Onset and offset
// threshold: the signal's speech level (99th percentile) minus
// `edgeBelowLevelDb`, but at least 6 dB over its floor (10th percentile).
#pragma once

#include "earmark/core/signal.hpp"

#include <vector>

namespace earmark {

enum class BoundaryKind {
    Join,    // sound on both sides (two words, or two phones, in one stretch)
    Onset,   // sound starts after a pause
    Offset,  // sound stops before a pause
};

struct RefineParams {
    double windowSeconds = 0.04;     // search half-width around a boundary, > 0
    double hopSeconds = 0.0025;      // energy frame step
    double frameSeconds = 0.010;     // energy window
    double minDipDb = 6.0;           // a Join dip lies this far below the highest energy on both sides
    double edgeBelowLevelDb = 35.0;  // onset/offset threshold below the speech level
    // Throws ParamError("RefineParams.<field>", …).
    void validate() const;
};

struct BoundaryToRefine {
    double takeS = 0.0;       // carried time in the take
    double referenceS = 0.0;  // the same boundary in the reference
    BoundaryKind kind = BoundaryKind::Join;
};

// Returns one refined time per boundary (a moved boundary moves at most
// windowSeconds plus its offset from the landmark in the reference, itself
// under windowSeconds). Throws ParamError for invalid params or signals
// without a sample rate. Reentrant.
std::vector<double> refineBoundaries(const Signal& take, const Signal& reference,
                                     const std::vector<BoundaryToRefine>& boundaries,
                                     const RefineParams& params = {});

}  // namespace earmark
