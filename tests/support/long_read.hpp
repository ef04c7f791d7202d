// Long reads for the long-form tests: invented sentences rendered one by one
// by libespeak-ng (as a chunked renderer would), trimmed, joined with pauses,
// on a white-noise floor — with faults planted where the tests say. Renders
// are cached in memory and in <temp>/earmark-long-read-cache (float WAV, keyed
// by sentence, voice, rate and range), so each sentence is rendered once.
#pragma once

#include "earmark/align/speech_render.hpp"
#include "earmark/core/signal.hpp"

#include <functional>
#include <string>
#include <vector>

namespace earmark::test {

// Sentence i of the invented script (a harbour's log; deterministic).
std::string longReadSentence(int i);

inline SpeechParams livelySpeech() {
    SpeechParams p;
    p.pitchRange = 90;
    return p;
}

struct LongReadPlan {
    int sentences = 72;                 // ≈ 5.5 minutes at the default rate
    double noiseFloorDbfs = -70.0;      // RMS of the white-noise floor
    // Renderer settings per sentence (voice, rate, pitch range). The default
    // widens espeak-ng's intonation (range 90 of 99): its normal reading spans
    // only ≈ 4 semitones, which the monotone rule would flag.
    std::function<SpeechParams(int sentence)> speech = [](int) { return livelySpeech(); };
    // Gain in dB at time t (applied to speech and floor), and the floor's own
    // extra level in dB at time t.
    std::function<double(double t)> gainDb = [](double) { return 0.0; };
    std::function<double(double t)> floorStepDb = [](double) { return 0.0; };
    std::vector<double> clicksS{};      // an impulse (3 samples, peak 0.3) at each time
};

struct LongRead {
    Signal audio;
    std::vector<double> joins;          // middle of each pause between sentences, s
    std::vector<double> sentenceStartS, sentenceEndS;  // speech of each sentence, s
    std::string text;                   // the sentences, one paragraph each 6 sentences
};

LongRead makeLongRead(const LongReadPlan& plan = {});

// A plain read of 12 sentences (two paragraphs), built once per test program.
const LongRead& twelveSentenceRead();

}  // namespace earmark::test
