// Where the speech in a take begins and ends, from short-time energy.
//
// The noise floor is the 10th percentile of frame energy and the speech
// level its 99th percentile; frames more than
// max(minMarginDb, marginFraction·(level − floor)) above the floor count as
// sound. Common practice for endpointing; rough by design (the aligner only
// uses it to centre its search band), so a click in a pause may widen it.
#pragma once

#include "earmark/core/signal.hpp"

namespace earmark {

struct SpeechSpanParams {
    double hopSeconds = 0.010;
    double windowSeconds = 0.030;
    double minMarginDb = 12.0;        // least rise above the floor that counts as sound
    double marginFraction = 0.25;     // share of the floor-to-level range
    double minLevelDbfs = -60.0;      // a take whose speech level is below this is silence
    double minRangeDb = 15.0;         // a take whose level is within this of its floor is silence
};

struct SpeechSpan {
    bool found = false;     // false for silence, steady noise, or an empty take
    double startS = 0.0;    // first sounding frame's centre
    double endS = 0.0;      // last sounding frame's centre
    double floorDb = 0.0;   // dBFS, 10th percentile of frame energy
    double levelDb = 0.0;   // dBFS, 99th percentile
    double thresholdDb = 0.0;  // floor + margin
};

// Throws ParamError for a signal without a sample rate. Reentrant.
SpeechSpan findSpeechSpan(const Signal& take, const SpeechSpanParams& params = {});

}  // namespace earmark
