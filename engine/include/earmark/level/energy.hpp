// Short-time energy: RMS per frame in dBFS.
//
// dBFS here is 20·log10(RMS) with full scale = 1.0, so a full-scale square wave
// reads 0 dBFS and a full-scale sine −3.01 dBFS. Frames are centred
// (frame i at t = i·hop) with zero padding. Silence reads `floorDb`.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <vector>

namespace earmark {

struct EnergyParams {
    double hopSeconds = 0.005;     // frame step
    double windowSeconds = 0.025;  // rectangular RMS window
    double floorDb = -120.0;       // value for digital silence
};

struct EnergyTrack {
    double hopSeconds = 0.0;
    std::vector<float> db;  // one value per frame
};

// Throws ParamError naming the field for invalid params.
EnergyTrack analyseEnergy(const Signal& signal, const EnergyParams& params = {}, Progress progress = {});

}  // namespace earmark
