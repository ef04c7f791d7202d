#include "support/espeak_truth.hpp"

#include <algorithm>
#include <cmath>

namespace earmark::test {

std::vector<TruthWord> truthWords(const std::string& text, const RenderedSpeech& speech) {
    const auto tokenOf = [&](std::size_t byte) {
        int token = -1;
        for (std::size_t b = 0; b <= byte && b < text.size(); ++b)
            if (text[b] != ' ' && (b == 0 || text[b - 1] == ' ')) ++token;
        return token;
    };
    std::vector<TruthWord> words;
    bool lastWasSounding = false;
    for (const SpeechEvent& ev : speech.events) {
        if (lastWasSounding && !words.empty()) words.back().endS = ev.timeS;
        lastWasSounding = false;
        if (ev.kind == SpeechEvent::Kind::Word) {
            const int token = tokenOf(ev.textBegin);
            if (words.empty() || token > words.back().firstToken) words.push_back({token, token, ev.timeS, ev.timeS});
        } else if (!ev.phoneme.empty()) {
            lastWasSounding = true;
        }
    }
    if (lastWasSounding && !words.empty()) words.back().endS = speech.audio.durationSeconds();
    const int tokens = tokenOf(text.size() - 1) + 1;
    for (std::size_t k = 0; k < words.size(); ++k)
        words[k].lastToken = (k + 1 < words.size() ? words[k + 1].firstToken : tokens) - 1;
    return words;
}

double percentile(std::vector<double> v, double q) {
    std::sort(v.begin(), v.end());
    const double pos = q * static_cast<double>(v.size() - 1);
    const auto lo = static_cast<std::size_t>(std::floor(pos));
    const std::size_t hi = std::min(lo + 1, v.size() - 1);
    return v[lo] + (pos - static_cast<double>(lo)) * (v[hi] - v[lo]);
}

}  // namespace earmark::test
