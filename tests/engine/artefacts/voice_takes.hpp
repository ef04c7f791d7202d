// Clean takes of several synthetic voices for the artefact detectors'
// tests, rendered at test time: three espeak-ng voices (libespeak-ng, in
// process) and three Debian festival voices (text2wave; packages festival,
// festvox-us-slt-hts, festvox-kallpc16k, festvox-kdlpc16k in
// scripts/packages.txt). Each voice reads the invented tramway lines in one
// take; every take is peak-normalised to −3 dBFS. Header-only.
#pragma once

#include "../scan/espeak_takes.hpp"
#include "support/temp_dir.hpp"

#include "earmark/align/speech_render.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/level/energy.hpp"
#include "earmark/pitch/yin.hpp"
#include "earmark/prosody/speech_activity.hpp"

#include <algorithm>
#include <cmath>
#include <fstream>
#include <string>
#include <vector>

namespace earmark::test {

struct VoiceTake {
    std::string voice;
    Signal signal;
    double speechLevelDb = 0.0;  // SpeechActivity's speech level
    EnergyTrack energy;
    PitchTrack pitch;
};

inline void normalisePeak(Signal& s, double peakDbfs) {
    float peak = 0.0f;
    for (float v : s.samples) peak = std::max(peak, std::fabs(v));
    const auto gain = static_cast<float>(std::pow(10.0, peakDbfs / 20.0) / std::max(peak, 1e-9f));
    for (float& v : s.samples) v *= gain;
}

// Energy, pitch and speech level of a signal (the scan's defaults).
inline void measure(VoiceTake& t) {
    t.energy = analyseEnergy(t.signal);
    t.pitch = analysePitch(t.signal);
    t.speechLevelDb = detectSpeech(t.energy, t.signal.durationSeconds()).speechLevelDb;
}

inline std::string allLines() {
    std::string text;
    for (const auto& line : tramwayLines()) text += line + "\n";
    return text;
}

inline const std::vector<VoiceTake>& cleanVoiceTakes() {
    static const std::vector<VoiceTake> takes = [] {
        std::vector<VoiceTake> out;
        for (const char* voice : {"en-us", "en-gb-x-rp", "en-us+f3"}) {
            VoiceTake t;
            t.voice = std::string("espeak-ng ") + voice;
            t.signal = renderSpeech(allLines(), SpeechParams{.voice = voice, .rateWpm = 160}).audio;
            out.push_back(std::move(t));
        }
        TempDir dir;
        const auto text = dir.path() / "lines.txt";
        std::ofstream(text) << allLines();
        for (const char* voice : {"cmu_us_slt_arctic_hts", "kal_diphone", "ked_diphone"}) {
            const auto wav = dir.path() / (std::string(voice) + ".wav");
            runOrThrow("text2wave -eval " + shellQuote(std::string("(voice_") + voice + ")") + " " +
                       shellQuote(text.string()) + " -o " + shellQuote(wav.string()));
            VoiceTake t;
            t.voice = std::string("festival ") + voice;
            t.signal = loadAudio(wav.string()).signal;
            out.push_back(std::move(t));
        }
        for (auto& t : out) {
            normalisePeak(t.signal, -3.0);
            measure(t);
        }
        return out;
    }();
    return takes;
}

}  // namespace earmark::test
