// Integrated loudness per ITU-R BS.1770-4 (K-weighting, 400 ms blocks with
// 75 % overlap, absolute gate −70 LKFS, relative gate −10 LU), as tested by
// EBU Tech 3341. Values in LUFS (= LKFS).
#pragma once

#include <cstdint>
#include <vector>

namespace earmark {

// One biquad: y = b0 x + b1 x1 + b2 x2 − a1 y1 − a2 y2 (a0 normalised to 1).
struct Biquad {
    double b0 = 1, b1 = 0, b2 = 0, a1 = 0, a2 = 0;
};

struct KWeighting {
    Biquad shelf;     // stage 1: high-frequency shelf (+4 dB)
    Biquad highPass;  // stage 2: RLB high-pass
};

// Lowest sample rate kWeighting accepts: the shelf's centre (≈ 1681.97 Hz)
// must lie below Nyquist.
inline constexpr double kMinKWeightingRateHz = 3364.0;

// Coefficients for any sample rate: the analogue prototypes (shelf and
// high-pass, each a second-order section with the centre frequency prewarped)
// mapped by the bilinear transform. At 48 kHz they reproduce the BS.1770-4
// tables to ~1e-14. Stage 2 keeps the table's numerator [1, −2, 1] at every
// rate (as libebur128 does), so its passband gain is 1 + K/Q + K² with
// K = tan(π·38.14 Hz / rate): +0.043 dB at 48 kHz, +0.129 dB at 16 kHz.
// Throws ParamError("kWeighting.sampleRate") unless
// kMinKWeightingRateHz <= sampleRate < infinity.
KWeighting kWeighting(double sampleRate);

// Streaming meter: feed interleaved blocks of any length; the result does not
// depend on how the samples are split into blocks. Memory grows by one double
// per 100 ms of audio (no sample buffers). Filtering runs in double precision.
//
// Blocks: 100 ms steps of round(0.1 · sampleRate) frames; block j is steps
// j…j+3 (400 ms, 75 % overlap). A trailing partial step is not measured.
//
// Channel weights follow BS.1770-4: 1.0 for channels 0–2 (L, R, C), 0 for
// channel 3 (LFE) and 1.41 for channels 4–5 (Ls, Rs) when there are 6
// channels (5.1 order L R C LFE Ls Rs); with 5 channels (5.0: L R C Ls Rs)
// channels 3–4 get 1.41; otherwise all 1.0.
//
// Not thread-safe; distinct meters are independent.
class LoudnessMeter {
public:
    // Throws ParamError("LoudnessMeter.sampleRate") unless
    // kMinKWeightingRateHz <= sampleRate < infinity, and
    // ParamError("LoudnessMeter.channels") if channels < 1.
    LoudnessMeter(double sampleRate, int channels);

    // `samples` holds frames × channels floats, full scale 1.0. Throws
    // ParamError("LoudnessMeter.frames") if frames < 0 (or samples is null
    // with frames > 0), and InputError("LoudnessMeter.samples") on a NaN or
    // infinite sample; after either error the meter is unchanged.
    void addInterleaved(const float* samples, std::int64_t frames);

    // Integrated loudness in LUFS; −infinity when no block passes the gates
    // (silence, or shorter than one 400 ms block). O(blocks) per call.
    double integratedLufs() const;

private:
    void filterChunk(const float* samples, std::int64_t frames);
    void closeStep();

    int channels_;
    KWeighting k_;
    std::vector<double> weights_;
    std::vector<double> state_;          // 2 values per channel per stage (transposed direct form II)
    std::int64_t stepFrames_;            // 100 ms
    std::int64_t inStep_ = 0;            // frames accumulated in the current step
    std::vector<double> stepEnergy_;     // current step: per-channel sum of squares of K-weighted samples
    std::vector<double> stepPowers_;     // completed 100 ms steps (weighted sums of mean squares)
};

// Integrated loudness of a whole interleaved buffer (frames × channels floats),
// in LUFS; same errors (with the meter's subjects) and result as LoudnessMeter.
double integratedLoudnessLufs(const float* samples, std::int64_t frames, double sampleRate, int channels = 1);

}  // namespace earmark
