// Looping a span without a click at the loop point: the end of each pass
// cross-fades (linearly, over `crossfadeSeconds`) into the start of the
// next, so the loop lasts length − crossfade per pass.
//
// Play `firstPass` once, then `body` again and again: where one body (or
// the first pass) ends, the next body starts with the sample that follows
// in the span, faded into the span's start.
//
// Errors: ParamError("LoopParams.crossfadeSeconds") for a negative fade or
// one longer than half the span; ParamError("Signal.sampleRate").
// Thread-safety: pure functions.
#pragma once

#include "earmark/core/signal.hpp"

#include <cstddef>

namespace earmark {

struct Loop {
    Signal firstPass;  // span[0, L − C)
    Signal body;       // span[C, L − C) with its first C samples: span[L − C + i]·(1 − g) + span[i]·g, g = (i + 0.5)/C
};

Loop makeLoop(const Signal& span, double crossfadeSeconds);

// The first pass followed by `passes` − 1 bodies (passes >= 1).
Signal renderLoop(const Signal& span, double crossfadeSeconds, std::size_t passes);

}  // namespace earmark
