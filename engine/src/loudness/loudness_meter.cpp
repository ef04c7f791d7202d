#include "earmark/core/error.hpp"
#include "earmark/loudness/bs1770.hpp"

#include <algorithm>
#include <bit>
#include <cmath>
#include <string>

namespace earmark {

namespace {

// BS.1770-4 eq. (2): L = −0.691 + 10·log10(Σ G·z).
constexpr double kLoudnessOffsetDb = -0.691;
constexpr double kAbsoluteGateLkfs = -70.0;
constexpr double kRelativeGateLu = -10.0;
constexpr double kSurroundWeight = 1.41;
constexpr int kStepsPerBlock = 4;  // 400 ms blocks on a 100 ms grid: 75 % overlap

// Filter states below this are flushed to zero after each chunk: a decaying
// filter would otherwise reach subnormal numbers after a few seconds of
// digital silence and slow down by orders of magnitude. 1e-30 is −600 dBFS.
constexpr double kFlushBelow = 1e-30;

double powerOfLoudness(double lufs) { return std::pow(10.0, (lufs - kLoudnessOffsetDb) / 10.0); }

std::vector<double> channelWeights(int channels) {
    std::vector<double> w(static_cast<std::size_t>(channels), 1.0);
    if (channels == 6) {  // 5.1: L R C LFE Ls Rs
        w[3] = 0.0;
        w[4] = w[5] = kSurroundWeight;
    } else if (channels == 5) {  // 5.0: L R C Ls Rs
        w[3] = w[4] = kSurroundWeight;
    }
    return w;
}

bool allFinite(const float* x, std::int64_t n) {
    // Exponent bits all ones ⇔ NaN or infinity; branch-free so it vectorises.
    bool bad = false;
    for (std::int64_t i = 0; i < n; ++i)
        bad |= (std::bit_cast<std::uint32_t>(x[i]) & 0x7f800000u) == 0x7f800000u;
    return !bad;
}

}  // namespace

LoudnessMeter::LoudnessMeter(double sampleRate, int channels) : channels_(channels) {
    if (!(sampleRate >= kMinKWeightingRateHz) || !std::isfinite(sampleRate))
        throw ParamError("LoudnessMeter.sampleRate",
                         "must be at least " + std::to_string(kMinKWeightingRateHz) + " Hz and finite");
    if (channels < 1) throw ParamError("LoudnessMeter.channels", "must be at least 1, got " + std::to_string(channels));
    k_ = kWeighting(sampleRate);
    weights_ = channelWeights(channels);
    state_.assign(static_cast<std::size_t>(channels) * 4, 0.0);
    stepFrames_ = std::llround(0.1 * sampleRate);
    stepEnergy_.assign(static_cast<std::size_t>(channels), 0.0);
}

void LoudnessMeter::addInterleaved(const float* samples, std::int64_t frames) {
    if (frames < 0) throw ParamError("LoudnessMeter.frames", "must not be negative, got " + std::to_string(frames));
    if (frames == 0) return;
    if (samples == nullptr) throw ParamError("LoudnessMeter.frames", "samples is null but frames > 0");
    // Checked before any state changes so a bad block leaves the meter as it was.
    if (!allFinite(samples, frames * channels_))
        throw InputError("LoudnessMeter.samples", "contains NaN or infinity");
    while (frames > 0) {
        const std::int64_t n = std::min(frames, stepFrames_ - inStep_);
        filterChunk(samples, n);
        samples += n * channels_;
        frames -= n;
        inStep_ += n;
        if (inStep_ == stepFrames_) closeStep();
    }
}

// K-weights `frames` frames (all within the current step) and adds their squares
// to stepEnergy_. One channel at a time so the filter state stays in registers.
void LoudnessMeter::filterChunk(const float* samples, std::int64_t frames) {
    const Biquad s = k_.shelf;
    const Biquad h = k_.highPass;
    for (int c = 0; c < channels_; ++c) {
        double* st = &state_[static_cast<std::size_t>(c) * 4];
        double s1 = st[0], s2 = st[1], h1 = st[2], h2 = st[3];
        double energy = 0.0;
        const float* x = samples + c;
        for (std::int64_t i = 0; i < frames; ++i) {
            const double in = x[i * channels_];
            const double y = s.b0 * in + s1;
            s1 = s.b1 * in - s.a1 * y + s2;
            s2 = s.b2 * in - s.a2 * y;
            const double z = h.b0 * y + h1;
            h1 = h.b1 * y - h.a1 * z + h2;
            h2 = h.b2 * y - h.a2 * z;
            energy += z * z;
        }
        for (double* v : {&s1, &s2, &h1, &h2})
            if (std::fabs(*v) < kFlushBelow) *v = 0.0;
        st[0] = s1, st[1] = s2, st[2] = h1, st[3] = h2;
        stepEnergy_[static_cast<std::size_t>(c)] += energy;
    }
}

void LoudnessMeter::closeStep() {
    double weighted = 0.0;
    for (int c = 0; c < channels_; ++c) {
        weighted += weights_[static_cast<std::size_t>(c)] * stepEnergy_[static_cast<std::size_t>(c)];
        stepEnergy_[static_cast<std::size_t>(c)] = 0.0;
    }
    stepPowers_.push_back(weighted / static_cast<double>(stepFrames_));
    inStep_ = 0;
}

double LoudnessMeter::integratedLufs() const {
    const auto steps = static_cast<std::ptrdiff_t>(stepPowers_.size());
    const std::ptrdiff_t blocks = steps - (kStepsPerBlock - 1);
    if (blocks <= 0) return -INFINITY;
    // All steps have the same length, so a block's mean square is the mean of
    // its four steps' mean squares.
    const auto blockPower = [&](std::ptrdiff_t j) {
        double sum = 0.0;
        for (int k = 0; k < kStepsPerBlock; ++k) sum += stepPowers_[static_cast<std::size_t>(j + k)];
        return sum / kStepsPerBlock;
    };
    // Mean power of the blocks louder than `gate` (BS.1770-4 eq. 5/6: l_j > Γ).
    const auto gatedMean = [&](double gate, double& mean) {
        double sum = 0.0;
        std::ptrdiff_t count = 0;
        for (std::ptrdiff_t j = 0; j < blocks; ++j) {
            const double z = blockPower(j);
            if (z > gate) {
                sum += z;
                ++count;
            }
        }
        mean = count > 0 ? sum / static_cast<double>(count) : 0.0;
        return count > 0;
    };
    const double absoluteGate = powerOfLoudness(kAbsoluteGateLkfs);
    double absoluteMean = 0.0;
    if (!gatedMean(absoluteGate, absoluteMean)) return -INFINITY;
    // Relative gate: 10 LU below the absolute-gated loudness; a block must pass
    // both gates, i.e. the higher of the two. The loudest block always does.
    const double relativeGate = absoluteMean * std::pow(10.0, kRelativeGateLu / 10.0);
    double mean = 0.0;
    if (!gatedMean(std::max(absoluteGate, relativeGate), mean)) return -INFINITY;
    return kLoudnessOffsetDb + 10.0 * std::log10(mean);
}

double integratedLoudnessLufs(const float* samples, std::int64_t frames, double sampleRate, int channels) {
    LoudnessMeter meter(sampleRate, channels);
    meter.addInterleaved(samples, frames);
    return meter.integratedLufs();
}

}  // namespace earmark
