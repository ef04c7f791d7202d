// F0 accuracy on synthetic voices with exact truth, against aubio's YIN.
//
// Three speakers (low 60–120 Hz, mid 100–250 Hz, high 200–500 Hz), each with
// gliding F0, an F0 step across a gap, an F0 step inside a voiced stretch,
// silent gaps and noise-only (fricative-like) gaps; each clean, and with
// white noise at 20 dB and 10 dB SNR (the noise also fills the silent gaps). Error measures and
// the scoring rule are in pitch_scoring.hpp (Chu & Alwan, ICASSP 2009). Bars:
// GPE < 1 % (de Cheveigné & Kawahara, JASA 2002 report YIN's gross error
// near 0.5 % on labelled speech, from memory), median fine error < 1 %,
// VDE < 5 % (clean and 20 dB SNR); and, in every condition, Earmark's GPE
// must not exceed that of aubio's "yin" or "yinfast" (a general-purpose
// reference library) on the same signal.
#include "earmark/pitch/yin.hpp"
#include "aubio_reference.hpp"
#include "pitch_scoring.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cstdio>
#include <string>
#include <tuple>
#include <vector>

namespace earmark {
namespace {

using test::FrameEstimate;
using test::PitchScores;
using test::aubioFrames;
using test::describe;
using test::earmarkFrames;
using test::VoiceSegment;
using Kind = VoiceSegment::Kind;


VoiceSegment voiced(double seconds, double f0Start, double f0End, double level = 0.3) {
    return {Kind::Voiced, seconds, f0Start, f0End, level};
}
VoiceSegment silent(double seconds) { return {Kind::Silence, seconds, 0, 0, 0}; }
VoiceSegment noise(double seconds) { return {Kind::Noise, seconds, 0, 0, 0.03}; }

// Per speaker: glides, a step across a silent gap, a step and an octave jump
// inside voiced stretches, a quiet stretch (−12 dB: about 8 dB SNR in the
// noisy variant), a fast glide (one octave in 0.2 s), silent and noise gaps.
std::vector<VoiceSegment> speaker(int which) {
    switch (which) {
    case 0:  // low voice, 60–120 Hz
        return {silent(0.25), voiced(0.6, 110, 70), noise(0.15), voiced(0.5, 65, 95), silent(0.2),
                voiced(0.4, 120, 115), voiced(0.4, 80, 60), noise(0.2), voiced(0.5, 60, 100), silent(0.15),
                voiced(0.4, 120, 118), voiced(0.4, 60, 62), silent(0.1), voiced(0.4, 90, 85, 0.075),
                noise(0.1), voiced(0.2, 60, 120), silent(0.25)};
    case 1:  // mid voice, 100–250 Hz
        return {silent(0.25), voiced(0.6, 120, 220), noise(0.15), voiced(0.5, 240, 150), silent(0.2),
                voiced(0.4, 100, 110), voiced(0.4, 180, 170), noise(0.2), voiced(0.3, 130, 250), silent(0.15),
                voiced(0.4, 240, 236), voiced(0.4, 120, 125), silent(0.1), voiced(0.4, 150, 140, 0.075),
                noise(0.1), voiced(0.2, 110, 220), silent(0.25)};
    default:  // high voice, 200–500 Hz
        return {silent(0.25), voiced(0.6, 220, 400), noise(0.15), voiced(0.5, 480, 300), silent(0.2),
                voiced(0.4, 200, 210), voiced(0.4, 350, 340), noise(0.2), voiced(0.3, 250, 500), silent(0.15),
                voiced(0.4, 250, 245), voiced(0.4, 490, 500), silent(0.1), voiced(0.4, 300, 280, 0.075),
                noise(0.1), voiced(0.2, 230, 460), silent(0.25)};
    }
}
const char* speakerName(int which) { return which == 0 ? "low" : which == 1 ? "mid" : "high"; }

// Noise conditions: clean; 20 dB SNR (the bars apply); 10 dB SNR (harder: the
// quiet stretch sits near −2 dB SNR; only the comparison with aubio applies).
enum class Noise { Clean, Snr20, Snr10 };
const char* noiseName(Noise n) { return n == Noise::Clean ? "Clean" : n == Noise::Snr20 ? "Snr20" : "Snr10"; }

class VoiceAccuracy : public ::testing::TestWithParam<std::tuple<int, Noise>> {};

TEST_P(VoiceAccuracy, MeetsBarsAndMatchesOrBeatsAubio) {
    const auto [which, noise] = GetParam();
    const auto segments = speaker(which);
    test::SyntheticVoice voice = test::synthesiseVoice(segments, test::kSyntheticVoiceRate, 100 + static_cast<std::uint32_t>(which));
    if (noise != Noise::Clean)
        test::addNoiseAtSnr(voice.signal, noise == Noise::Snr20 ? 20.0 : 10.0, 200 + static_cast<std::uint32_t>(which));
    const auto boundaries = test::segmentBoundaries(segments, test::kSyntheticVoiceRate);

    const auto ours = earmarkFrames(voice.signal);
    const auto yin = aubioFrames(voice.signal, "yin");
    const auto yinfast = aubioFrames(voice.signal, "yinfast");
    const PitchScores e = test::scoreTrack(voice, boundaries, ours, test::kScoringHalfWindowSeconds);
    const PitchScores a = test::scoreTrack(voice, boundaries, yin, test::kScoringHalfWindowSeconds);
    const PitchScores f = test::scoreTrack(voice, boundaries, yinfast, test::kScoringHalfWindowSeconds);

    const std::string label = std::string(speakerName(which)) + " voice, " + noiseName(noise);
    RecordProperty("earmark", describe(e));
    RecordProperty("aubio_yin", describe(a));
    RecordProperty("aubio_yinfast", describe(f));
    std::printf("[ figures  ] %s\n  earmark:       %s\n  aubio yin:     %s\n  aubio yinfast: %s\n", label.c_str(),
                describe(e).c_str(), describe(a).c_str(), describe(f).c_str());
    SCOPED_TRACE(label + ": earmark " + describe(e) + "; aubio yin " + describe(a) + "; yinfast " + describe(f));

    ASSERT_GT(e.bothVoiced, 500);  // the scores below rest on enough frames
    EXPECT_LE(e.gpe, a.gpe);
    EXPECT_LE(e.gpe, f.gpe);
    if (noise == Noise::Snr10) return;
    EXPECT_LT(e.gpe, 0.01);
    EXPECT_LT(e.fineError, 0.01);
    EXPECT_LT(e.vde, 0.05);
}

INSTANTIATE_TEST_SUITE_P(Speakers, VoiceAccuracy,
                         ::testing::Combine(::testing::Values(0, 1, 2),
                                            ::testing::Values(Noise::Clean, Noise::Snr20, Noise::Snr10)),
                         [](const auto& info) {
                             return std::string(speakerName(std::get<0>(info.param))) + noiseName(std::get<1>(info.param));
                         });

}  // namespace
}  // namespace earmark
