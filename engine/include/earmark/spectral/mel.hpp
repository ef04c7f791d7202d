// Mel scales, mel filterbanks and mel spectrograms.
//
// HTK scale: m = 2595·log10(1 + f/700) (Young et al., The HTK Book).
// Slaney scale (Auditory Toolbox, M. Slaney 1998): linear 3f/200 below 1 kHz,
// logarithmic above: m = 15 + 27·ln(f/1000)/ln(6.4).
// Area normalisation (Slaney): each triangle scaled by 2/(f_{i+2} − f_i), so
// every band has unit area in Hz.
//
// A mel spectrogram is the STFT of MelParams::stft (magnitude or power, per
// MelParams::kind) multiplied by the filterbank, then optionally logged. Only
// the non-zero span of each triangle is visited, so beyond the FFTs a frame
// costs about two multiply-adds per bin below fmax.
#pragma once

#include "earmark/spectral/spectrogram.hpp"

#include <vector>

namespace earmark {

enum class MelScale { Htk, Slaney };
enum class MelNormalisation {
    None,  // triangles peak at 1
    Area,  // triangles scaled by 2/(f_{i+2} − f_i) (Slaney)
};

// Frequency in Hz ↔ mel on the given scale. Defined for hz >= 0 / mel >= 0;
// the Slaney formulas extend smoothly below 0 in their linear part.
double hzToMel(double hz, MelScale scale);
double melToHz(double mel, MelScale scale);

// Defaults: the common neural-TTS feature settings at 22.05 kHz (n_fft 1024,
// window 1024, hop 256, 80 bands over 0–8000 Hz, magnitude, Slaney scale with
// area normalisation, ln(max(x, 1e-5))). Frames stay Centred (Earmark's time
// convention); set stft.alignment = FrameAlignment::VocoderPadded for the
// uncentred (n_fft − hop)/2 reflect padding those training setups use.
struct MelParams {
    StftParams stft = defaultStft();  // kind/log/floor of the STFT are ignored: the mel
                                      // filterbank is applied to the linear spectrum
    int bands = 80;                   // >= 1
    double fminHz = 0.0;              // >= 0, < fmaxHz
    double fmaxHz = 8000.0;           // <= sampleRate/2
    MelScale scale = MelScale::Slaney;
    MelNormalisation normalisation = MelNormalisation::Area;
    SpectrumKind kind = SpectrumKind::Magnitude;  // filterbank applied to |X| or |X|²
    LogScale log = LogScale::Natural;
    double floor = 1e-5;              // ln(max(x, 1e-5)) by default; dB floor for Decibel

    static StftParams defaultStft() {
        StftParams s;
        s.fftSize = 1024;
        s.windowSize = 1024;
        s.hopSize = 256;
        return s;
    }
    // Throws ParamError naming the field ("MelParams.bands", "MelParams.fmaxHz",
    // "MelParams.stft.hopSize"…). Bands that would cover no FFT bin are caught
    // by makeMelFilterbank, which needs the bin grid.
    void validate(double sampleRate) const;
};

// Triangular filters, bands × (fftSize/2 + 1), row-major.
// Edges: bands + 2 points equally spaced on the mel scale between fmin and fmax;
// band b rises from edgesHz[b] to 1 (or its area-normalised peak) at
// edgesHz[b+1] and falls to 0 at edgesHz[b+2], evaluated at the FFT bin
// frequencies k·sampleRate/fftSize.
struct MelFilterbank {
    int bands = 0;
    int bins = 0;
    std::vector<double> edgesHz;    // bands + 2 edge frequencies
    std::vector<float> weights;     // bands × bins
    // Sparse form used by the fast path: first non-zero bin and count per band.
    std::vector<int> firstBin, binCount;
};

// Throws ParamError as MelParams::validate, and ParamError("MelParams.bands")
// when a band covers no FFT bin (too many bands for the FFT size, or a range
// fmin–fmax too narrow).
MelFilterbank makeMelFilterbank(const MelParams& params, double sampleRate);

// Mel spectrogram: bins = bands, binCentresHz = each band's peak (edgesHz[b+1]),
// kind/log as in params, frame times as for computeSpectrogram(params.stft).
// Throws ParamError for invalid params or signal.sampleRate <= 0, Cancelled
// if `progress` asks to stop. Reentrant.
Spectrogram computeMelSpectrogram(const Signal& signal, const MelParams& params = {}, Progress progress = {});

}  // namespace earmark
