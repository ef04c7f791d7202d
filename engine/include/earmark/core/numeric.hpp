// Numeric constants shared by the engine's measures.
#pragma once

#include <limits>

namespace earmark {

// "Not measured": what a statistic of too few values reports.
inline constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

}  // namespace earmark
