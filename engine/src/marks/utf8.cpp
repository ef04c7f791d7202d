#include "earmark/marks/utf8.hpp"

#include "earmark/core/error.hpp"

namespace earmark {

// The well-formed byte sequences of RFC 3629, section 4 (Syntax of UTF-8 Byte
// Sequences): the second byte's range depends on the lead byte, which rules
// out overlong forms, surrogates and code points above U+10FFFF.
std::optional<std::size_t> firstInvalidUtf8(std::string_view text) {
    const auto* s = reinterpret_cast<const unsigned char*>(text.data());
    const std::size_t n = text.size();
    std::size_t i = 0;
    while (i < n) {
        const unsigned char c = s[i];
        if (c < 0x80) {
            ++i;
            continue;
        }
        int extra = 0;
        unsigned char lo = 0x80, hi = 0xBF;  // allowed range of the second byte
        if (c >= 0xC2 && c <= 0xDF) {
            extra = 1;
        } else if (c == 0xE0) {
            extra = 2, lo = 0xA0;
        } else if ((c >= 0xE1 && c <= 0xEC) || c == 0xEE || c == 0xEF) {
            extra = 2;
        } else if (c == 0xED) {
            extra = 2, hi = 0x9F;
        } else if (c == 0xF0) {
            extra = 3, lo = 0x90;
        } else if (c >= 0xF1 && c <= 0xF3) {
            extra = 3;
        } else if (c == 0xF4) {
            extra = 3, hi = 0x8F;
        } else {
            return i;
        }
        if (i + static_cast<std::size_t>(extra) >= n) return i;  // sequence cut short
        if (s[i + 1] < lo || s[i + 1] > hi) return i;
        for (int k = 2; k <= extra; ++k)
            if (s[i + k] < 0x80 || s[i + k] > 0xBF) return i;
        i += static_cast<std::size_t>(extra) + 1;
    }
    return std::nullopt;
}

std::string validUtf8(std::string_view text) {
    std::string out;
    while (auto bad = firstInvalidUtf8(text)) {
        out.append(text.substr(0, *bad));
        out.append("\xEF\xBF\xBD");
        text.remove_prefix(*bad + 1);
    }
    out.append(text);
    return out;
}

void checkTypedText(const std::string& subject, std::string_view text, std::size_t maxBytes, bool multiLine) {
    if (auto bad = firstInvalidUtf8(text))
        throw ParamError(subject, "is not valid UTF-8 (bad byte at offset " + std::to_string(*bad) +
                                      "); save the text as UTF-8");
    if (text.size() > maxBytes)
        throw ParamError(subject, "is " + std::to_string(text.size()) + " bytes long; at most " +
                                      std::to_string(maxBytes) + " are allowed");
    for (std::size_t i = 0; i < text.size(); ++i) {
        const auto c = static_cast<unsigned char>(text[i]);
        const bool allowed = c >= 0x20 || c == '\t' || (multiLine && (c == '\n' || c == '\r'));
        if (!allowed || c == 0x7F)
            throw ParamError(subject, "contains a control character (byte " + std::to_string(c) +
                                          " at offset " + std::to_string(i) + ")");
    }
}

}  // namespace earmark
