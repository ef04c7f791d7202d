#include "earmark/longform/text_outline.hpp"

#include <cctype>

namespace earmark {
namespace {

bool isSpace(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\f' || c == '\v'; }

std::string collapsed(const std::string& text, std::size_t begin, std::size_t end) {
    std::string out;
    bool space = false;
    for (std::size_t i = begin; i < end; ++i) {
        if (isSpace(text[i])) {
            space = !out.empty();
            continue;
        }
        if (space) out += ' ';
        space = false;
        out += text[i];
    }
    return out;
}

bool hasWord(const std::string& s) {
    for (unsigned char c : s)
        if (std::isalnum(c) || c >= 0x80) return true;
    return false;
}

// Sentence ends: . ? ! or the ellipsis "…" (E2 80 A6), then closers, then space or end.
void splitSentences(const std::string& text, std::size_t begin, std::size_t end, TextParagraph& paragraph) {
    std::size_t start = begin;
    const auto add = [&](std::size_t to) {
        std::string s = collapsed(text, start, to);
        if (hasWord(s)) paragraph.sentences.push_back({start, to, std::move(s)});
        start = to;
    };
    for (std::size_t i = begin; i < end; ++i) {
        std::size_t stop = 0;
        if (text[i] == '.' || text[i] == '?' || text[i] == '!') stop = i + 1;
        else if (i + 2 < end && text.compare(i, 3, "\xE2\x80\xA6") == 0) stop = i + 3;
        if (!stop) continue;
        while (stop < end && (text[stop] == '.' || text[stop] == '?' || text[stop] == '!' || text[stop] == '"' ||
                              text[stop] == '\'' || text[stop] == ')' || text[stop] == ']'))
            ++stop;
        if (stop == end || isSpace(text[stop])) {
            add(stop);
            i = stop - 1;
        }
    }
    if (start < end) add(end);
}

}  // namespace

std::size_t TextOutline::sentenceCount() const {
    std::size_t n = 0;
    for (const auto& p : paragraphs) n += p.sentences.size();
    return n;
}

TextOutline outlineText(const std::string& text) {
    TextOutline outline;
    std::size_t start = 0;
    std::size_t i = 0;
    const auto close = [&](std::size_t end) {
        TextParagraph p;
        splitSentences(text, start, end, p);
        if (!p.sentences.empty()) outline.paragraphs.push_back(std::move(p));
    };
    while (i < text.size()) {
        if (text[i] != '\n') {
            ++i;
            continue;
        }
        // A blank line: a newline, optional spaces, another newline.
        std::size_t j = i + 1;
        while (j < text.size() && (text[j] == ' ' || text[j] == '\t' || text[j] == '\r')) ++j;
        if (j < text.size() && text[j] == '\n') {
            close(i);
            while (j < text.size() && isSpace(text[j])) ++j;
            start = i = j;
        } else {
            i = j;
        }
    }
    close(text.size());
    return outline;
}

}  // namespace earmark
