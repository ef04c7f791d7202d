// The JSON form of a take comparison, as written by `earmark-cli compare
// --json`. Fields and units: docs/compare.md. Missing figures (an unvoiced
// word's F0) are null. Pure function.
#pragma once

#include "earmark/compare/take_comparison.hpp"

#include <string>

namespace earmark {

struct ComparisonJsonNames {
    std::string a, b;  // what to call the takes (file paths); may be empty
};

// Ends without a newline; two-space indentation.
std::string comparisonToJson(const TakeComparison& comparison, const ComparisonJsonNames& names = {});

}  // namespace earmark
