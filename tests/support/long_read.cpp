#include "support/long_read.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"

#include <unistd.h>

#include <cmath>
#include <filesystem>
#include <functional>
#include <cstdint>
#include <map>
#include <mutex>
#include <tuple>

namespace earmark::test {
namespace {

const char* const kSubjects[] = {
    "The night ferry", "Our harbour crew", "A small cargo boat", "The tide gauge", "The old signal lamp",
    "Every evening the keeper", "The fishing fleet", "A grey heron", "The morning pilot", "Two young deckhands",
    "The northern buoy", "The ticket office",
};
const char* const kVerbs[] = {
    "checked the ropes twice", "crossed the bay slowly", "waited for the last passengers",
    "reported a strong current", "painted the railings green", "carried sacks of flour to the island",
    "sounded the horn three times", "counted the empty crates", "moved the launch to the inner basin",
    "wrote a careful note in the log",
};
const char* const kTails[] = {
    "before the wind turned to the west", "while the gulls circled over the pier",
    "and nobody complained about the delay", "as the fog rolled in from the headland",
    "just after the church bell rang at noon", "because the channel was closed for repairs",
    "although the sky looked calm and clear", "until the lights came on along the quay",
    "when the water rose above the second step",
};

// Drops leading and trailing near-silence of a render.
Signal trimmed(const Signal& s) {
    std::size_t a = 0, b = s.size();
    while (a < b && std::fabs(s.samples[a]) < 1e-3f) ++a;
    while (b > a && std::fabs(s.samples[b - 1]) < 1e-3f) --b;
    Signal out;
    out.sampleRate = s.sampleRate;
    out.samples.assign(s.samples.begin() + static_cast<std::ptrdiff_t>(a), s.samples.begin() + static_cast<std::ptrdiff_t>(b));
    return out;
}

// A render from the disk cache (shared by the test processes ctest starts),
// else rendered now and stored: written under a unique name, then renamed.
Signal renderedOnDisk(int i, const SpeechParams& p) {
    const std::string text = longReadSentence(i);
    // Built by append: GCC 12 raises a false -Wrestrict on "literal" + std::string&&.
    std::string name("s");
    name.append(std::to_string(i)).append("-").append(p.voice).append("-").append(std::to_string(p.rateWpm));
    name.append("-").append(std::to_string(p.pitchRange)).append("-");
    name.append(std::to_string(std::hash<std::string>{}(text) % 1000000007u)).append(".wav");
    const std::filesystem::path dir = std::filesystem::temp_directory_path() / "earmark-long-read-cache";
    const std::filesystem::path file = dir / name;
    std::error_code ec;
    if (std::filesystem::exists(file, ec)) {
        try {
            return loadAudio(file.string()).signal;
        } catch (const Error&) {
            // a damaged cache file: render again
        }
    }
    Signal s = trimmed(renderSpeech(text, p).audio);
    std::filesystem::create_directories(dir, ec);
    const std::filesystem::path part = dir / (name + "." + std::to_string(::getpid()) + ".part");
    try {
        writeWav(part.string(), s, WavEncoding::Float32);
        std::filesystem::rename(part, file, ec);
    } catch (const Error&) {
        // no cache: fine, the render is in hand
    }
    return s;
}

const Signal& rendered(int i, const SpeechParams& p) {
    static std::mutex mutex;
    static std::map<std::tuple<int, std::string, int, int>, Signal> cache;
    std::lock_guard lock(mutex);
    const auto key = std::make_tuple(i, p.voice, p.rateWpm, p.pitchRange);
    auto it = cache.find(key);
    if (it == cache.end()) it = cache.emplace(key, renderedOnDisk(i, p)).first;
    return it->second;
}

}  // namespace

std::string longReadSentence(int i) {
    const int a = static_cast<int>(std::size(kSubjects)), b = static_cast<int>(std::size(kVerbs)),
              c = static_cast<int>(std::size(kTails));
    return std::string(kSubjects[i % a]) + " " + kVerbs[(i * 7 + 3) % b] + " " + kTails[(i * 5 + 1) % c] + ".";
}

LongRead makeLongRead(const LongReadPlan& plan) {
    LongRead read;
    std::vector<float>& x = read.audio.samples;
    for (int i = 0; i < plan.sentences; ++i) {
        const Signal& s = rendered(i, plan.speech(i));
        read.audio.sampleRate = s.sampleRate;
        // Pauses of 0.5–0.8 s (golden-ratio sequence), 0.4 s of floor before the first.
        const double pause = i == 0 ? 0.4 : 0.5 + 0.3 * std::fmod(i * 0.6180339887, 1.0);
        const auto pauseSamples = static_cast<std::size_t>(std::lround(pause * s.sampleRate));
        if (i > 0) read.joins.push_back((static_cast<double>(x.size()) + pauseSamples / 2.0) / s.sampleRate);
        x.resize(x.size() + pauseSamples, 0.0f);
        read.sentenceStartS.push_back(static_cast<double>(x.size()) / s.sampleRate);
        x.insert(x.end(), s.samples.begin(), s.samples.end());
        read.sentenceEndS.push_back(static_cast<double>(x.size()) / s.sampleRate);
        read.text += longReadSentence(i) + ((i + 1) % 6 == 0 ? "\n\n" : " ");
    }
    x.resize(x.size() + static_cast<std::size_t>(0.4 * read.audio.sampleRate), 0.0f);
    // Floor (white noise, uniform), gain, clicks.
    std::uint32_t state = 12345;
    const double rate = read.audio.sampleRate;
    const double uniformRms = 1.0 / std::sqrt(3.0);
    double gainT = -1, gain = 1, floorAmp = 0;
    for (std::size_t n = 0; n < x.size(); ++n) {
        const double t = static_cast<double>(n) / rate;
        if (t - gainT >= 0.001) {  // the profiles change slowly: update every millisecond
            gainT = t;
            gain = std::pow(10.0, plan.gainDb(t) / 20.0);
            floorAmp = std::pow(10.0, (plan.noiseFloorDbfs + plan.floorStepDb(t)) / 20.0) / uniformRms;
        }
        state = state * 1664525u + 1013904223u;
        const double u = static_cast<double>(state >> 8) / 16777216.0 * 2.0 - 1.0;
        x[n] = static_cast<float>((x[n] + floorAmp * u) * gain);
    }
    for (double c : plan.clicksS) {
        const auto n = static_cast<std::size_t>(std::lround(c * rate));
        const float shape[] = {0.3f, -0.2f, 0.1f};
        for (std::size_t k = 0; k < 3 && n + k < x.size(); ++k) x[n + k] += shape[k];
    }
    return read;
}

const LongRead& twelveSentenceRead() {
    static const LongRead read = makeLongRead({.sentences = 12});
    return read;
}

}  // namespace earmark::test
