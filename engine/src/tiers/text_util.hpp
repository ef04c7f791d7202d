// Small text helpers shared by the timings readers and writers (internal).
#pragma once

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

}  // namespace earmark::tiers_detail
