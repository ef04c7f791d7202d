// Two takes of the same text side by side, for the compare window: both
// takes loaded and analysed (take_loader.hpp) and compared by the engine
// (compare/take_comparison.hpp: DTW on MFCCs, word by word when both have
// words), plus the plain logic of moving between them: a position in one
// take ↔ the matching position in the other through the alignment.
//
// Thread-safety: loadTakePair is reentrant (it is run off the UI thread);
// the rest are pure functions.
#pragma once

#include "earmark/compare/take_comparison.hpp"
#include "earmark/widgets/take_data.hpp"

#include <QString>

#include <memory>
#include <optional>

namespace earmark::widgets {

struct TakePairRequest {
    QString pathA, pathB;
    QString text;            // the script, to align words from (may be empty)
    QString wordsA, wordsB;  // timings files with a "words" tier (may be empty)
};

struct TakePair {
    TakePairRequest request;
    TakeAudioPtr a, b;
    TakeTracksPtr tracksA, tracksB;  // spectrograms of each on its own time axis
    TakeComparison comparison;
};
using TakePairPtr = std::shared_ptr<const TakePair>;

// Throws what loadTake, analyseTake, loadTimings and compareTakes throw
// (InputError naming the file or "text").
TakePairPtr loadTakePair(const TakePairRequest& request, Progress progress = {});

enum class PairSide { A, B };
PairSide otherSide(PairSide side);

// The time in the other take matching `seconds` in take `from`, through
// the alignment (compare/take_alignment.hpp mapTime), clamped to the other
// take's length. Throws ParamError when the alignment has no pairs.
double mapToOtherSide(const TakeComparison& comparison, PairSide from, double seconds);

// F0 of a take in semitones re its own median (12·log2(f0 / median)), one
// point per voiced frame at its time; with `warpToA` (take B) at the time
// in take A the alignment maps it to. Empty without a median.
struct ContourPoint {
    double seconds = 0.0;
    double semitones = 0.0;
};
std::vector<ContourPoint> relativeContour(const TakeComparison& comparison, PairSide side, bool warpToA);

}  // namespace earmark::widgets
