// A synthesis model's predicted mel spectrogram, read from a NumPy .npy
// file (export/npy.hpp: float16, float32 or float64, any byte order), with
// the settings it was made with.
//
// Settings (model/mel_settings.hpp) come from the caller's options first,
// then from a sidecar JSON (Earmark's own form, export/mel_npy.hpp: by
// default "<file>.npy.json" when it exists), then MelSettings' defaults —
// the common neural-TTS feature settings — each listed in `assumed`.
//
// Layout: the array is bands × frames or frames × bands (leading axes of
// size 1 dropped, model/array_layout.hpp). The caller's choice wins, then
// the sidecar's "layout"; otherwise the axis whose size equals the band
// count is the band axis. An array whose two axes both have that size throws
// AmbiguousLayout; one with neither throws InputError naming both sizes.
//
// Plausibility of the log base (common practice, a heuristic): ln of mel
// magnitudes rarely goes below −25 (the floor is usually ln 1e-5 ≈ −11.5),
// decibels rarely stay inside a 25 dB span, linear values are never
// negative; a file that breaks the rule for its log base gets a warning.
//
// Pure functions; calls on different files may run concurrently.
#pragma once

#include "earmark/model/mel_settings.hpp"
#include "earmark/spectral/spectrogram.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark {

enum class MelLayout {
    Auto,           // decide from the sidecar or the band count
    BandsByFrames,  // shape (bands, frames): Earmark's own .npy and most models
    FramesByBands,  // shape (frames, bands)
};
const char* melLayoutName(MelLayout layout);  // "auto", "bands-frames", "frames-bands"

struct PredictedMelOptions {
    MelLayout layout = MelLayout::Auto;
    MelSettingsGiven settings;               // win over the sidecar
    std::optional<std::string> sidecarPath;  // read this sidecar (must exist)…
    bool useSidecar = true;                  // … or "<file>.npy.json" if it exists; false: none
};

struct PredictedMel {
    // frames × bands, frame-major, values as in the file except that base-10
    // logs are converted to natural logs (×ln 10): `log` is Natural,
    // Decibel or None. Frame times per settings (Centred: i·hop).
    Spectrogram mel;
    MelSettings settings;
    MelLayout layout = MelLayout::BandsByFrames;  // as stored in the file
    std::string layoutFrom;                       // "option", "sidecar" or "band count"
    std::string dtype;                            // as stored, e.g. "<f2"
    std::optional<std::string> sidecarPath;       // the sidecar read, if any
    std::vector<std::string> assumed;             // settings from neither the options nor a sidecar
    std::vector<std::string> warnings;            // overrides, frame-count and plausibility findings
};

// Throws InputError(path, …) for an unreadable or malformed file, a shape
// that does not fit the band count, a bad sidecar (readMelSidecar);
// AmbiguousLayout(path, …) as above; ParamError("MelSettings.<field>") for
// settings that are not valid together.
PredictedMel readPredictedMel(const std::string& path, const PredictedMelOptions& options = {});

}  // namespace earmark
