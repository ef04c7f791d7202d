// Small text helpers shared by the timings readers and writers (internal).
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>

namespace earmark::tiers_detail {

// Shortest decimal text that reads back as the same double ("0.25", "1.2e-05").
std::string formatNumber(double v);

// A whole field as a finite number (surrounding spaces allowed), else nullopt.
std::optional<double> parseNumber(std::string_view text);

// Drops a leading UTF-8 byte-order mark.
std::string_view stripBom(std::string_view text);

// 1-based line and column (in bytes) of a byte offset.
struct TextPosition {
    std::size_t line = 1;
    std::size_t column = 1;
};
TextPosition positionOf(std::string_view text, std::size_t byteOffset);

// Reads a whole file; throws InputError(path, …) when it is missing, a folder or unreadable.
std::string readTextFile(const std::string& path);

}  // namespace earmark::tiers_detail
