// Mel-cepstral distortion (R. F. Kubichek, "Mel-cepstral distance measure
// for objective speech quality assessment", Proc. IEEE Pacific Rim Conf. on
// Communications, Computers and Signal Processing, 1993):
//
//   MCD(c, ĉ) = (10 / ln 10) · sqrt(2 · Σ_{d=1..D} (c_d − ĉ_d)²)   dB
//
// per pair of aligned frames, over coefficients 1…D (c0, the frame's level,
// is left out), averaged over the pairs.
//
// The formula expects cepstra of the log amplitude spectrum written as a
// cosine series, ln|H(ω)| = c0 + 2·Σ_d c_d·cos(dω). Earmark's MFCCs
// (align/mfcc.hpp) are the orthonormal DCT-II of the natural log of mel
// power over B bands instead; mcdCepstra rescales them by 1/sqrt(8·B), which
// puts them in that convention: by Parseval's relation, sqrt(2·Σ_{d≥1} Δc_d²)
// is then the spread (standard deviation across bands) of the difference of
// the two log-amplitude mel spectra in nepers, smoothed to D coefficients
// (derivation in docs/compare.md). Figures are comparable between Earmark
// runs with the same settings; other toolkits' mel-cepstra (all-pass warped
// analysis) give figures of the same order, not the same values.
//
// Pure functions; reentrant.
#pragma once

#include "earmark/align/mfcc.hpp"
#include "earmark/compare/frame_pair.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <vector>

namespace earmark {

// MFCCs of `signal` per `params` without mean normalisation (MCD compares
// levels of each coefficient), rescaled as above. Throws as computeMfcc.
FeatureMatrix mcdCepstra(const Signal& signal, MfccParams params, Progress progress = {});

// MCD of one pair of frames, `dims` coefficients each (c0 … c_{dims−1});
// uses c1 … c_{dims−1}. 0 for dims < 2.
double mcdFrameDb(const float* a, const float* b, int dims);

// MCD of every pair, in order. Throws ParamError("mcd.b") when the
// coefficient counts differ or are below 2, ParamError("mcd.pairs") for a
// frame index outside its matrix.
std::vector<double> mcdPerPairDb(const FeatureMatrix& a, const FeatureMatrix& b, const std::vector<FramePair>& pairs);

// Mean of mcdPerPairDb. Throws as mcdPerPairDb, and ParamError("mcd.pairs")
// when there are no pairs.
double meanMcdDb(const FeatureMatrix& a, const FeatureMatrix& b, const std::vector<FramePair>& pairs);

}  // namespace earmark
