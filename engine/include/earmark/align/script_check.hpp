// Does a voice read the script a text is written in?
//
// A renderer faced with letters of a script its language does not use
// either spells them out ("Chinese letter") or skips them; either way the
// reference no longer matches the take, so such text is refused up front.
// Letters are sorted into Unicode scripts by code block (The Unicode
// Standard, chapter "Scripts" block ranges, from memory); digits,
// punctuation, symbols and spaces belong to no script and always pass.
#pragma once

#include <string>

namespace earmark {

enum class Script {
    None,  // not a letter
    Latin, Greek, Cyrillic, Armenian, Hebrew, Arabic, Devanagari, Bengali, Gurmukhi, Gujarati, Oriya, Tamil,
    Telugu, Kannada, Malayalam, Sinhala, Thai, Lao, Tibetan, Myanmar, Georgian, Hangul, Ethiopic, Hiragana,
    Katakana, Han,
    Other,  // a letter of a script not listed
};

// Script of one code point.
Script scriptOf(char32_t codePoint);
const char* scriptName(Script script);

// Throws InputError("text", "…") naming the first letter (1-based character
// position and the letter) whose script the language cannot read, e.g. Han
// characters for "en-us". `language` is an espeak-ng language tag ("en-us",
// "ru", "cmn"); its first subtag picks the scripts. Languages written in
// another script also accept Latin (the renderer reads Latin words in
// them); languages this check does not know are treated as Latin-script.
// Also throws InputError for text that is not valid UTF-8.
void checkTextScript(const std::string& text, const std::string& language, const std::string& voice);

}  // namespace earmark
