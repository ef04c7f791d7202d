// Dynamic time warping of two feature sequences inside a band (Sakoe &
// Chiba, "Dynamic programming algorithm optimization for spoken word
// recognition", IEEE Trans. ASSP 26(1), 1978).
//
// Local distance: Euclidean between frame vectors. Steps: the symmetric form
// of Sakoe & Chiba without slope constraint — a diagonal step costs 2·d, a
// step along either sequence alone costs d — so every path from one corner
// to the other weighs the same number of local distances (take + reference
// length) and long and short paths compete fairly.
//
// Only the cells inside the band are stored (float accumulated costs, one
// row of the band per take frame), so memory is 4 bytes × band cells, not
// take × reference. The path is recovered from the stored costs.
//
// Ends: Anchored paths run from (0, 0) to (last, last). With FreeTakeEnds
// the whole reference must be used but the path may start and end anywhere
// on the take axis, so leading and trailing audio that the reference does
// not have (silence, noise, a cough) is left out instead of squeezed in.
// Leaving a take frame out costs its `skipCost`: were it free, a path could
// always get cheaper by dropping take frames and squeezing the reference onto
// fewer of them; with a cost every path accounts for every take frame and
// paths of different spans compare fairly.
#pragma once

#include "earmark/align/mfcc.hpp"
#include "earmark/core/progress.hpp"

#include <cstddef>
#include <vector>

namespace earmark {

// Reference frames allowed for each take frame: row i may use j in
// [lo[i], hi[i]]; hi[i] < lo[i] makes the row empty. Non-empty rows must be
// contiguous in i with lo and hi non-decreasing and lo[i] <= hi[i-1] + 1, so
// the band is one connected strip.
struct DtwBand {
    std::vector<int> lo, hi;  // one entry per take frame
    std::size_t cells() const;
};

// A band of half-width `radius` frames around the straight line through
// (takeA, refA) and (takeB, refB) (fractional frames), extended at the same
// slope, clamped to the matrix. Throws ParamError for empty sequences, a
// negative radius or takeB <= takeA.
DtwBand lineBand(int takeFrames, int refFrames, double takeA, double refA, double takeB, double refB, int radius);

struct DtwPathPoint {
    int take = 0;
    int ref = 0;
    float distance = 0.0f;  // local distance of this cell
    bool skipped = false;   // reached by a skip step (DtwOptions::skipInside): the take frame is left out
};

// A corridor around a path found at a coarser frame rate: every coarse cell
// (i, j) covers fine rows i·factor … i·factor + factor − 1 and columns
// j·factor … j·factor + factor − 1; the corridor adds `radius` fine frames on
// both sides. Rows no coarse cell covers stay empty except within `radius`
// rows of the path's ends. Throws ParamError for factor < 1 or an empty path.
DtwBand corridorBand(const std::vector<DtwPathPoint>& coarsePath, int factor, int takeFrames, int refFrames,
                     int radius);

enum class DtwEnds { Anchored, FreeTakeEnds };

struct DtwOptions {
    DtwEnds ends = DtwEnds::Anchored;
    // FreeTakeEnds: cost of leaving out each take frame before the start or
    // after the end of the path (>= 0, one per take frame); empty = free.
    std::vector<float> skipCost;
    // Also let the path leave out take frames inside it, at the same cost: a
    // step along the take alone costs min(d, skipCost). A pause the take has
    // and the reference lacks is then skipped wherever the speech on both
    // sides matches best, instead of being matched with whichever reference
    // frame looks most like silence. Needs skipCost.
    bool skipInside = false;
};

struct DtwResult {
    std::vector<DtwPathPoint> path;  // from start to end; take and ref never decrease, each step moves by <= 1
    double totalCost = 0.0;          // accumulated (weighted) cost of the path, with skipped frames
    std::size_t cells = 0;           // band cells evaluated (= cells stored)
};

// Throws ParamError when the feature sizes differ, the band does not have one
// row per take frame or is not connected, or skipCost has the wrong size
// (or is empty with skipInside),
// and Error("DTW", …) when no path fits in the band (e.g. an anchored path
// whose corners lie outside it). Cancelled if `progress` asks. Reentrant.
DtwResult dtwAlign(const FeatureMatrix& take, const FeatureMatrix& ref, const DtwBand& band,
                   const DtwOptions& options = {}, Progress progress = {});

}  // namespace earmark
