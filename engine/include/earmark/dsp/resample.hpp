// Sample-rate conversion with libsoxr ("high quality" recipe: passband to
// 91 % of Nyquist, ≥ 100 dB stop-band rejection per the libsoxr docs),
// for analyses that want a fixed rate (e.g. pitch at 16 kHz).
#pragma once

#include "earmark/core/signal.hpp"

namespace earmark {

// Returns `signal` converted to `targetRate` Hz; a copy when the rates match.
// Output length = round(size · target / source). Throws ParamError on a
// non-positive rate, Error if libsoxr fails.
Signal resample(const Signal& signal, double targetRate);

}  // namespace earmark
