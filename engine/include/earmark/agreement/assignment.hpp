// Dividing a queue of takes among raters: each take to one rater (a split),
// or a share of the takes to several raters at once (an overlap, so their
// agreement can be measured; docs/agreement.md).
//
// The draw: the takes are put in a seeded random order; the first
// round(overlapFraction · N) of them are shared, the rest go to one rater
// each. Raters are put in a seeded random order too and dealt round-robin,
// one rater per solo take and `ratersPerSharedTake` consecutive raters per
// shared take, so every rater's load is within one take of every other's,
// and a shared take never goes twice to one rater. The random source is
// std::mt19937_64 with our own mapping to ranges, so a seed gives the same
// assignment on every platform.
// Pure function; thread-safe. ParamError naming the field for no raters, a
// blank or repeated rater, a fraction outside [0, 1], or a rater count per
// shared take outside 2 … number of raters.
#pragma once

#include "earmark/store/review_history.hpp"

#include <cstdint>
#include <string>
#include <vector>

namespace earmark::agreement {

struct AssignmentParams {
    std::vector<std::string> raters{};
    double overlapFraction = 0.0;  // share of the takes reviewed by several raters, 0 … 1
    int ratersPerSharedTake = 0;   // raters on each shared take; 0 = all of them
    std::uint64_t seed = 1;
};

// Returns the assignments in the order of `takes`, then by rater name. A
// take listed twice is assigned once.
std::vector<Assignment> assignTakes(const std::vector<TakeId>& takes, const AssignmentParams& params);

}  // namespace earmark::agreement
