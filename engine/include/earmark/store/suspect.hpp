// A suspect: an automatic flag raised by the scan on a span of a take, with the
// measure that raised it. A suspect is a hint; a mark is a person's verdict.
#pragma once

#include "earmark/marks/mark.hpp"

#include <cstdint>
#include <string>

namespace earmark {

struct Suspect {
    std::int64_t id = 0;       // assigned by the session; ignored when writing
    TakeId takeId = 0;         // assigned by the session; ignored when writing
    std::string name;          // what was measured, e.g. "f0_range_st"
    double value = 0.0;        // the measured value
    double threshold = 0.0;    // the limit it crossed
    double startSeconds = 0.0; // span of the take it applies to
    double endSeconds = 0.0;   // >= startSeconds
    std::string reason;        // one sentence for people, UTF-8
    bool operator==(const Suspect&) const = default;
};

}  // namespace earmark
