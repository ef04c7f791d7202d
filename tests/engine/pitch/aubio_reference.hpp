// aubio's YIN (a general-purpose reference library) run frame by frame on a
// signal, with its frames placed on Earmark's time axis, for comparisons.
#pragma once

#include "earmark/pitch/yin.hpp"
#include "pitch_scoring.hpp"

#include <aubio/aubio.h>

#include <cstdio>
#include <string>
#include <vector>

namespace earmark::test {

// aubio's buffer: 768 samples (34.8 ms) ≈ the 33.6 ms Earmark's frame spans at
// the defaults, an FFT-friendly size; its hop: 110 samples ≈ 5 ms.
inline constexpr int kAubioBuffer = 768;
inline constexpr int kAubioHop = 110;

// aubio frame k (after feeding hop block k) holds samples ending at the
// (k+1)·hop-th sample; its centre is (k+1)·hop − buffer/2. A frame counts as
// voiced when aubio reports a pitch (its −50 dB silence gate passed) with
// confidence 1 − d′ >= 1 − voicingMaxAperiodicity: the same aperiodicity bar
// Earmark uses in clean takes, since aubio itself always returns some period.
inline std::vector<FrameEstimate> aubioFrames(const Signal& s, const char* method) {
    const double minConfidence = 1.0 - PitchParams{}.voicingMaxAperiodicity;
    aubio_pitch_t* p = new_aubio_pitch(method, kAubioBuffer, kAubioHop, static_cast<uint_t>(s.sampleRate));
    aubio_pitch_set_unit(p, "Hz");
    aubio_pitch_set_tolerance(p, static_cast<smpl_t>(PitchParams{}.threshold));
    fvec_t* in = new_fvec(kAubioHop);
    fvec_t* out = new_fvec(1);
    std::vector<FrameEstimate> frames;
    const std::size_t blocks = s.size() / kAubioHop;
    for (std::size_t k = 0; k < blocks; ++k) {
        for (int j = 0; j < kAubioHop; ++j) in->data[j] = s.samples[k * kAubioHop + static_cast<std::size_t>(j)];
        aubio_pitch_do(p, in, out);
        const double centre = (static_cast<double>((k + 1) * kAubioHop) - kAubioBuffer / 2.0) / s.sampleRate;
        const double f = out->data[0];
        const bool isVoiced = f > 0.0 && aubio_pitch_get_confidence(p) >= minConfidence;
        if (centre >= 0.0) frames.push_back({centre, isVoiced ? f : 0.0});
    }
    del_fvec(out);
    del_fvec(in);
    del_aubio_pitch(p);
    return frames;
}

// Earmark's track as frame estimates.
inline std::vector<FrameEstimate> earmarkFrames(const Signal& s, const PitchParams& params = {}) {
    const PitchTrack t = analysePitch(s, params);
    std::vector<FrameEstimate> out(t.size());
    for (std::size_t i = 0; i < t.size(); ++i) out[i] = {t.timeSeconds(i), t.f0Hz[i]};
    return out;
}

inline std::string describe(const PitchScores& s) {
    char buf[160];
    std::snprintf(buf, sizeof buf, "GPE %.2f %%, fine %.3f %%, VDE %.2f %% (%d frames scored, %d voiced in both)",
                  100 * s.gpe, 100 * s.fineError, 100 * s.vde, s.scoredFrames, s.bothVoiced);
    return buf;
}

}  // namespace earmark::test
