#include "earmark/core/error.hpp"
#include "earmark/pitch/yin.hpp"

#include <cmath>
#include <cstdio>
#include <string>

namespace earmark {

namespace {

std::string show(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%g", v);
    return buf;
}

void requireRange(double value, double lo, double hi, const char* field, const std::string& why = {}) {
    if (!(value >= lo && value <= hi))  // also rejects NaN
        throw ParamError(std::string("PitchParams.") + field,
                         why.empty() ? "must be in [" + show(lo) + ", " + show(hi) +
                                           "], got " + show(value)
                                     : why + ", got " + show(value));
}

}  // namespace

void PitchParams::validate() const {
    requireRange(minF0Hz, 20.0, 1e6, "minF0Hz", "must be at least 20 Hz");
    if (!(maxF0Hz > minF0Hz) || !std::isfinite(maxF0Hz))
        throw ParamError("PitchParams.maxF0Hz", "must be finite and above minF0Hz, got " + show(maxF0Hz));
    if (!(hopSeconds > 0.0 && hopSeconds <= 1.0))
        throw ParamError("PitchParams.hopSeconds", "must be in (0, 1] s, got " + show(hopSeconds));
    if (!(threshold > 0.0 && threshold <= 1.0))
        throw ParamError("PitchParams.threshold", "must be in (0, 1], got " + show(threshold));
    requireRange(analysisRateHz, 4.0 * maxF0Hz, 192000.0, "analysisRateHz",
                 "must be at least 4·maxF0Hz (" + show(4.0 * maxF0Hz) + " Hz) and at most 192000 Hz");
    if (!(voicingMaxAperiodicity > 0.0 && voicingMaxAperiodicity <= 2.0))
        throw ParamError("PitchParams.voicingMaxAperiodicity",
                         "must be in (0, 2], got " + show(voicingMaxAperiodicity));
    requireRange(noiseVoicingMaxAperiodicity, voicingMaxAperiodicity, 2.0, "noiseVoicingMaxAperiodicity",
                 "must be in [voicingMaxAperiodicity (" + show(voicingMaxAperiodicity) + "), 2]");
    requireRange(silenceGateDb, -200.0, 0.0, "silenceGateDb");
    requireRange(absoluteFloorDb, -200.0, 0.0, "absoluteFloorDb");
    requireRange(minVoicedSeconds, 0.0, 10.0, "minVoicedSeconds");
    requireRange(voicingSwitchCost, 0.0, 100.0, "voicingSwitchCost");
    requireRange(octaveJumpCost, 0.0, 100.0, "octaveJumpCost");
    requireRange(freeGlideSemitonesPerSecond, 0.0, 10000.0, "freeGlideSemitonesPerSecond");
    requireRange(shorterLagPreference, 0.0, 100.0, "shorterLagPreference");
}

}  // namespace earmark
