// The analysis settings a user can change in the window, their translation to
// engine parameters, and their persistence (QSettings group "analysis").
#pragma once

#include "earmark/analysis/take_analysis.hpp"
#include "earmark/spectral/spectrogram.hpp"

class QSettings;

namespace earmark::widgets {

struct AnalysisSettings {
    double f0MinHz = 60.0;
    double f0MaxHz = 500.0;
    double hopMs = 5.0;           // frame step of F0, energy and both spectrograms
    int fftSize = 512;            // STFT length and window (periodic Hann) of both spectrograms
    int melBands = 80;
    double melFminHz = 0.0;
    double melFmaxHz = 8000.0;    // cut to the Nyquist frequency of each take
    MelScale melScale = MelScale::Slaney;

    // Spectrograms of long takes would not fit in memory at a 5 ms hop; the hop
    // is raised so that no spectrogram has more columns than this.
    static constexpr int maxSpectrogramFrames = 40000;

    bool operator==(const AnalysisSettings&) const = default;

    // Engine parameters for a take of this rate and length. The mel and linear
    // spectrograms are power spectra in dB (the view's colour scale is in dB).
    AnalysisParams toParams(double sampleRate, double durationSeconds) const;
    StftParams linearStft(double sampleRate, double durationSeconds) const;

    // Throws ParamError naming the field (the engine validates the rest).
    void validate() const;

    static AnalysisSettings load(QSettings& settings);
    void save(QSettings& settings) const;
};

}  // namespace earmark::widgets
