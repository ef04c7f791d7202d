// The feature frames an acoustic model (acoustic_model.hpp) was trained on:
// mel-frequency cepstra as the CMU Sphinx front end computes them, with
// cepstral mean normalisation over the take and deltas.
//
// Steps (per the model's ModelFrontEnd): samples scaled to 16-bit range;
// pre-emphasis y[n] = x[n] − α·x[n−1]; frames of `windowSeconds` every
// 1/framesPerSecond s starting at sample 0 (frame i covers
// [i·hop, i·hop + window)), Hamming window; power spectrum of `fftSize`
// points; triangular mel filters (mel = 2595·log10(1 + f/700)) between
// lowerHz and upperHz, edges rounded to FFT bins, unit area; natural log;
// orthonormal DCT-II; sinusoidal lifter 1 + L/2·sin(πi/L). Then the mean
// cepstrum is subtracted — the mean over the take's speech span (by its
// energy, prosody/speech_activity.hpp) widened by 0.25 s each side, so that
// long padding silence does not pull the mean away from the voice (2 s of
// leading silence in a 5.7 s take put a demo sentence's words out of
// place); the whole take when it has no speech — and each frame becomes
// [c(t), c(t+2) − c(t−2), (c(t+3) − c(t−1)) − (c(t+1) − c(t−3))] with the
// first and last frames repeated past the ends.
// Checked against the recogniser's own front-end library (libsphinxbase)
// in tests/engine/acoustic.
#pragma once

#include "earmark/acoustic/acoustic_model.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <cstddef>
#include <vector>

namespace earmark {

struct ModelFeatures {
    std::size_t frames = 0;
    std::size_t size = 0;            // values per frame (39 for three streams of 13)
    std::vector<float> values;       // frames × size, row-major
    double hopSeconds = 0.01;
    double windowSeconds = 0.025625;
    // Seconds of the centre of frame i.
    double frameCentre(std::size_t i) const { return static_cast<double>(i) * hopSeconds + windowSeconds / 2; }
    const float* frame(std::size_t i) const { return values.data() + i * size; }
};

// Cepstra before normalisation and deltas (frames × cepstra), for checks.
std::vector<float> modelCepstra(const Signal& take, const ModelFrontEnd& frontEnd, std::size_t* frames = nullptr);

// Features of `take`, resampled to the model's rate with libsoxr when its
// rate differs. Throws InputError("audio", …) for an empty take or one
// shorter than one window; Cancelled if asked.
ModelFeatures computeModelFeatures(const Signal& take, const ModelFrontEnd& frontEnd, Progress progress = {});

}  // namespace earmark
