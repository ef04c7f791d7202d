// Mel-frequency cepstral coefficients for alignment (Davis & Mermelstein,
// "Comparison of parametric representations for monosyllabic word
// recognition…", IEEE Trans. ASSP 28(4), 1980): the DCT-II of the log mel
// spectrogram (earmark/spectral/mel.hpp), one vector per frame.
//
// Before the DCT the log mel values are floored at the loudest value of the
// utterance minus `dynamicRangeDb`, so digital silence and a quiet noise
// floor look alike. With `meanNormalise` each coefficient has its mean over
// the utterance subtracted (cepstral mean normalisation), which removes a
// fixed channel or voice colouring.
//
// Frames follow Earmark's convention: frame i is centred at i·hopSeconds.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <cstddef>
#include <vector>

namespace earmark {

struct MfccParams {
    double sampleRateHz = 16000.0;  // input is resampled to this rate first
    double hopSeconds = 0.005;      // frame step
    double windowSeconds = 0.025;   // Hamming window length (<= fft length)
    int fftSize = 512;              // samples at sampleRateHz, >= window
    int bands = 40;                 // HTK-scale triangles, power spectrum
    double fminHz = 60.0;
    double fmaxHz = 7600.0;         // < sampleRateHz / 2
    int coefficients = 13;          // c0 … c12; 1 … bands
    double dynamicRangeDb = 60.0;   // floor below the loudest band value, > 0
    bool meanNormalise = true;
    // Throws ParamError("MfccParams.<field>", …).
    void validate() const;
};

// frames × dims, frame-major.
struct FeatureMatrix {
    int frames = 0;
    int dims = 0;
    double hopSeconds = 0.0;
    std::vector<float> values;
    const float* row(int frame) const { return values.data() + static_cast<std::size_t>(frame) * dims; }
    float* row(int frame) { return values.data() + static_cast<std::size_t>(frame) * dims; }
};

// Throws ParamError for invalid params or a signal without a sample rate,
// Cancelled when `progress` asks. An empty signal gives 0 frames.
// Reentrant.
FeatureMatrix computeMfcc(const Signal& signal, const MfccParams& params = {}, Progress progress = {});

// MFCCs of a take and of a clean reading of the same words, made
// comparable before the DCT (spectral flooring, common practice for
// noise-robust matching):
// - the reference's log mel values are shifted so that its speech level
//   (95th percentile of frame energy) equals the take's;
// - both are floored, band by band, at the take's noise floor (5th
//   percentile of that band over the take), so the reference's digital
//   silence looks like the take's background noise and speech below the
//   noise is ignored in both.
// Then the dynamic-range floor, DCT and mean normalisation as above.
struct MfccPair {
    FeatureMatrix take;
    FeatureMatrix reference;
};
MfccPair computeMatchedMfcc(const Signal& take, const Signal& reference, const MfccParams& params = {},
                            Progress progress = {});

}  // namespace earmark
