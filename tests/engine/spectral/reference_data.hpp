// Loads the numpy reference data written by tests/data/make_reference_data.py.
#pragma once

#include "earmark/export/npy.hpp"
#include "earmark/spectral/mel.hpp"

#include <nlohmann/json.hpp>

#include <cstdio>
#include <fstream>
#include <string>

namespace earmark::test {

inline std::string melDataPath(const std::string& name) {
    return std::string(EARMARK_TEST_DATA_DIR) + "/mel/" + name;
}

// A deviation as text for RecordProperty, e.g. "1.61e-04".
inline std::string formatG(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.3g", v);
    return buf;
}

inline nlohmann::json melReference() {
    std::ifstream in(melDataPath("reference.json"));
    return nlohmann::json::parse(in);
}

// MelParams from one "filterbanks" or "spectrograms" entry of reference.json.
inline MelParams melParamsFrom(const nlohmann::json& j) {
    MelParams p;
    p.stft.fftSize = j.at("fftSize");
    p.stft.windowSize = j.value("windowSize", p.stft.fftSize);
    p.stft.hopSize = j.value("hopSize", p.stft.hopSize);
    p.stft.alignment = j.value("alignment", "centred") == "centred" ? FrameAlignment::Centred
                                                                  : FrameAlignment::VocoderPadded;
    p.stft.padding = j.value("padding", "reflect") == "reflect" ? FramePadding::Reflect : FramePadding::Zeros;
    p.bands = j.at("bands");
    p.fminHz = j.at("fminHz");
    p.fmaxHz = j.at("fmaxHz");
    p.scale = j.at("scale") == "htk" ? MelScale::Htk : MelScale::Slaney;
    p.normalisation = j.at("normalisation") == "area" ? MelNormalisation::Area : MelNormalisation::None;
    p.kind = j.value("kind", "magnitude") == "power" ? SpectrumKind::Power : SpectrumKind::Magnitude;
    const std::string log = j.value("log", "natural");
    p.log = log == "natural" ? LogScale::Natural : log == "decibel" ? LogScale::Decibel : LogScale::None;
    p.floor = j.value("floor", p.floor);
    return p;
}

}  // namespace earmark::test
