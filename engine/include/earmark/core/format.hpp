// Number formats used in messages, so every error names times the same way.
#pragma once

#include <string>

namespace earmark {

// "1.250 s": a time in seconds with millisecond precision.
std::string formatSeconds(double seconds);

}  // namespace earmark
