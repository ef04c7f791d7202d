// Private to the model code: a .npy array as a row-major 2-D matrix, and
// the text helpers its messages use.
#pragma once

#include "earmark/export/npy.hpp"

#include <string>
#include <vector>

namespace earmark::detail {

struct Array2d {
    int rows = 0, cols = 0;
    std::vector<float> values;  // rows × cols, row-major
};

// Drops leading axes of size 1; throws InputError(path, "…") naming `what`
// when the rest is not 2-D with both sizes >= 1, or holds NaN/Inf.
Array2d squeezeTo2d(NpyArray array, const std::string& path, const char* what);

// rows × cols → cols × rows.
std::vector<float> transposed(const std::vector<float>& values, int rows, int cols);

// "(80, 412)".
std::string shapeText(int rows, int cols);

// `v` printed with a printf format for one double, e.g. formatted("%.1f Hz", v).
std::string formatted(const char* format, double v);

}  // namespace earmark::detail
