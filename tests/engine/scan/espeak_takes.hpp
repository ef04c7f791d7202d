// Test takes rendered at run time with espeak-ng and sox (both on the build
// machine; see scripts/setup). Invented lines for an invented tramway; no real
// voice. Header-only so every scan test file can use it.
#pragma once

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

namespace earmark::test {

inline bool haveSpeechTools() {
    return std::system("command -v espeak-ng >/dev/null 2>&1 && command -v sox >/dev/null 2>&1") == 0;
}

// Single-quotes a string for /bin/sh.
inline std::string shellQuote(const std::string& s) {
    std::string out = "'";
    for (char c : s) {
        if (c == '\'') out += "'\\''";
        else out.push_back(c);
    }
    return out + "'";
}

inline void runOrThrow(const std::string& command) {
    if (std::system((command + " 2>/dev/null").c_str()) != 0)
        throw std::runtime_error("command failed: " + command);
}

// Lines of the invented Carrow Fell Tramway, each a single sentence.
inline const std::vector<std::string>& tramwayLines() {
    static const std::vector<std::string> lines = {
        "The first car to the summit leaves the valley station at nine forty.",
        "Please hold the handrail while the car climbs the steep section above Linmoor.",
        "Tickets bought on board cost a little more than those from the kiosk.",
        "The viewing terrace at the top closes half an hour before the last descent.",
        "Walkers heading for Greyscar Tarn should leave the car at the middle stop.",
        "Our tea room serves warm scones and soup until four in the afternoon.",
        "In strong winds the service may pause until the gusts have eased.",
        "Children under five travel free when seated with an adult.",
        "The old engine shed beside the track now houses a small museum.",
        "Bicycles can be carried on the rear platform of the evening cars only.",
        "Lost gloves and hats are kept at the ticket office for a month.",
        "From the upper station you can see the lighthouse at Orrin Head on a clear day.",
        "Dogs on short leads are welcome in every car except the dining coach.",
        "A guided walk along the ridge starts from the summit at eleven.",
        "The line was built by quarry workers more than a century ago.",
        "Please keep your arms inside the car as it passes the narrow cutting.",
        "The return journey takes about twenty minutes with two stops.",
        "Visitors with reduced mobility can ask the driver for the ramp.",
        "Timetables for the winter season are posted at every stop.",
        "Thank you for riding with us, and enjoy the views from the fell.",
        "The café at the middle stop sells maps of the paths around Linmoor.",
    };
    return lines;
}

struct RenderSpec {
    std::string text;
    std::string voice = "en-gb-x-rp";
    int speedWpm = 160;
    int pitch = 50;
    bool ssml = false;
    std::string soxEffects;  // applied after the tidy step, e.g. "gain 12" or "pad 2.5 0"
};

// espeak-ng → 22.05 kHz 16-bit mono, leading/trailing silence below −60 dBFS
// stripped, peak normalised to −16 dBFS (room for a +12 dB fault without
// clipping), 0.25 s of digital silence at each end; then `soxEffects`.
inline void renderTake(const RenderSpec& spec, const std::filesystem::path& out) {
    const auto raw = out.string() + ".raw.wav";
    const auto tidy = out.string() + ".tidy.wav";
    runOrThrow("espeak-ng -v " + spec.voice + " -s " + std::to_string(spec.speedWpm) + " -p " +
               std::to_string(spec.pitch) + " -z " + (spec.ssml ? "-m " : "") + "-w " + shellQuote(raw) + " " +
               shellQuote(spec.text));
    runOrThrow("sox -D -R -V1 " + shellQuote(raw) + " -r 22050 -b 16 -c 1 " +
               shellQuote(spec.soxEffects.empty() ? out.string() : tidy) +
               " silence 1 0.01 0.1% reverse silence 1 0.01 0.1% reverse gain -n -16 pad 0.25 0.25");
    if (!spec.soxEffects.empty())
        runOrThrow("sox -D -R -V1 " + shellQuote(tidy) + " " + shellQuote(out.string()) + " " + spec.soxEffects);
    std::filesystem::remove(raw);
    std::filesystem::remove(tidy);
}

// espeak-ng's own phonemisation of `text` (`-q -x --sep=_`): phonemes joined by
// '_', words by spaces.
inline std::string espeakPhonemes(const std::string& text, const std::filesystem::path& scratch,
                                  const std::string& voice = "en-gb-x-rp") {
    runOrThrow("espeak-ng -q -x --sep=_ -v " + voice + " " + shellQuote(text) + " > " + shellQuote(scratch.string()));
    std::ifstream in(scratch);
    std::string all, line;
    while (std::getline(in, line)) all += line + " ";
    return all;
}

}  // namespace earmark::test
