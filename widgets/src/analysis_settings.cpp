#include "earmark/widgets/analysis_settings.hpp"

#include "earmark/core/error.hpp"

#include <QSettings>

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

namespace {

int spectrogramHop(const AnalysisSettings& s, double sampleRate, double durationSeconds) {
    const int hop = std::max(1, static_cast<int>(std::lround(s.hopMs * 1e-3 * sampleRate)));
    const double samples = durationSeconds * sampleRate;
    const int minHop = static_cast<int>(std::ceil(samples / AnalysisSettings::maxSpectrogramFrames));
    return std::max(hop, minHop);
}

}  // namespace

void AnalysisSettings::validate() const {
    if (!(f0MinHz > 0)) throw ParamError("AnalysisSettings.f0MinHz", "must be positive");
    if (!(f0MaxHz > f0MinHz)) throw ParamError("AnalysisSettings.f0MaxHz", "must be above the minimum F0");
    if (!(hopMs > 0)) throw ParamError("AnalysisSettings.hopMs", "must be positive");
    if (fftSize < 16) throw ParamError("AnalysisSettings.fftSize", "must be at least 16");
    if (melBands < 1) throw ParamError("AnalysisSettings.melBands", "must be at least 1");
    if (!(melFmaxHz > melFminHz) || melFminHz < 0)
        throw ParamError("AnalysisSettings.melFmaxHz", "must be above the mel minimum frequency");
}

AnalysisParams AnalysisSettings::toParams(double sampleRate, double durationSeconds) const {
    validate();
    AnalysisParams p;
    p.tracks.loudness = true;
    // The view shows the take at its own rate (the hop below is in its samples).
    p.melRateHz = 0.0;
    p.pitch.minF0Hz = f0MinHz;
    p.pitch.maxF0Hz = f0MaxHz;
    p.pitch.hopSeconds = hopMs * 1e-3;
    p.pitch.analysisRateHz = std::max(p.pitch.analysisRateHz, 4.0 * f0MaxHz);
    p.energy.hopSeconds = hopMs * 1e-3;
    // Mel bands are narrow at the low end: give the mel spectrogram at least
    // ~40 ms of FFT (1024 points at 16–22 kHz, 2048 at 44.1–48 kHz) so its
    // lowest bands still hold an FFT bin at high sample rates.
    int melFft = 16;
    while (melFft < 0.04 * sampleRate) melFft *= 2;
    p.mel.stft.fftSize = std::max(fftSize, melFft);
    p.mel.stft.windowSize = p.mel.stft.fftSize;
    p.mel.stft.hopSize = spectrogramHop(*this, sampleRate, durationSeconds);
    p.mel.bands = melBands;
    p.mel.fminHz = melFminHz;
    p.mel.fmaxHz = std::min(melFmaxHz, sampleRate / 2.0);
    p.mel.scale = melScale;
    p.mel.kind = SpectrumKind::Power;
    p.mel.log = LogScale::Decibel;
    p.mel.floor = -150.0;
    return p;
}

StftParams AnalysisSettings::linearStft(double sampleRate, double durationSeconds) const {
    validate();
    StftParams s;
    s.fftSize = fftSize;
    s.windowSize = fftSize;
    s.hopSize = spectrogramHop(*this, sampleRate, durationSeconds);
    s.kind = SpectrumKind::Power;
    s.log = LogScale::Decibel;
    s.floor = -150.0;
    return s;
}

AnalysisSettings AnalysisSettings::load(QSettings& q) {
    AnalysisSettings s;
    q.beginGroup("analysis");
    s.f0MinHz = q.value("f0MinHz", s.f0MinHz).toDouble();
    s.f0MaxHz = q.value("f0MaxHz", s.f0MaxHz).toDouble();
    s.hopMs = q.value("hopMs", s.hopMs).toDouble();
    s.fftSize = q.value("fftSize", s.fftSize).toInt();
    s.melBands = q.value("melBands", s.melBands).toInt();
    s.melFminHz = q.value("melFminHz", s.melFminHz).toDouble();
    s.melFmaxHz = q.value("melFmaxHz", s.melFmaxHz).toDouble();
    s.melScale = q.value("melScale", "slaney").toString() == "htk" ? MelScale::Htk : MelScale::Slaney;
    q.endGroup();
    try {
        s.validate();
    } catch (const ParamError&) {
        return AnalysisSettings{};  // a hand-edited settings file must not break the window
    }
    return s;
}

void AnalysisSettings::save(QSettings& q) const {
    q.beginGroup("analysis");
    q.setValue("f0MinHz", f0MinHz);
    q.setValue("f0MaxHz", f0MaxHz);
    q.setValue("hopMs", hopMs);
    q.setValue("fftSize", fftSize);
    q.setValue("melBands", melBands);
    q.setValue("melFminHz", melFminHz);
    q.setValue("melFmaxHz", melFmaxHz);
    q.setValue("melScale", melScale == MelScale::Htk ? "htk" : "slaney");
    q.endGroup();
}

}  // namespace earmark::widgets
