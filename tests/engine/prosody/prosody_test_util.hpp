// Shared by the prosody tests: the frame step of their synthetic tracks and
// a short way to write an interval.
#pragma once

#include "earmark/tiers/tier.hpp"

#include <string>
#include <utility>

namespace earmark::test {

constexpr double kProsodyHop = 0.005;

inline Interval iv(double a, double b, std::string label) {
    Interval i;
    i.startS = a;
    i.endS = b;
    i.label = std::move(label);
    return i;
}

}  // namespace earmark::test
