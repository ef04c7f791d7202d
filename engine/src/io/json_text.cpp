#include "json_text.hpp"

namespace earmark::io_detail {

std::string lineAndColumn(std::string_view text, std::size_t byteOffset) {
    std::size_t line = 1, column = 1;
    for (std::size_t i = 0; i < byteOffset && i < text.size(); ++i) {
        if (text[i] == '\n') {
            ++line;
            column = 1;
        } else {
            ++column;
        }
    }
    return "line " + std::to_string(line) + ", column " + std::to_string(column);
}

std::string hexBytes(std::string_view bytes) {
    static const char digits[] = "0123456789abcdef";
    std::string out;
    for (unsigned char c : bytes) {
        out += digits[c >> 4];
        out += digits[c & 15];
    }
    return out;
}

std::string bytesFromHex(std::string_view hex, const std::string& source) {
    auto value = [&](char c) -> int {
        if (c >= '0' && c <= '9') return c - '0';
        if (c >= 'a' && c <= 'f') return c - 'a' + 10;
        if (c >= 'A' && c <= 'F') return c - 'A' + 10;
        throw InputError(source, "a *_bytes field is not hexadecimal");
    };
    if (hex.size() % 2) throw InputError(source, "a *_bytes field has an odd number of digits");
    std::string out;
    for (std::size_t i = 0; i < hex.size(); i += 2)
        out += static_cast<char>(value(hex[i]) * 16 + value(hex[i + 1]));
    return out;
}

std::string overflowingNumber(const std::string& what) {
    // nlohmann: "[json.exception.out_of_range.406] number overflow parsing '1e400'"
    const auto open = what.find('\'');
    const auto close = what.rfind('\'');
    if (open == std::string::npos || close <= open) return "(beyond the range of a double)";
    std::string number = what.substr(open + 1, close - open - 1);
    if (number.size() > 24) number = number.substr(0, 20) + "… (" + std::to_string(number.size()) + " characters)";
    return number;
}

}  // namespace earmark::io_detail
