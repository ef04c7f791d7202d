#include "earmark/prosody/syllables.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <string>

namespace earmark {
namespace {

bool isVowelLetter(char c) { return c == 'a' || c == 'e' || c == 'i' || c == 'o' || c == 'u' || c == 'y'; }

bool endsWith(const std::string& s, std::string_view tail) {
    return s.size() >= tail.size() && s.compare(s.size() - tail.size(), tail.size(), tail) == 0;
}

int syllablesOfLetters(const std::string& w) {
    int count = 0;
    std::size_t i = 0;
    while (i < w.size()) {
        const bool vowel = isVowelLetter(w[i]) && !(w[i] == 'y' && i == 0);
        if (!vowel) {
            ++i;
            continue;
        }
        std::size_t j = i;
        while (j < w.size() && isVowelLetter(w[j])) ++j;
        ++count;
        // Vowel pairs usually said apart ("radio", "usual", "stadium").
        for (std::size_t k = i; k + 1 < j; ++k) {
            const char a = w[k], b = w[k + 1];
            const char before = k > 0 ? w[k - 1] : '\0';
            const bool quGu = a == 'u' && (before == 'q' || before == 'g');
            const bool tionLike = a == 'i' && (b == 'o' || b == 'a') &&
                                  (before == 't' || before == 's' || before == 'c' || before == 'x');
            if (quGu || tionLike) continue;
            if ((a == 'i' && (b == 'a' || b == 'o' || b == 'u')) || (a == 'u' && (b == 'a' || b == 'o')))
                ++count;
        }
        i = j;
    }
    if (endsWith(w, "eum")) ++count;  // "museum": e and u said apart
    if (count > 1) {
        const std::size_t n = w.size();
        const auto consonantAt = [&](std::size_t k) { return k < n && !isVowelLetter(w[k]); };
        if (endsWith(w, "e") && n >= 2 && consonantAt(n - 2) &&
            !(endsWith(w, "le") && n >= 3 && consonantAt(n - 3)))
            --count;  // silent final e ("lane"), but "table" keeps its "-le"
        else if (endsWith(w, "es") && n >= 3 && consonantAt(n - 3)) {
            const char c = w[n - 3];
            const bool sibilant = c == 's' || c == 'x' || c == 'z' || c == 'c' || c == 'g' ||
                                  (n >= 4 && (w[n - 4] == 'c' || w[n - 4] == 's') && c == 'h');
            const bool syllabicLe = c == 'l' && n >= 4 && consonantAt(n - 4);
            if (!sibilant && !syllabicLe) --count;  // "lanes", but "boxes", "wages", "churches", "tables"
        } else if (endsWith(w, "ed") && n >= 3 && consonantAt(n - 3) && w[n - 3] != 't' && w[n - 3] != 'd') {
            --count;  // "lowered", but "wanted"
        }
    }
    return std::max(count, 1);
}

// Syllables of the English name of each digit 0–9.
constexpr std::array<int, 10> kDigitSyllables = {2, 1, 1, 1, 1, 1, 1, 2, 1, 1};

bool isArpabetVowel(std::string_view s) {
    static constexpr std::array<std::string_view, 16> vowels = {
        "AA", "AE", "AH", "AO", "AW", "AX", "AY", "EH", "ER", "EY", "IH", "IX", "IY", "OW", "OY", "UH"};
    if (s == "UW" || s == "AXR") return true;
    return std::find(vowels.begin(), vowels.end(), s) != vowels.end();
}

}  // namespace

const char* syllableSourceName(SyllableSource source) {
    switch (source) {
        case SyllableSource::Phones: return "phones";
        case SyllableSource::Text: return "text";
        case SyllableSource::EnergyPeaks: return "energy";
        case SyllableSource::None: break;
    }
    return "none";
}

int countSyllablesInWord(std::string_view word) {
    int total = 0;
    std::string letters;
    auto flush = [&] {
        if (!letters.empty()) total += syllablesOfLetters(letters);
        letters.clear();
    };
    for (unsigned char c : word) {
        if (std::isalpha(c)) {
            letters.push_back(static_cast<char>(std::tolower(c)));
        } else if (std::isdigit(c)) {
            flush();
            total += kDigitSyllables[c - '0'];
        } else if (c == '\'' ) {
            continue;  // "don't" is one word
        } else if (c >= 0x80) {
            letters.push_back('a');  // a non-ASCII letter: count it as a vowel-ish letter
        } else {
            flush();  // hyphens and other separators split parts ("well-known")
        }
    }
    flush();
    return total;
}

int countSyllablesInText(std::string_view text) {
    int total = 0;
    for (const auto& token : textTokens(std::string(text))) total += countSyllablesInWord(token);
    return total;
}

bool isVowelPhone(std::string_view label) {
    std::string s;
    for (char c : label) {
        if (c == '\'' || c == ',' || c == '"' || c == '%' || c == '=' || c == ':') continue;
        s.push_back(c);
    }
    // Strip IPA stress marks (UTF-8 ˈ U+02C8 = CB 88, ˌ U+02CC = CB 8C).
    while (s.size() >= 2 && static_cast<unsigned char>(s[0]) == 0xCB &&
           (static_cast<unsigned char>(s[1]) == 0x88 || static_cast<unsigned char>(s[1]) == 0x8C))
        s.erase(0, 2);
    if (s.empty()) return false;
    // ARPAbet: upper-case letters with an optional stress digit.
    std::string core = s;
    while (!core.empty() && std::isdigit(static_cast<unsigned char>(core.back()))) core.pop_back();
    const bool allUpper = !core.empty() && std::all_of(core.begin(), core.end(), [](char c) {
        return std::isupper(static_cast<unsigned char>(c));
    });
    if (allUpper && core.size() >= 2) return isArpabetVowel(core);
    const unsigned char c0 = static_cast<unsigned char>(s[0]);
    if (c0 < 0x80) return std::string_view("aeiouyAEIOU@3V0{&Q").find(static_cast<char>(c0)) != std::string_view::npos;
    // IPA vowels outside ASCII: æ ø œ ɐ ɑ ɒ ɔ ə ɘ ɛ ɜ ɞ ɤ ɨ ɪ ɯ ɵ ʉ ʊ ʌ ʏ.
    static constexpr std::array<std::string_view, 21> ipa = {
        "æ", "ø", "œ", "ɐ", "ɑ", "ɒ", "ɔ", "ə", "ɘ", "ɛ", "ɜ", "ɞ", "ɤ", "ɨ", "ɪ", "ɯ", "ɵ", "ʉ", "ʊ", "ʌ", "ʏ"};
    for (auto v : ipa)
        if (s.compare(0, v.size(), v) == 0) return true;
    return false;
}

int countVowelPhones(const std::vector<Interval>& phones, double startS, double endS) {
    int n = 0;
    for (const auto& p : phones) {
        const double mid = 0.5 * (p.startS + p.endS);
        if (mid >= startS && mid < endS && isVowelPhone(p.label)) ++n;
    }
    return n;
}

void EnergyPeakParams::validate() const {
    if (!(smoothSeconds >= 0)) throw ParamError("EnergyPeakParams.smoothSeconds", "must be >= 0");
    if (!(minDipDb > 0)) throw ParamError("EnergyPeakParams.minDipDb", "must be positive");
    if (!(maxBelowSpeechDb > 0)) throw ParamError("EnergyPeakParams.maxBelowSpeechDb", "must be positive");
    if (!(minGapSeconds >= 0)) throw ParamError("EnergyPeakParams.minGapSeconds", "must be >= 0");
}

int countEnergyPeaks(const EnergyTrack& energy, const PitchTrack* pitch, double speechLevelDb,
                     double startS, double endS, const EnergyPeakParams& params) {
    params.validate();
    if (!(energy.hopSeconds > 0) || energy.db.empty() || !(endS > startS)) return 0;
    const double hop = energy.hopSeconds;
    const auto n = static_cast<long>(energy.db.size());
    const long first = std::clamp(static_cast<long>(std::ceil(startS / hop)), 0L, n);
    const long last = std::clamp(static_cast<long>(std::ceil(endS / hop)), 0L, n);  // exclusive
    if (last - first < 3) return 0;
    // Moving average of the dB contour.
    const long half = std::max(0L, static_cast<long>(std::lround(params.smoothSeconds / hop / 2)));
    std::vector<double> smooth(static_cast<std::size_t>(last - first));
    for (long i = first; i < last; ++i) {
        double sum = 0;
        long count = 0;
        for (long k = std::max(first, i - half); k <= std::min(last - 1, i + half); ++k, ++count) sum += energy.db[k];
        smooth[static_cast<std::size_t>(i - first)] = sum / static_cast<double>(count);
    }
    const double floorDb = speechLevelDb - params.maxBelowSpeechDb;
    const auto m = static_cast<long>(smooth.size());
    auto voicedAt = [&](long local) {
        if (!pitch || !(pitch->hopSeconds > 0)) return true;
        const double t = static_cast<double>(first + local) * hop;
        const auto k = static_cast<long>(std::lround(t / pitch->hopSeconds));
        // Accept voicing within ±2 frames: the energy peak and F0 onset may be a frame apart.
        for (long d = -2; d <= 2; ++d) {
            const long j = k + d;
            if (j >= 0 && j < static_cast<long>(pitch->size()) && pitch->voiced(static_cast<std::size_t>(j))) return true;
        }
        return false;
    };
    // Peak picking with a required dip on both sides: find a valley, then the
    // highest point after it; accept that peak once the contour has fallen
    // minDipDb below it (or the span ends), then look for the next valley.
    int count = 0;
    double lastPeakT = -1e9;
    double valley = smooth[0], peak = smooth[0];
    long peakAt = 0;
    bool rising = true;
    auto accept = [&] {
        const double t = static_cast<double>(first + peakAt) * hop;
        if (peak >= floorDb && voicedAt(peakAt) && t - lastPeakT >= params.minGapSeconds) {
            ++count;
            lastPeakT = t;
        }
    };
    for (long i = 1; i < m; ++i) {
        const double v = smooth[static_cast<std::size_t>(i)];
        if (rising) {
            if (v > peak) {
                peak = v;
                peakAt = i;
            } else if (v < valley && peak - valley < params.minDipDb) {
                valley = peak = v;  // still descending into the valley
                peakAt = i;
            } else if (peak - valley >= params.minDipDb && peak - v >= params.minDipDb) {
                accept();
                rising = false;
                valley = v;
            }
        } else {
            valley = std::min(valley, v);
            if (v - valley >= params.minDipDb) {
                rising = true;
                peak = v;
                peakAt = i;
            }
        }
    }
    if (rising && peak - valley >= params.minDipDb) accept();  // speech runs to the end of the span
    return count;
}

}  // namespace earmark
