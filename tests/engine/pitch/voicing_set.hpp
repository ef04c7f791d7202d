// A seeded generator of synthetic utterances for voicing tests, invented
// here: syllable-like voiced nuclei (band-limited pulse train through
// formants, test_signals.hpp) with fricative-like noise onsets, short pauses
// and silences, in one of three registers. Four in ten nuclei are quiet
// (9–15 dB below the others), the rest at a normal level (±3 dB), so that
// with white noise at 10 dB SNR the quiet nuclei sit near 0 dB local SNR:
// their harmonics stand clearly above the noise in a spectrogram, but the
// noise fills much of their waveform. Truth is exact per sample.
#pragma once

#include "support/test_signals.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <random>
#include <vector>

namespace earmark::test {

struct Register {
    double lowHz = 100.0;
    double highHz = 250.0;
};

inline Register registerOf(int which) {
    switch (which % 3) {
    case 0: return {65.0, 130.0};
    case 1: return {100.0, 250.0};
    default: return {190.0, 480.0};
    }
}

// One utterance of about `seconds` (a little more: whole syllables) in register `which`.
inline std::vector<VoiceSegment> randomUtterance(std::uint32_t seed, int which, double seconds = 4.0) {
    std::mt19937 gen(seed);
    std::uniform_real_distribution<double> uni(0.0, 1.0);
    const Register reg = registerOf(which);
    const double span = std::log2(reg.highHz / reg.lowHz);
    const auto pitchAt = [&](double u) { return reg.lowHz * std::exp2(span * u); };
    using Kind = VoiceSegment::Kind;
    std::vector<VoiceSegment> segs{{Kind::Silence, 0.2 + 0.1 * uni(gen), 0, 0, 0}};
    double total = segs.front().seconds;
    double u = uni(gen);  // position of F0 in the register, 0 … 1
    while (total < seconds) {
        const double r = uni(gen);
        if (r < 0.35) segs.push_back({Kind::Noise, 0.04 + 0.08 * uni(gen), 0, 0, 0.01 + 0.03 * uni(gen)});
        else if (r < 0.55) segs.push_back({Kind::Silence, 0.05 + 0.2 * uni(gen), 0, 0, 0});
        const bool quiet = uni(gen) < 0.4;
        const double levelDb = quiet ? -15.0 + 6.0 * uni(gen) : -3.0 + 6.0 * uni(gen);
        const double next = std::clamp(u + 0.5 * (uni(gen) - 0.5), 0.0, 1.0);
        segs.push_back({Kind::Voiced, 0.12 + 0.23 * uni(gen), pitchAt(u), pitchAt(next),
                        0.3 * std::pow(10.0, levelDb / 20.0)});
        u = next;
        total = 0.0;
        for (const auto& s : segs) total += s.seconds;
    }
    segs.push_back({Kind::Silence, 0.2 + 0.1 * uni(gen), 0, 0, 0});
    return segs;
}

}  // namespace earmark::test
