// Short-time Fourier transform spectrograms (linear frequency).
//
// Each frame takes `windowSize` samples, multiplies them by the analysis
// window, places them in the middle of an `fftSize` buffer (zero-padded
// evenly, the left pad being (fftSize − windowSize)/2 rounded down) and takes
// the unscaled real FFT: X[k] = Σ_n x[n]·w[n]·e^{−2πi·kn/fftSize}, k = 0…fftSize/2.
// Bin k is centred at k·sampleRate/fftSize Hz.
//
// Frames follow Earmark's convention (frame i centred at t = i·hop) unless
// `alignment` says otherwise, in which case `timesSeconds` holds each frame's
// centre. Values are stored frame-major: values[frame * bins + bin].
//
// Frame counts for a signal of n samples (n = 0 gives no frames):
// - Centred: n/hop + 1 (integer division), as in dsp/frames.hpp.
// - VocoderPadded: with p = (fftSize − hop)/2, 1 + (n + 2p − fftSize)/hop when
//   n + 2p >= fftSize, otherwise 0 (the signal is shorter than one frame).
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/dsp/frames.hpp"
#include "earmark/dsp/window.hpp"

#include <cstddef>
#include <vector>

namespace earmark {

enum class SpectrumKind {
    Magnitude,  // |X|
    Power,      // |X|²
};

enum class LogScale {
    None,     // linear values
    Decibel,  // 10·log10(power) or 20·log10(magnitude), floored at `floor` (in dB)
    Natural,  // ln(max(value, floor)), `floor` linear and > 0
};
// Logs are within ~2e-7 relative of exact (a vectorised series, not libm);
// values at or below the floor, and NaN, give exactly the floor's output.


enum class FrameAlignment {
    Centred,  // pad fftSize/2 each side: frame i centred at i·hop (Earmark default)
    VocoderPadded,  // pad (fftSize − hop)/2 each side, no centring: the layout of
                    // common neural-vocoder training features; frame i starts at
                    // sample i·hop − (fftSize − hop)/2 and is centred fftSize/2
                    // later (i·hop + hop/2 for even sizes; see timesSeconds)
};

struct StftParams {
    int fftSize = 1024;     // FFT length in samples, >= 2 and >= windowSize
    int windowSize = 1024;  // window length in samples, zero-padded to fftSize, centred in it
    int hopSize = 256;      // samples between frames, >= 1 (<= fftSize for VocoderPadded)
    WindowShape window = WindowShape::Hann;  // periodic form (WindowSymmetry::Periodic)
    FramePadding padding = FramePadding::Reflect;  // how samples outside the signal are made
    FrameAlignment alignment = FrameAlignment::Centred;
    SpectrumKind kind = SpectrumKind::Power;
    LogScale log = LogScale::Decibel;
    double floor = -120.0;  // dB floor for Decibel; linear floor for Natural (e.g. 1e-5)

    // Throws ParamError("StftParams.<field>", why) for sizes out of range, a
    // non-finite floor or a non-positive floor with LogScale::Natural.
    void validate() const;
};

struct Spectrogram {
    int frames = 0;
    int bins = 0;                 // fftSize/2 + 1 for STFT, band count for mel
    double sampleRate = 0.0;      // Hz, of the analysed signal
    double hopSeconds = 0.0;      // hopSize / sampleRate
    std::vector<double> timesSeconds;   // empty for Centred frames (t = i·hop)
    std::vector<double> binCentresHz;   // centre frequency of each bin / band
    SpectrumKind kind = SpectrumKind::Power;
    LogScale log = LogScale::Decibel;
    std::vector<float> values;          // frames × bins, frame-major

    float at(int frame, int bin) const { return values[static_cast<std::size_t>(frame) * bins + bin]; }
    double frameTime(int frame) const {
        return timesSeconds.empty() ? frame * hopSeconds : timesSeconds[static_cast<std::size_t>(frame)];
    }
};

// Computes the STFT spectrogram of `signal`.
// Throws ParamError for invalid params or a non-positive signal.sampleRate,
// Cancelled if `progress` asks to stop. An empty signal gives frames == 0
// (bins and binCentresHz still filled). Reentrant: one FFT instance per call.
Spectrogram computeSpectrogram(const Signal& signal, const StftParams& params = {}, Progress progress = {});

}  // namespace earmark
