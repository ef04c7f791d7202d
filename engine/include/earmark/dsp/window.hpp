// Analysis windows.
#pragma once

#include <vector>

namespace earmark {

enum class WindowShape {
    Hann,         // 0.5 − 0.5·cos
    Hamming,      // 0.54 − 0.46·cos
    Rectangular,  // all ones
};

enum class WindowSymmetry {
    Periodic,   // length-N slice of a length-(N+1) symmetric window: the DFT-even
                // form used for spectral analysis (common practice)
    Symmetric,  // w[0] == w[N-1]: the filter-design form
};

// Throws ParamError if length < 1.
std::vector<float> makeWindow(WindowShape shape, int length,
                              WindowSymmetry symmetry = WindowSymmetry::Periodic);

}  // namespace earmark
