// UTF-8 decoding for the aligner's text handling (internal).
#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string_view>
#include <vector>

namespace earmark::align_detail {

struct CodePoint {
    char32_t value = 0;
    std::size_t byteBegin = 0;  // offset of its first byte
    std::size_t byteEnd = 0;    // offset after its last byte
};

// Decodes well-formed UTF-8 (RFC 3629: no overlongs, no surrogates, at most
// U+10FFFF). Returns nullopt and sets badByte to the offset of the first
// ill-formed sequence otherwise.
std::optional<std::vector<CodePoint>> decodeUtf8(std::string_view text, std::size_t& badByte);

bool isSpace(char32_t c);

}  // namespace earmark::align_detail
