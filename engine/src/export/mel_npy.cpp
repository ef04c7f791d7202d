#include "earmark/export/mel_npy.hpp"

#include "earmark/core/error.hpp"
#include "earmark/export/npy.hpp"

#include <nlohmann/json.hpp>

#include <fstream>

namespace earmark {
namespace {

const char* name(LogScale l) {
    switch (l) {
    case LogScale::None: return "none";
    case LogScale::Decibel: return "decibel";
    case LogScale::Natural: return "natural";
    }
    return "none";
}

}  // namespace

const char* sidecarName(MelScale scale) { return scale == MelScale::Htk ? "htk" : "slaney"; }
const char* sidecarName(MelNormalisation n) { return n == MelNormalisation::Area ? "area" : "none"; }
const char* sidecarName(SpectrumKind k) { return k == SpectrumKind::Magnitude ? "magnitude" : "power"; }
const char* sidecarName(FrameAlignment a) { return a == FrameAlignment::Centred ? "centred" : "vocoder-padded"; }
const char* sidecarName(WindowShape w) {
    return w == WindowShape::Hann ? "hann-periodic" : w == WindowShape::Hamming ? "hamming-periodic" : "rectangular";
}

std::string melSidecarPath(const std::string& npyPath) { return npyPath + ".json"; }

void writeMelNpy(const std::string& path, const Spectrogram& mel, const MelParams& params) {
    // Stored frame-major in memory; (bands, frames) on disk.
    std::vector<float> transposed(mel.values.size());
    for (int f = 0; f < mel.frames; ++f)
        for (int b = 0; b < mel.bins; ++b)
            transposed[static_cast<std::size_t>(b) * mel.frames + f] = mel.at(f, b);
    writeNpyFloat32(path, transposed, {mel.bins, mel.frames});

    nlohmann::json meta = {
        {"layout", "bands x frames"},
        {"sample_rate", mel.sampleRate},
        {"hop_size", params.stft.hopSize},
        {"hop_s", mel.hopSeconds},
        {"fft_size", params.stft.fftSize},
        {"window_size", params.stft.windowSize},
        {"window", sidecarName(params.stft.window)},
        {"frame_alignment", sidecarName(params.stft.alignment)},
        {"bands", params.bands},
        {"fmin_hz", params.fminHz},
        {"fmax_hz", params.fmaxHz},
        {"mel_scale", sidecarName(params.scale)},
        {"normalisation", sidecarName(params.normalisation)},
        {"spectrum", sidecarName(params.kind)},
        {"log", name(params.log)},
        {"log_floor", params.floor},
        {"frames", mel.frames},
    };
    const std::string sidecar = melSidecarPath(path);
    std::ofstream out(sidecar);
    out << meta.dump(2) << "\n";
    if (!out) throw WriteError(sidecar, "cannot be written");
}

}  // namespace earmark
