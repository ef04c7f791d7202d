#include "earmark/spectral/mel.hpp"

#include <cmath>

namespace earmark {

namespace {
// Slaney's Auditory Toolbox scale: 200/3 Hz per mel up to 1 kHz (15 mel),
// then a step of ln(6.4)/27 in ln(f) per mel.
constexpr double kSlaneyHzPerMel = 200.0 / 3.0;
constexpr double kSlaneyBreakHz = 1000.0;
constexpr double kSlaneyBreakMel = kSlaneyBreakHz / kSlaneyHzPerMel;  // 15
const double kSlaneyLogStep = std::log(6.4) / 27.0;
}  // namespace

double hzToMel(double hz, MelScale scale) {
    if (scale == MelScale::Htk) return 2595.0 * std::log10(1.0 + hz / 700.0);
    if (hz < kSlaneyBreakHz) return hz / kSlaneyHzPerMel;
    return kSlaneyBreakMel + std::log(hz / kSlaneyBreakHz) / kSlaneyLogStep;
}

double melToHz(double mel, MelScale scale) {
    if (scale == MelScale::Htk) return 700.0 * (std::pow(10.0, mel / 2595.0) - 1.0);
    if (mel < kSlaneyBreakMel) return mel * kSlaneyHzPerMel;
    return kSlaneyBreakHz * std::exp((mel - kSlaneyBreakMel) * kSlaneyLogStep);
}

}  // namespace earmark
