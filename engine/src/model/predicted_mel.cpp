#include "earmark/model/predicted_mel.hpp"

#include "array2d.hpp"
#include "earmark/export/mel_npy.hpp"
#include "earmark/model/array_layout.hpp"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <numbers>

namespace earmark {
namespace {

// Bands of the filterbank: centre (peak) frequency of each.
std::vector<double> bandCentres(const MelSettings& s) {
    const double lo = hzToMel(s.fminHz, s.scale), hi = hzToMel(s.fmaxHz, s.scale);
    std::vector<double> out(static_cast<std::size_t>(s.bands));
    for (int b = 0; b < s.bands; ++b) out[b] = melToHz(lo + (hi - lo) * (b + 1) / (s.bands + 1.0), s.scale);
    return out;
}

void checkPlausible(const PredictedMel& p, std::vector<std::string>& warnings) {
    const auto [lo, hi] = std::minmax_element(p.mel.values.begin(), p.mel.values.end());
    const std::string range = detail::formatted("%.1f", *lo) + " … " + detail::formatted("%.1f", *hi);
    const char* base = melLogBaseName(p.settings.log);
    switch (p.settings.log) {
    case MelLogBase::Natural:
    case MelLogBase::Log10:
        if (*lo < -25.0)
            warnings.push_back(std::string("values span ") + range + ", which looks like decibels, not a " + base +
                               " log: check the log base");
        else if (*lo >= 0.0 && *hi > 50.0)
            warnings.push_back(std::string("values span ") + range + ", which looks like a linear mel, not a " + base +
                               " log: check the log base");
        break;
    case MelLogBase::Decibel:
        if (*hi - *lo < 25.0)
            warnings.push_back("values span only " + range +
                               ", which looks like a natural log, not decibels: check the log base");
        break;
    case MelLogBase::Linear:
        if (*lo < 0.0)
            warnings.push_back("values span " + range + ", negative values cannot be a linear mel: check the log base");
        break;
    }
}

}  // namespace

const char* melLayoutName(MelLayout layout) {
    switch (layout) {
    case MelLayout::Auto: return "auto";
    case MelLayout::BandsByFrames: return "bands-frames";
    case MelLayout::FramesByBands: return "frames-bands";
    }
    return "auto";
}

PredictedMel readPredictedMel(const std::string& path, const PredictedMelOptions& options) {
    NpyArray npy = readNpy(path);
    PredictedMel out;
    out.dtype = npy.dtype;
    detail::Array2d a = detail::squeezeTo2d(std::move(npy), path, "a mel spectrogram");

    MelSidecar sidecar;
    if (options.sidecarPath) {
        sidecar = readMelSidecar(*options.sidecarPath);
        out.sidecarPath = options.sidecarPath;
    } else if (options.useSidecar && std::filesystem::exists(melSidecarPath(path))) {
        out.sidecarPath = melSidecarPath(path);
        sidecar = readMelSidecar(*out.sidecarPath);
    }
    const bool bandsKnown = options.settings.bands || sidecar.settings.bands;
    ResolvedMelSettings resolved = resolveMelSettings(options.settings, sidecar.settings);
    // The band count is read off the array when it is known nowhere else and the layout is given.
    out.settings = resolved.settings;
    const std::string shape = detail::shapeText(a.rows, a.cols);

    // Layout.
    MelLayout layout = options.layout;
    if (layout != MelLayout::Auto) {
        out.layoutFrom = "option";
    } else if (sidecar.bandsFirst) {
        layout = *sidecar.bandsFirst ? MelLayout::BandsByFrames : MelLayout::FramesByBands;
        out.layoutFrom = "sidecar";
    } else {
        const int n = out.settings.bands;
        const std::string known = bandsKnown ? "" : " (assumed: no band count was given)";
        if (a.rows == n && a.cols == n)
            throw AmbiguousLayout(path, "shape " + shape + " has " + std::to_string(n) +
                                            " on both axes, so it may be bands × frames or frames × bands");
        if (a.rows != n && a.cols != n)
            throw InputError(path, "shape " + shape + " has no axis of " + std::to_string(n) + " bands" + known +
                                       ": give the band count, or the layout (bands × frames or frames × bands)");
        layout = a.rows == n ? MelLayout::BandsByFrames : MelLayout::FramesByBands;
        out.layoutFrom = "band count";
    }
    out.layout = layout;
    const int bands = layout == MelLayout::BandsByFrames ? a.rows : a.cols;
    const int frames = layout == MelLayout::BandsByFrames ? a.cols : a.rows;
    if (bands != out.settings.bands) {
        if (bandsKnown)
            throw InputError(path, "shape " + shape + " read as " + melLayoutName(layout) + " has " +
                                       std::to_string(bands) + " bands, but the settings say " +
                                       std::to_string(out.settings.bands));
        // Only the default was assumed: the array's own band count is the better guess.
        out.settings.bands = bands;
        std::erase_if(resolved.assumed, [](const std::string& s) { return s.rfind("bands ", 0) == 0; });
    }
    out.settings.validate();
    out.assumed = std::move(resolved.assumed);
    out.warnings = std::move(resolved.overrides);
    if (sidecar.frames && *sidecar.frames != frames)
        out.warnings.push_back("the sidecar says " + std::to_string(*sidecar.frames) + " frames, the array has " +
                               std::to_string(frames));

    Spectrogram& m = out.mel;
    m.frames = frames;
    m.bins = bands;
    m.sampleRate = out.settings.sampleRateHz;
    m.hopSeconds = out.settings.hopSeconds();
    m.kind = out.settings.spectrum;
    m.binCentresHz = bandCentres(out.settings);
    m.values = layout == MelLayout::FramesByBands ? std::move(a.values) : detail::transposed(a.values, a.rows, a.cols);
    if (out.settings.alignment == FrameAlignment::VocoderPadded) {
        // Frame i starts at i·hop − (fft − hop)/2 and is centred fftSize/2 later (spectrogram.hpp).
        const int pad = (out.settings.fftSize - out.settings.hopSize) / 2;
        m.timesSeconds.resize(static_cast<std::size_t>(frames));
        for (int i = 0; i < frames; ++i)
            m.timesSeconds[i] = (static_cast<double>(i) * out.settings.hopSize - pad + out.settings.fftSize / 2) /
                                out.settings.sampleRateHz;
    }
    switch (out.settings.log) {
    case MelLogBase::Log10:
        for (float& v : m.values) v *= static_cast<float>(std::numbers::ln10);
        [[fallthrough]];
    case MelLogBase::Natural: m.log = LogScale::Natural; break;
    case MelLogBase::Decibel: m.log = LogScale::Decibel; break;
    case MelLogBase::Linear: m.log = LogScale::None; break;
    }
    checkPlausible(out, out.warnings);
    return out;
}

}  // namespace earmark
