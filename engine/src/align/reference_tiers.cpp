#include "earmark/align/reference_tiers.hpp"

#include "earmark/align/script_check.hpp"
#include "utf8.hpp"

#include <algorithm>
#include <cctype>
#include <optional>

namespace earmark {
namespace {

using align_detail::CodePoint;

struct Token {
    std::size_t byteBegin = 0, byteEnd = 0;
};

std::vector<Token> tokenise(const std::vector<CodePoint>& cps) {
    std::vector<Token> tokens;
    for (std::size_t k = 0; k < cps.size(); ++k) {
        if (align_detail::isSpace(cps[k].value)) continue;
        if (tokens.empty() || k == 0 || align_detail::isSpace(cps[k - 1].value)) tokens.push_back({cps[k].byteBegin, 0});
        tokens.back().byteEnd = cps[k].byteEnd;
    }
    return tokens;
}

// The token holding byte `at`, else the next one after it, else the last.
std::size_t tokenAt(const std::vector<Token>& tokens, std::size_t at) {
    for (std::size_t t = 0; t < tokens.size(); ++t)
        if (at < tokens[t].byteEnd) return t;
    return tokens.empty() ? 0 : tokens.size() - 1;
}

bool isEdgePunctuation(char32_t c) {
    if (c < 0x80) return (c >= 0x21 && c <= 0x2F) || (c >= 0x3A && c <= 0x40) || (c >= 0x5B && c <= 0x60) ||
                         (c >= 0x7B && c <= 0x7E);
    switch (c) {
    case 0x00A1: case 0x00AB: case 0x00BB: case 0x00BF:           // ¡ « » ¿
    case 0x2010: case 0x2011: case 0x2012: case 0x2013: case 0x2014: case 0x2015:  // dashes
    case 0x2018: case 0x2019: case 0x201A: case 0x201B:            // single quotes
    case 0x201C: case 0x201D: case 0x201E: case 0x201F:            // double quotes
    case 0x2026: case 0x2039: case 0x203A:                         // … ‹ ›
    case 0x3001: case 0x3002: case 0x300C: case 0x300D:            // 、 。 「 」
    case 0xFF01: case 0xFF0C: case 0xFF1A: case 0xFF1B: case 0xFF1F:  // ！ ， ： ； ？
        return true;
    default:
        return false;
    }
}

// Letters and digits in a token: what the renderer can say aloud.
std::size_t speakableCount(std::string_view token) {
    std::size_t bad = 0;
    const auto cps = align_detail::decodeUtf8(token, bad);
    std::size_t n = 0;
    if (!cps) return 0;
    for (const auto& cp : *cps)
        if ((cp.value < 0x80 && std::isalnum(static_cast<int>(cp.value))) ||
            (cp.value >= 0x80 && scriptOf(cp.value) != Script::None))
            ++n;
    return n;
}

}  // namespace

std::string tokenLabel(std::string_view token) {
    std::size_t bad = 0;
    const auto cps = align_detail::decodeUtf8(token, bad);
    if (!cps || cps->empty()) return std::string(token);
    std::size_t first = 0, last = cps->size();
    while (first < last && isEdgePunctuation((*cps)[first].value)) ++first;
    while (last > first && isEdgePunctuation((*cps)[last - 1].value)) --last;
    if (first == last) return std::string(token);
    return std::string(token.substr((*cps)[first].byteBegin, (*cps)[last - 1].byteEnd - (*cps)[first].byteBegin));
}

ReferenceTiers referenceTiers(const std::string& text, const RenderedSpeech& speech) {
    std::size_t bad = 0;
    const auto cps = align_detail::decodeUtf8(text, bad);
    const std::vector<Token> tokens = cps ? tokenise(*cps) : std::vector<Token>{};
    const double audioEnd = speech.audio.durationSeconds();

    struct PendingPhone {
        std::string name;
        double startS;
    };
    struct PendingWord {
        std::size_t token;
        double startS;
        std::vector<Interval> phones;  // sounding phones with their ends filled in
    };
    std::vector<PendingWord> words;
    std::optional<PendingPhone> open;  // the phone whose end is the next event

    const auto closePhone = [&](double at) {
        if (open && !words.empty() && at > open->startS)
            words.back().phones.push_back(Interval{open->startS, at, open->name, std::nullopt});
        open.reset();
    };
    double wordEventS = -1.0;  // a word event not yet followed by a sounding phone; < 0 = none
    for (const SpeechEvent& ev : speech.events) {
        closePhone(ev.timeS);
        if (ev.kind == SpeechEvent::Kind::Word) {
            const std::size_t t = tokenAt(tokens, ev.textBegin);
            if (words.empty() || t > words.back().token) words.push_back(PendingWord{t, ev.timeS, {}});
            wordEventS = ev.timeS;
        } else if (ev.phoneme.empty()) {
            wordEventS = -1.0;
        } else if (!words.empty()) {
            // The phone after a word event starts with it (a stop's closure
            // belongs to the phone), so words and phones share boundaries.
            open = PendingPhone{ev.phoneme, wordEventS >= 0 ? std::min(wordEventS, ev.timeS) : ev.timeS};
            wordEventS = -1.0;
        }
    }
    closePhone(audioEnd);

    ReferenceTiers out;
    const auto tokenText = [&](std::size_t t) {
        return std::string_view(text).substr(tokens[t].byteBegin, tokens[t].byteEnd - tokens[t].byteBegin);
    };
    const auto emit = [&](double startS, std::vector<Interval>::iterator first, std::vector<Interval>::iterator last,
                          std::string label) {
        const std::size_t wordIndex = out.words.intervals.size();
        out.words.intervals.push_back(Interval{startS, (last - 1)->endS, std::move(label), std::nullopt});
        for (auto it = first; it != last; ++it) {
            out.phones.intervals.push_back(std::move(*it));
            out.phoneWord.push_back(wordIndex);
        }
    };
    for (std::size_t k = 0; k < words.size(); ++k) {
        PendingWord& w = words[k];
        if (w.phones.empty() || tokens.empty()) continue;
        // Speakable tokens up to the next word event: the renderer sometimes
        // reads a short word together with the one before ("on the", "at
        // it") and reports a single word event for both.
        const std::size_t groupEnd = k + 1 < words.size() ? words[k + 1].token : tokens.size();
        std::vector<std::size_t> group{w.token};
        std::vector<std::size_t> weight{std::max<std::size_t>(1, speakableCount(tokenText(w.token)))};
        for (std::size_t t = w.token + 1; t < groupEnd; ++t)
            if (const std::size_t n = speakableCount(tokenText(t)); n > 0) group.push_back(t), weight.push_back(n);
        const std::size_t phones = w.phones.size();
        if (group.size() == 1 || phones < group.size()) {
            std::string label;
            for (std::size_t t : group) {
                if (!label.empty()) label += ' ';
                label += tokenLabel(tokenText(t));
            }
            emit(w.startS, w.phones.begin(), w.phones.end(), label);
            continue;
        }
        // Share the phones out in proportion to each token's letters (a
        // heuristic: the renderer does not say where the inner boundary is).
        std::size_t total = 0;
        for (std::size_t x : weight) total += x;
        std::size_t begin = 0, cumulative = 0;
        for (std::size_t m = 0; m < group.size(); ++m) {
            cumulative += weight[m];
            const std::size_t remaining = group.size() - 1 - m;
            std::size_t end = (phones * cumulative + total / 2) / total;
            end = std::clamp(end, begin + 1, phones - remaining);
            const double startS = m == 0 ? w.startS : w.phones[begin].startS;
            emit(startS, w.phones.begin() + static_cast<std::ptrdiff_t>(begin),
                 w.phones.begin() + static_cast<std::ptrdiff_t>(end), tokenLabel(tokenText(group[m])));
            begin = end;
        }
    }
    return out;
}

}  // namespace earmark
