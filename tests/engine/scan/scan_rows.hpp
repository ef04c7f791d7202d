// Finding a scan report's row by take id.
#pragma once

#include "earmark/scan/scan_report.hpp"

#include <stdexcept>
#include <string>

namespace earmark::test {

inline const ScanRow& rowOf(const ScanReport& r, const std::string& id) {
    for (const auto& row : r.rows)
        if (row.id == id) return row;
    throw std::runtime_error("no row " + id);
}

}  // namespace earmark::test
