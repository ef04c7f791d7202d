// The settings that make a mel spectrogram what it is, complete, so a
// model's predicted mel can be set against Earmark's mel of the same audio:
// rate, STFT framing, filterbank, magnitude or power, and log base.
//
// Earmark's own sidecar (export/mel_npy.hpp, "<file>.npy.json") stores all
// of them; readMelSidecar reads it back, and also accepts "log10" as a log
// base (common in some toolkits' features).
//
// Plain values; thread-safe as values are.
#pragma once

#include "earmark/export/mel_npy.hpp"

#include "earmark/spectral/mel.hpp"

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace earmark {

enum class MelLogBase {
    Natural,  // ln(max(x, floor))
    Log10,    // log10(max(x, floor))
    Decibel,  // 20·log10 (magnitude) or 10·log10 (power), floored at `floor` dB
    Linear,   // no log
};
const char* melLogBaseName(MelLogBase base);  // "natural", "log10", "decibel", "none"
// Also accepts "ln", "db", "linear". nullopt for anything else.
std::optional<MelLogBase> parseMelLogBase(std::string_view name);

// The sidecar's names of the other enumerated settings.

struct MelSettings {
    double sampleRateHz = 22050.0;
    int hopSize = 256;  // samples at sampleRateHz
    int fftSize = 1024;
    int windowSize = 1024;
    WindowShape window = WindowShape::Hann;
    FrameAlignment alignment = FrameAlignment::Centred;
    int bands = 80;
    double fminHz = 0.0;
    double fmaxHz = 8000.0;
    MelScale scale = MelScale::Slaney;
    MelNormalisation normalisation = MelNormalisation::Area;
    SpectrumKind spectrum = SpectrumKind::Magnitude;
    MelLogBase log = MelLogBase::Natural;
    double logFloor = 1e-5;  // linear floor for Natural/Log10, dB for Decibel; unused for Linear

    double hopSeconds() const { return hopSize / sampleRateHz; }
    // The parameters computeMelSpectrogram needs for the same mel; Log10 is
    // computed as Natural (divide by ln 10 for log10 values).
    MelParams melParams() const;
    // Throws ParamError("MelSettings.<field>") as MelParams::validate does,
    // and for a non-positive rate or floor.
    void validate() const;
};

// The settings of a mel computed by Earmark with `params` at `sampleRateHz`.
MelSettings melSettingsOf(const MelParams& params, double sampleRateHz);

// Each setting, when known. Names are those of the sidecar (in brackets).
struct MelSettingsGiven {
    std::optional<double> sampleRateHz;             // sample_rate
    std::optional<int> hopSize;                     // hop_size
    std::optional<int> fftSize;                     // fft_size
    std::optional<int> windowSize;                  // window_size
    std::optional<WindowShape> window;              // window
    std::optional<FrameAlignment> alignment;        // frame_alignment
    std::optional<int> bands;                       // bands
    std::optional<double> fminHz;                   // fmin_hz
    std::optional<double> fmaxHz;                   // fmax_hz
    std::optional<MelScale> scale;                  // mel_scale
    std::optional<MelNormalisation> normalisation;  // normalisation
    std::optional<SpectrumKind> spectrum;           // spectrum
    std::optional<MelLogBase> log;                  // log
    std::optional<double> logFloor;                 // log_floor
};

// Each setting: which source gave it.
enum class SettingSource { Option, Sidecar, Assumed };

struct ResolvedMelSettings {
    MelSettings settings;
    std::vector<std::string> assumed;    // sidecar names of settings neither given nor in the sidecar
    std::vector<std::string> overrides;  // "fmax_hz: 7600 (option) instead of 8000 (sidecar)"
};

// Options first, then the sidecar, then the defaults of MelSettings.
ResolvedMelSettings resolveMelSettings(const MelSettingsGiven& options, const MelSettingsGiven& sidecar);

struct MelSidecar {
    MelSettingsGiven settings;
    std::optional<bool> bandsFirst;  // "layout": "bands x frames" (true) / "frames x bands" (false)
    std::optional<int> frames;       // "frames"
};

// Reads a sidecar. Unknown keys are ignored. Throws InputError(path, …) when
// the file cannot be read, is not a JSON object, or a known key has a value
// of the wrong type or an unknown name ("mel_scale: 'bark' is not htk or slaney").
MelSidecar readMelSidecar(const std::string& path);

}  // namespace earmark
