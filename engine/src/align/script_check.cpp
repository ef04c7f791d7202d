#include "earmark/align/script_check.hpp"

#include "earmark/core/error.hpp"
#include "utf8.hpp"

#include <algorithm>
#include <string_view>
#include <vector>

namespace earmark {
namespace {

struct Block {
    char32_t first, last;
    Script script;
};

// Letter blocks, sorted by first code point.
constexpr Block kBlocks[] = {
    {U'A', U'Z', Script::Latin}, {U'a', U'z', Script::Latin}, {0x00AA, 0x00AA, Script::Latin},
    {0x00BA, 0x00BA, Script::Latin}, {0x00C0, 0x00D6, Script::Latin}, {0x00D8, 0x00F6, Script::Latin},
    {0x00F8, 0x02AF, Script::Latin}, {0x0370, 0x03FF, Script::Greek}, {0x0400, 0x052F, Script::Cyrillic},
    {0x0531, 0x058F, Script::Armenian}, {0x0590, 0x05FF, Script::Hebrew}, {0x0600, 0x06FF, Script::Arabic},
    {0x0750, 0x077F, Script::Arabic}, {0x08A0, 0x08FF, Script::Arabic}, {0x0900, 0x097F, Script::Devanagari},
    {0x0980, 0x09FF, Script::Bengali}, {0x0A00, 0x0A7F, Script::Gurmukhi}, {0x0A80, 0x0AFF, Script::Gujarati},
    {0x0B00, 0x0B7F, Script::Oriya}, {0x0B80, 0x0BFF, Script::Tamil}, {0x0C00, 0x0C7F, Script::Telugu},
    {0x0C80, 0x0CFF, Script::Kannada}, {0x0D00, 0x0D7F, Script::Malayalam}, {0x0D80, 0x0DFF, Script::Sinhala},
    {0x0E00, 0x0E7F, Script::Thai}, {0x0E80, 0x0EFF, Script::Lao}, {0x0F00, 0x0FFF, Script::Tibetan},
    {0x1000, 0x109F, Script::Myanmar}, {0x10A0, 0x10FF, Script::Georgian}, {0x1100, 0x11FF, Script::Hangul},
    {0x1200, 0x139F, Script::Ethiopic}, {0x1C80, 0x1C8F, Script::Cyrillic}, {0x1C90, 0x1CBF, Script::Georgian},
    {0x1E00, 0x1EFF, Script::Latin}, {0x1F00, 0x1FFF, Script::Greek}, {0x2C60, 0x2C7F, Script::Latin},
    {0x2D00, 0x2D2F, Script::Georgian}, {0x2DE0, 0x2DFF, Script::Cyrillic}, {0x3040, 0x309F, Script::Hiragana},
    {0x30A0, 0x30FF, Script::Katakana}, {0x3130, 0x318F, Script::Hangul}, {0x31F0, 0x31FF, Script::Katakana},
    {0x3400, 0x4DBF, Script::Han}, {0x4E00, 0x9FFF, Script::Han}, {0xA640, 0xA69F, Script::Cyrillic},
    {0xA720, 0xA7FF, Script::Latin}, {0xAB30, 0xAB6F, Script::Latin}, {0xAC00, 0xD7AF, Script::Hangul},
    {0xF900, 0xFAFF, Script::Han}, {0xFB1D, 0xFB4F, Script::Hebrew}, {0xFB50, 0xFDFF, Script::Arabic},
    {0xFE70, 0xFEFC, Script::Arabic}, {0xFF21, 0xFF3A, Script::Latin}, {0xFF41, 0xFF5A, Script::Latin},
    {0xFF66, 0xFF9F, Script::Katakana}, {0x20000, 0x2FFFF, Script::Han},
};

// Languages (first subtag of an espeak-ng tag) not written in Latin script.
struct LanguageScripts {
    std::string_view language;
    std::vector<Script> scripts;
};

const std::vector<LanguageScripts>& languageTable() {
    static const std::vector<LanguageScripts> table = {
        {"ru", {Script::Cyrillic}}, {"uk", {Script::Cyrillic}}, {"be", {Script::Cyrillic}},
        {"bg", {Script::Cyrillic}}, {"mk", {Script::Cyrillic}}, {"sr", {Script::Cyrillic}},
        {"ba", {Script::Cyrillic}}, {"cv", {Script::Cyrillic}}, {"tt", {Script::Cyrillic}},
        {"kk", {Script::Cyrillic}}, {"ky", {Script::Cyrillic}}, {"el", {Script::Greek}},
        {"grc", {Script::Greek}}, {"hy", {Script::Armenian}}, {"he", {Script::Hebrew}},
        {"ar", {Script::Arabic}}, {"fa", {Script::Arabic}}, {"ur", {Script::Arabic}},
        {"sd", {Script::Arabic}}, {"ug", {Script::Arabic}}, {"hi", {Script::Devanagari}},
        {"mr", {Script::Devanagari}}, {"ne", {Script::Devanagari}}, {"kok", {Script::Devanagari}},
        {"bn", {Script::Bengali}}, {"as", {Script::Bengali}}, {"bpy", {Script::Bengali}},
        {"pa", {Script::Gurmukhi}}, {"gu", {Script::Gujarati}}, {"or", {Script::Oriya}},
        {"ta", {Script::Tamil}}, {"te", {Script::Telugu}}, {"kn", {Script::Kannada}},
        {"ml", {Script::Malayalam}}, {"si", {Script::Sinhala}}, {"th", {Script::Thai}},
        {"my", {Script::Myanmar}}, {"ka", {Script::Georgian}}, {"am", {Script::Ethiopic}},
        {"cmn", {Script::Han}}, {"yue", {Script::Han}}, {"hak", {Script::Han}},
        {"ja", {Script::Han, Script::Hiragana, Script::Katakana}}, {"ko", {Script::Hangul, Script::Han}},
    };
    return table;
}

}  // namespace

Script scriptOf(char32_t c) {
    const auto it = std::upper_bound(std::begin(kBlocks), std::end(kBlocks), c,
                                     [](char32_t v, const Block& b) { return v < b.first; });
    if (it != std::begin(kBlocks)) {
        const Block& b = *(it - 1);
        if (c <= b.last) return b.script;
    }
    // Anything else above Latin-1 that is not a known letter block: treat
    // general punctuation, symbols, CJK punctuation and the like as no
    // script; other letter-bearing blocks are "Other".
    if (c < 0x0370) return Script::None;
    if ((c >= 0x2000 && c <= 0x2BFF) || (c >= 0x3000 && c <= 0x303F) || (c >= 0xFE00 && c <= 0xFE6F) || c == 0xFEFF ||
        (c >= 0xFF00 && c <= 0xFF20) || (c >= 0x1F000 && c <= 0x1FAFF) || (c >= 0xE000 && c <= 0xF8FF))
        return Script::None;
    return Script::Other;
}

const char* scriptName(Script s) {
    switch (s) {
    case Script::None: return "no";
    case Script::Latin: return "Latin";
    case Script::Greek: return "Greek";
    case Script::Cyrillic: return "Cyrillic";
    case Script::Armenian: return "Armenian";
    case Script::Hebrew: return "Hebrew";
    case Script::Arabic: return "Arabic";
    case Script::Devanagari: return "Devanagari";
    case Script::Bengali: return "Bengali";
    case Script::Gurmukhi: return "Gurmukhi";
    case Script::Gujarati: return "Gujarati";
    case Script::Oriya: return "Oriya";
    case Script::Tamil: return "Tamil";
    case Script::Telugu: return "Telugu";
    case Script::Kannada: return "Kannada";
    case Script::Malayalam: return "Malayalam";
    case Script::Sinhala: return "Sinhala";
    case Script::Thai: return "Thai";
    case Script::Lao: return "Lao";
    case Script::Tibetan: return "Tibetan";
    case Script::Myanmar: return "Myanmar";
    case Script::Georgian: return "Georgian";
    case Script::Hangul: return "Hangul";
    case Script::Ethiopic: return "Ethiopic";
    case Script::Hiragana: return "Hiragana";
    case Script::Katakana: return "Katakana";
    case Script::Han: return "Han";
    case Script::Other: return "another";
    }
    return "another";
}

void checkTextScript(const std::string& text, const std::string& language, const std::string& voice) {
    std::size_t badByte = 0;
    const auto codePoints = align_detail::decodeUtf8(text, badByte);
    if (!codePoints) throw InputError("text", "is not valid UTF-8 (byte " + std::to_string(badByte + 1) + ")");
    const std::string primary = language.substr(0, language.find('-'));
    std::vector<Script> readable{Script::Latin};
    for (const auto& entry : languageTable())
        if (entry.language == primary) readable.insert(readable.end(), entry.scripts.begin(), entry.scripts.end());
    for (std::size_t k = 0; k < codePoints->size(); ++k) {
        const Script s = scriptOf((*codePoints)[k].value);
        if (s == Script::None || std::find(readable.begin(), readable.end(), s) != readable.end()) continue;
        const auto& cp = (*codePoints)[k];
        throw InputError("text", std::string("has ") + scriptName(s) + " script ('" +
                                     text.substr(cp.byteBegin, cp.byteEnd - cp.byteBegin) + "' at character " +
                                     std::to_string(k + 1) + ") that the voice '" + voice + "' (language " +
                                     language + ") cannot read; choose a voice for that language");
    }
}

}  // namespace earmark
