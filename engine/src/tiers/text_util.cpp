#include "text_util.hpp"

#include "earmark/core/error.hpp"

#include <cerrno>
#include <charconv>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace earmark::tiers_detail {

std::string formatNumber(double v) {
    char buf[64];
    const auto result = std::to_chars(buf, buf + sizeof buf, v);
    return std::string(buf, result.ptr);
}

std::optional<double> parseNumber(std::string_view text) {
    while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
    while (!text.empty() && (text.back() == ' ' || text.back() == '\t')) text.remove_suffix(1);
    if (!text.empty() && text.front() == '+') text.remove_prefix(1);
    if (text.empty()) return std::nullopt;
    double v = 0.0;
    const auto result = std::from_chars(text.data(), text.data() + text.size(), v);
    if (result.ec != std::errc() || result.ptr != text.data() + text.size() || !std::isfinite(v))
        return std::nullopt;
    return v;
}

std::string_view stripBom(std::string_view text) {
    if (text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);
    return text;
}

TextPosition positionOf(std::string_view text, std::size_t byteOffset) {
    TextPosition pos;
    for (std::size_t i = 0; i < byteOffset && i < text.size(); ++i) {
        if (text[i] == '\n') {
            ++pos.line;
            pos.column = 1;
        } else {
            ++pos.column;
        }
    }
    return pos;
}

std::string readTextFile(const std::string& path) {
    std::error_code ec;
    if (!std::filesystem::exists(path, ec)) throw InputError(path, "no such file");
    if (std::filesystem::is_directory(path, ec)) throw InputError(path, "is a folder, not a file");
    std::ifstream in(path, std::ios::binary);
    if (!in) throw InputError(path, std::string("cannot be opened: ") + std::strerror(errno));
    std::ostringstream text;
    text << in.rdbuf();
    if (in.bad()) throw InputError(path, "read failed");
    return text.str();
}

}  // namespace earmark::tiers_detail
