// Synthetic test signals with known truth, invented here for tests only.
#pragma once

#include "earmark/core/signal.hpp"

#include <cstdint>
#include <vector>

namespace earmark::test {

Signal sine(double freqHz, double seconds, double sampleRate, double amplitude = 1.0);
Signal silence(double seconds, double sampleRate);
Signal whiteNoise(double seconds, double sampleRate, double rms, std::uint32_t seed = 1);

// Adds white noise so that signal power / noise power = snrDb over the
// non-silent part of `signal` (power measured over samples with |x| > 0).
void addNoiseAtSnr(Signal& signal, double snrDb, std::uint32_t seed = 7);

// Concatenates signals of the same rate.
Signal concat(const std::vector<Signal>& parts);

// A voice-like source: a band-limited pulse train (all harmonics below
// 0.9·Nyquist, closed-form Dirichlet sum, so F0 is exact at every sample)
// with a −12 dB/octave glottal tilt, through three formant resonators.
// Segments are voiced (F0 glides geometrically from f0StartHz to f0EndHz),
// silent, or noise (unvoiced, fricative-like).
struct VoiceSegment {
    enum class Kind { Voiced, Silence, Noise };
    Kind kind = Kind::Voiced;
    double seconds = 0.5;
    double f0StartHz = 120.0;
    double f0EndHz = 120.0;
    double level = 0.3;  // peak-ish amplitude (voiced) or RMS (noise)
};

struct SyntheticVoice {
    Signal signal;
    // Truth per sample: F0 in Hz, 0 where not voiced.
    std::vector<float> f0PerSample;
    // Truth F0 at time t (seconds); 0 if unvoiced. Frames centred at t use this.
    double f0At(double t) const;
    // True if every sample within ±halfWindowSeconds of t is voiced (for
    // scoring only frames whose whole window sits inside one voiced segment).
    bool fullyVoicedAround(double t, double halfWindowSeconds) const;
};

SyntheticVoice synthesiseVoice(const std::vector<VoiceSegment>& segments, double sampleRate,
                               std::uint32_t seed = 3);

// A speech-like signal of any length for benchmarks and loudness checks:
// alternating voiced syllables (F0 drifting 90–220 Hz, 4 syllables/s
// amplitude envelope), short noise bursts and pauses; every join between
// segments (and the end) fades through zero over 5 ms, so there is no step.
Signal speechLike(double seconds, double sampleRate, std::uint32_t seed = 11);

}  // namespace earmark::test
