// UTF-8 checks for text typed by people (notes, rater names, take texts).
// Session files and defect lists store text as UTF-8 (RFC 3629), so text in
// any other encoding is refused where it enters, with the byte offset.
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace earmark {

// Offset of the first byte that breaks RFC 3629 UTF-8 (bad lead byte, missing
// or extra continuation byte, overlong form, surrogate, above U+10FFFF);
// empty when the whole text is valid.
std::optional<std::size_t> firstInvalidUtf8(std::string_view text);

inline bool isValidUtf8(std::string_view text) { return !firstInvalidUtf8(text).has_value(); }

// `text` with every byte that breaks UTF-8 replaced by U+FFFD, for showing a
// name (a file name in another encoding) where only UTF-8 may go.
std::string validUtf8(std::string_view text);

// Text typed by a person (a note, a rater's name): valid UTF-8, at most
// `maxBytes`, and no control characters other than tab (and line breaks when
// `multiLine`): they would corrupt one-line displays. Throws ParamError whose
// subject is `subject` ("Mark.note").
void checkTypedText(const std::string& subject, std::string_view text, std::size_t maxBytes, bool multiLine);

}  // namespace earmark
