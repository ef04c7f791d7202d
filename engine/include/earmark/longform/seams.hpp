// Measures at the joins of a long take rendered in chunks. Joins are either
// known (times from the renderer's chunk list) or candidates: the middle of
// every pause (speech_activity.hpp). At each join:
// - level step: speech level (power mean of the speech frames' energy, dB)
//   over `contextSeconds` after the join minus before it;
// - room-tone step: median energy of the pause's frames after the join minus
//   before it (30 ms kept off the pause's edges); NaN when no pause holds the
//   join or a half has fewer than 5 frames;
// - click: the largest |x[n] − x[n−1]| in the pause (±50 ms of the join when
//   no pause holds it) over the RMS of the differences on the louder side of
//   it (1…10 ms before or after), in dB; 0 when the peak is below −60 dBFS;
//   capped at 120 dB;
// - envelope jump: the symmetric KL divergence (timbre.hpp) between the
//   MFCC models of the voiced frames before and after (same context), over
//   the median of that divergence at all joins (a ratio; NaN when a side
//   has too few voiced frames).
// Level step and envelope jump need 3 s of speech on each side.
// Thresholds and their sources: longform_rules.hpp, docs/longform.md.
//
// Thread-safety: pure function.
#pragma once

#include "earmark/core/signal.hpp"
#include "earmark/longform/long_take.hpp"
#include "earmark/longform/longform_rules.hpp"

#include <string>
#include <vector>

namespace earmark {

struct JoinMeasures {
    double timeS = 0.0;
    bool known = false;                 // from the chunk list
    double pauseStartS = 0.0, pauseEndS = 0.0;  // the pause holding the join (both = timeS when none)
    double levelStepDb = 0.0;
    double roomToneStepDb = 0.0;
    double clickDb = 0.0;
    double clickTimeS = 0.0;
    double envelopeJump = 0.0;
};

// Throws InputError(origin, …) naming the first join outside (0, durationS).
void checkJoins(const std::vector<double>& knownJoins, double durationS, const std::string& origin = "chunks");

// `knownJoins`: seconds from the start of the take; when empty the pauses
// are the candidates. Throws InputError(origin, …) naming the first join
// outside (0, duration).
std::vector<JoinMeasures> measureJoins(const Signal& take, const LongTakeTracks& tracks,
                                       const std::vector<double>& knownJoins, const LongformRules::Seam& rules,
                                       const std::string& origin = "chunks");

}  // namespace earmark
