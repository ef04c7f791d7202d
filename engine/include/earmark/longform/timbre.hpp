// A timbre descriptor for a stretch of speech: the mean and covariance of
// its MFCC vectors (c1…, without c0, so the level does not count), compared
// by the symmetric Kullback–Leibler divergence between the two Gaussians
// (S. Kullback and R. A. Leibler, "On information and sufficiency", Annals of
// Mathematical Statistics 22(1), 1951, 79–86):
//   D = ½·[tr(Σb⁻¹Σa) + tr(Σa⁻¹Σb) − 2d + (μa − μb)ᵀ(Σa⁻¹ + Σb⁻¹)(μa − μb)]
// in nats; 0 for identical models, growing without bound as they part.
// Covariances get `ridge` × (mean variance) added to the diagonal, so a
// short stretch with few frames still gives a usable inverse.
//
// Thread-safety: values and pure functions.
#pragma once

#include <vector>

namespace earmark {

// Running sums of feature vectors; add frames, then fit.
class TimbreAccumulator {
public:
    explicit TimbreAccumulator(int dims);
    void add(const float* vector);
    void add(const TimbreAccumulator& other);  // same dims
    int dims() const { return dims_; }
    long frames() const { return frames_; }

    friend struct TimbreModel;

private:
    int dims_;
    long frames_ = 0;
    std::vector<double> sum_;    // dims
    std::vector<double> outer_;  // dims × dims
};

struct TimbreModel {
    int dims = 0;
    long frames = 0;
    std::vector<double> mean;     // dims
    std::vector<double> cov;      // dims × dims, ridge included
    std::vector<double> inverse;  // dims × dims
    bool valid() const { return frames > dims && !inverse.empty(); }

    // Needs more frames than dims, else an invalid (empty) model.
    static TimbreModel fit(const TimbreAccumulator& acc, double ridge = 0.01);
};

// Symmetric KL divergence, nats; NaN if either model is invalid or dims differ.
double symmetricKl(const TimbreModel& a, const TimbreModel& b);

}  // namespace earmark
