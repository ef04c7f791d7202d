#include "earmark/core/format.hpp"

#include <cstdio>

namespace earmark {

std::string formatSeconds(double seconds) {
    char buf[48];
    std::snprintf(buf, sizeof buf, "%.3f s", seconds);
    return buf;
}

}  // namespace earmark
