// Writes a mel spectrogram as a NumPy .npy array of shape (bands, frames),
// float32 — the layout most synthesis models use for their mel features — plus
// a sidecar "<path>.json" with the settings needed to compare it with a
// model's own features (rate, hop, n_fft, window, bands, fmin, fmax, scale,
// normalisation, magnitude/power, log base and floor, frame alignment).
#pragma once

#include "earmark/spectral/mel.hpp"

#include <string>

namespace earmark {

// Throws Error naming the path if it cannot be written.
void writeMelNpy(const std::string& path, const Spectrogram& mel, const MelParams& params);

// The words the sidecar uses for each setting (read back by model/mel_settings).
const char* sidecarName(MelScale scale);                  // "htk", "slaney"
const char* sidecarName(MelNormalisation normalisation);  // "area", "none"
const char* sidecarName(SpectrumKind spectrum);           // "magnitude", "power"
const char* sidecarName(FrameAlignment alignment);        // "centred", "vocoder-padded"
const char* sidecarName(WindowShape window);              // "hann-periodic", "hamming-periodic", "rectangular"

// The sidecar's file name for a given .npy path.
std::string melSidecarPath(const std::string& npyPath);

}  // namespace earmark
