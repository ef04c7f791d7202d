// The outline of a long text: paragraphs (separated by one or more blank
// lines) and sentences (ending in . ? ! or … followed by a space or the end,
// closing quotes and brackets kept with the sentence). The sentence rule is
// common practice and knows no abbreviations: "Dr. Reed" splits after "Dr.".
//
// Offsets are bytes of the UTF-8 text; labels are the trimmed text with runs
// of white space made one space. Pure functions.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

namespace earmark {

struct TextSentence {
    std::size_t begin = 0, end = 0;  // byte range in the text
    std::string text;                // trimmed, white space collapsed
};

struct TextParagraph {
    std::vector<TextSentence> sentences;
};

struct TextOutline {
    std::vector<TextParagraph> paragraphs;  // only paragraphs with words
    std::size_t sentenceCount() const;
};

TextOutline outlineText(const std::string& text);

}  // namespace earmark
