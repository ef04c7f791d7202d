#include "earmark/dsp/window.hpp"

#include "earmark/core/error.hpp"

#include <cmath>
#include <numbers>
#include <string>

namespace earmark {

std::vector<float> makeWindow(WindowShape shape, int length, WindowSymmetry symmetry) {
    if (length < 1) throw ParamError("Window.length", "must be at least 1, got " + std::to_string(length));
    std::vector<float> w(static_cast<std::size_t>(length), 1.0f);
    if (shape == WindowShape::Rectangular || length == 1) return w;
    const double denom = symmetry == WindowSymmetry::Periodic ? length : length - 1;
    const double a0 = shape == WindowShape::Hann ? 0.5 : 0.54;
    const double a1 = 1.0 - a0;
    for (int n = 0; n < length; ++n)
        w[static_cast<std::size_t>(n)] =
            static_cast<float>(a0 - a1 * std::cos(2.0 * std::numbers::pi * n / denom));
    return w;
}

}  // namespace earmark
