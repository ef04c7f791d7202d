// A listening test's report as files: JSON (everything), CSV tables (one row
// per system, per pair, per A/B pair) and SVG pictures drawn here as plain
// text (means with interval bars, per-line box plots, preference shares).
// Formats: docs/listening-tests.md. Undefined numbers are JSON null and empty
// CSV fields. Pure functions, thread-safe, no errors beyond std::bad_alloc.
#pragma once

#include "earmark/listening/analysis.hpp"

#include <string>

namespace earmark::listening {

std::string reportToJson(const TestDesign& design, const Report& report, int indent = 2);
std::string systemsCsv(const Report& report);
std::string pairsCsv(const Report& report);        // MOS / MUSHRA / CMOS
std::string preferencesCsv(const Report& report);  // A/B
std::string exclusionsCsv(const Report& report);

// Means with the t interval (thick bar) and the bootstrap interval (thin bar
// beside it) on the kind's scale; for A/B the share of each pair with its
// Clopper–Pearson interval around the 50 % line.
std::string meansSvg(const TestDesign& design, const Report& report);
// Box plots of every line, one box per system (whiskers at min and max).
// Empty for A/B tests.
std::string linesSvg(const TestDesign& design, const Report& report);

}  // namespace earmark::listening
