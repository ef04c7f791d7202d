#include "array2d.hpp"

#include "earmark/core/error.hpp"

#include <cmath>
#include <cstdio>
#include <limits>

namespace earmark::detail {

std::string shapeText(int rows, int cols) {
    std::string s = std::to_string(rows);
    s.insert(s.begin(), '(');
    return s.append(", ").append(std::to_string(cols)).append(")");
}

std::string formatted(const char* format, double v) {
    char buf[64];
    std::snprintf(buf, sizeof buf, format, v);
    return buf;
}

Array2d squeezeTo2d(NpyArray array, const std::string& path, const char* what) {
    std::vector<std::int64_t> shape = array.shape;
    while (shape.size() > 2 && shape.front() == 1) shape.erase(shape.begin());
    std::string given = "(";
    for (std::size_t i = 0; i < array.shape.size(); ++i) given += (i ? ", " : "") + std::to_string(array.shape[i]);
    given += array.shape.size() == 1 ? ",)" : ")";
    if (shape.size() != 2)
        throw InputError(path, std::string("holds an array of shape ") + given + "; " + what +
                                   " needs 2 axes (leading axes of size 1 are dropped)");
    constexpr auto kMax = static_cast<std::int64_t>(std::numeric_limits<int>::max());
    if (shape[0] < 1 || shape[1] < 1 || shape[0] > kMax || shape[1] > kMax)
        throw InputError(path,
                         std::string("holds an array of shape ") + given + ": " + what + " needs both axes non-empty");
    for (std::size_t i = 0; i < array.data.size(); ++i)
        if (!std::isfinite(array.data[i]))
            throw InputError(path, "value " + std::to_string(i) + " (C order) is not a finite number");
    return Array2d{static_cast<int>(shape[0]), static_cast<int>(shape[1]), std::move(array.data)};
}

std::vector<float> transposed(const std::vector<float>& values, int rows, int cols) {
    std::vector<float> out(values.size());
    for (int r = 0; r < rows; ++r)
        for (int c = 0; c < cols; ++c)
            out[static_cast<std::size_t>(c) * rows + r] = values[static_cast<std::size_t>(r) * cols + c];
    return out;
}

}  // namespace earmark::detail
