#include "earmark/model/mel_settings.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/text_file.hpp"
#include "io/json_text.hpp"

#include <nlohmann/json.hpp>

#include <cerrno>
#include <cstring>
#include <fstream>
#include <sstream>

namespace earmark {
namespace {

using nlohmann::json;

// The sidecar's names (export/mel_npy.cpp writes them).
std::optional<MelScale> scaleFrom(std::string_view s) {
    if (s == "htk") return MelScale::Htk;
    if (s == "slaney") return MelScale::Slaney;
    return std::nullopt;
}
std::optional<MelNormalisation> normalisationFrom(std::string_view s) {
    if (s == "area" || s == "slaney") return MelNormalisation::Area;
    if (s == "none") return MelNormalisation::None;
    return std::nullopt;
}
std::optional<SpectrumKind> spectrumFrom(std::string_view s) {
    if (s == "magnitude") return SpectrumKind::Magnitude;
    if (s == "power") return SpectrumKind::Power;
    return std::nullopt;
}
std::optional<WindowShape> windowFrom(std::string_view s) {
    if (s == "hann-periodic" || s == "hann") return WindowShape::Hann;
    if (s == "hamming-periodic" || s == "hamming") return WindowShape::Hamming;
    if (s == "rectangular") return WindowShape::Rectangular;
    return std::nullopt;
}
std::optional<FrameAlignment> alignmentFrom(std::string_view s) {
    if (s == "centred") return FrameAlignment::Centred;
    if (s == "vocoder-padded") return FrameAlignment::VocoderPadded;
    return std::nullopt;
}

std::string text(double v) {
    std::ostringstream o;
    o << v;
    return o.str();
}
std::string text(int v) { return std::to_string(v); }
std::string text(MelLogBase v) { return melLogBaseName(v); }
template <typename Enum>
std::string text(Enum v) {
    return sidecarName(v);
}

template <typename T>
void pick(const std::optional<T>& option, const std::optional<T>& sidecar, T& out, const char* name,
          ResolvedMelSettings& r) {
    if (option) {
        if (sidecar && !(*sidecar == *option))
            r.overrides.push_back(std::string(name) + ": " + text(*option) + " (option) instead of " + text(*sidecar) +
                                  " (sidecar)");
        out = *option;
    } else if (sidecar) {
        out = *sidecar;
    } else {
        r.assumed.push_back(std::string(name) + " " + text(out));
    }
}

// Reads one key with `parse`; throws naming the key.
template <typename T, typename Parse>
void readKey(const json& j, const char* key, std::optional<T>& out, const std::string& path, Parse parse) {
    const auto it = j.find(key);
    if (it == j.end() || it->is_null()) return;
    out = parse(*it);
    if (!out) throw InputError(path, std::string(key) + ": " + it->dump() + " is not a valid value");
}

template <typename Fn>
auto named(Fn fromName) {
    return
        [fromName](const json& v) { return v.is_string() ? fromName(v.get<std::string>()) : decltype(fromName(""))(); };
}
auto positiveNumber() {
    return [](const json& v) {
        return v.is_number() && v.get<double>() > 0 ? std::optional<double>(v.get<double>()) : std::nullopt;
    };
}
auto nonNegativeNumber() {
    return [](const json& v) {
        return v.is_number() && v.get<double>() >= 0 ? std::optional<double>(v.get<double>()) : std::nullopt;
    };
}
auto anyNumber() {
    return [](const json& v) { return v.is_number() ? std::optional<double>(v.get<double>()) : std::nullopt; };
}
auto count() {
    return [](const json& v) {
        return v.is_number_integer() && v.get<long long>() >= 1 && v.get<long long>() <= (1 << 24)
                   ? std::optional<int>(static_cast<int>(v.get<long long>()))
                   : std::nullopt;
    };
}

}  // namespace

const char* melLogBaseName(MelLogBase base) {
    switch (base) {
    case MelLogBase::Natural: return "natural";
    case MelLogBase::Log10: return "log10";
    case MelLogBase::Decibel: return "decibel";
    case MelLogBase::Linear: return "none";
    }
    return "natural";
}

std::optional<MelLogBase> parseMelLogBase(std::string_view name) {
    if (name == "natural" || name == "ln") return MelLogBase::Natural;
    if (name == "log10") return MelLogBase::Log10;
    if (name == "decibel" || name == "db") return MelLogBase::Decibel;
    if (name == "none" || name == "linear") return MelLogBase::Linear;
    return std::nullopt;
}

MelParams MelSettings::melParams() const {
    MelParams p;
    p.stft.fftSize = fftSize;
    p.stft.windowSize = windowSize;
    p.stft.hopSize = hopSize;
    p.stft.window = window;
    p.stft.alignment = alignment;
    p.bands = bands;
    p.fminHz = fminHz;
    p.fmaxHz = fmaxHz;
    p.scale = scale;
    p.normalisation = normalisation;
    p.kind = spectrum;
    switch (log) {
    case MelLogBase::Natural:
    case MelLogBase::Log10: p.log = LogScale::Natural; break;
    case MelLogBase::Decibel: p.log = LogScale::Decibel; break;
    case MelLogBase::Linear: p.log = LogScale::None; break;
    }
    p.floor = logFloor;
    return p;
}

void MelSettings::validate() const {
    if (!(sampleRateHz > 0)) throw ParamError("MelSettings.sampleRateHz", "must be positive");
    if (log != MelLogBase::Decibel && log != MelLogBase::Linear && !(logFloor > 0))
        throw ParamError("MelSettings.logFloor", "must be positive for a natural or base-10 log");
    try {
        melParams().validate(sampleRateHz);
    } catch (const ParamError& e) {
        // Name the field as this struct calls it.
        std::string field = e.subject();
        if (const auto dot = field.rfind('.'); dot != std::string::npos) field = field.substr(dot + 1);
        throw ParamError("MelSettings." + field, e.problem());
    }
}

MelSettings melSettingsOf(const MelParams& params, double sampleRateHz) {
    MelSettings s;
    s.sampleRateHz = sampleRateHz;
    s.hopSize = params.stft.hopSize;
    s.fftSize = params.stft.fftSize;
    s.windowSize = params.stft.windowSize;
    s.window = params.stft.window;
    s.alignment = params.stft.alignment;
    s.bands = params.bands;
    s.fminHz = params.fminHz;
    s.fmaxHz = params.fmaxHz;
    s.scale = params.scale;
    s.normalisation = params.normalisation;
    s.spectrum = params.kind;
    s.log = params.log == LogScale::Natural   ? MelLogBase::Natural
            : params.log == LogScale::Decibel ? MelLogBase::Decibel
                                              : MelLogBase::Linear;
    s.logFloor = params.floor;
    return s;
}

ResolvedMelSettings resolveMelSettings(const MelSettingsGiven& o, const MelSettingsGiven& s) {
    ResolvedMelSettings r;
    MelSettings& m = r.settings;
    pick(o.sampleRateHz, s.sampleRateHz, m.sampleRateHz, "sample_rate", r);
    pick(o.hopSize, s.hopSize, m.hopSize, "hop_size", r);
    pick(o.fftSize, s.fftSize, m.fftSize, "fft_size", r);
    pick(o.windowSize, s.windowSize, m.windowSize, "window_size", r);
    pick(o.window, s.window, m.window, "window", r);
    pick(o.alignment, s.alignment, m.alignment, "frame_alignment", r);
    pick(o.bands, s.bands, m.bands, "bands", r);
    pick(o.fminHz, s.fminHz, m.fminHz, "fmin_hz", r);
    pick(o.fmaxHz, s.fmaxHz, m.fmaxHz, "fmax_hz", r);
    pick(o.scale, s.scale, m.scale, "mel_scale", r);
    pick(o.normalisation, s.normalisation, m.normalisation, "normalisation", r);
    pick(o.spectrum, s.spectrum, m.spectrum, "spectrum", r);
    pick(o.log, s.log, m.log, "log", r);
    // A dB floor is meaningless for ln and the other way round: the default
    // floor follows the log base unless a floor was given.
    if (!o.logFloor && !s.logFloor && m.log == MelLogBase::Decibel) m.logFloor = -100.0;
    pick(o.logFloor, s.logFloor, m.logFloor, "log_floor", r);
    return r;
}

MelSidecar readMelSidecar(const std::string& path) {
    const json j = io_detail::parseJsonText<json>(readTextFile(path), path);
    if (!j.is_object()) throw InputError(path, "is not a JSON object of mel settings");
    MelSidecar out;
    MelSettingsGiven& g = out.settings;
    readKey(j, "sample_rate", g.sampleRateHz, path, positiveNumber());
    readKey(j, "hop_size", g.hopSize, path, count());
    readKey(j, "fft_size", g.fftSize, path, count());
    readKey(j, "window_size", g.windowSize, path, count());
    readKey(j, "window", g.window, path, named(windowFrom));
    readKey(j, "frame_alignment", g.alignment, path, named(alignmentFrom));
    readKey(j, "bands", g.bands, path, count());
    readKey(j, "fmin_hz", g.fminHz, path, nonNegativeNumber());
    readKey(j, "fmax_hz", g.fmaxHz, path, positiveNumber());
    readKey(j, "mel_scale", g.scale, path, named(scaleFrom));
    readKey(j, "normalisation", g.normalisation, path, named(normalisationFrom));
    readKey(j, "spectrum", g.spectrum, path, named(spectrumFrom));
    readKey(j, "log", g.log, path, named(parseMelLogBase));
    readKey(j, "log_floor", g.logFloor, path, anyNumber());
    readKey(j, "frames", out.frames, path, count());
    readKey(j, "layout", out.bandsFirst, path, [](const json& v) {
        if (!v.is_string()) return std::optional<bool>();
        const std::string s = v.get<std::string>();
        if (s == "bands x frames") return std::optional<bool>(true);
        if (s == "frames x bands") return std::optional<bool>(false);
        return std::optional<bool>();
    });
    return out;
}

}  // namespace earmark
