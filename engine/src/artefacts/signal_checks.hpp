// Input checks shared by the artefact detectors. Internal to the engine.
#pragma once

#include "earmark/core/error.hpp"
#include "earmark/core/signal.hpp"

#include <cmath>

namespace earmark::detail {

// ParamError("Signal.sampleRate") for a non-positive or non-finite rate.
inline void checkSignal(const Signal& signal) {
    if (!(signal.sampleRate > 0) || !std::isfinite(signal.sampleRate))
        throw ParamError("Signal.sampleRate", "must be positive");
}

}  // namespace earmark::detail
