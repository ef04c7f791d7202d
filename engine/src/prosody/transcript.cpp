#include "earmark/prosody/transcript.hpp"

#include <cctype>
#include <sstream>

namespace earmark {

std::vector<std::string> textTokens(const std::string& text) {
    std::vector<std::string> tokens;
    std::istringstream in(text);
    std::string token;
    while (in >> token) {
        bool hasContent = false;
        for (unsigned char c : token)
            if (std::isalnum(c) || c >= 0x80) hasContent = true;
        if (hasContent) tokens.push_back(token);
    }
    return tokens;
}

Transcript transcriptFrom(const TierSet& tiers, std::string text) {
    Transcript t;
    t.text = std::move(text);
    if (const Tier* w = tiers.find(kWordsTier)) t.words = w->intervals;
    if (const Tier* p = tiers.find(kPhonesTier)) t.phones = p->intervals;
    return t;
}

char closingPunctuation(const std::string& token) {
    // Look through closing quotes and brackets: `late,"` still ends with a comma.
    for (auto it = token.rbegin(); it != token.rend(); ++it) {
        const char c = *it;
        if (c == '"' || c == '\'' || c == ')' || c == ']') continue;
        switch (c) {
            case ',': case ';': case ':': case '.': case '?': case '!': return c;
            default: return '\0';
        }
    }
    return '\0';
}

}  // namespace earmark
