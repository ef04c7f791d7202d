// A mark: one defect a person pinned on a time span of a take (DESIGN.md).
//
// Times are seconds from the start of the take. The measure snapshot is a
// flat name → number object (e.g. "f0_mean_hz": 142.5) taken when the mark was
// made, so a defect list still shows what the rater saw after the analysis
// code changes; its names are listed in docs/defect-list.md.
#pragma once

#include "earmark/marks/mark_kinds.hpp"

#include <cstdint>
#include <map>
#include <string>

namespace earmark {

using TakeId = std::int64_t;  // a take's row id in a session; stable for the session's life
using MarkId = std::int64_t;  // a mark's row id; stable, never reused within one session

// Measure name → value. Only finite values; a measure that is undefined for
// the span (F0 of an unvoiced span) is left out rather than stored as NaN.
using MeasureSnapshot = std::map<std::string, double>;

// What the person decides: everything about a mark except its identity and times of change.
struct MarkDraft {
    MarkCategory category = MarkCategory::Other;
    std::string subtype;              // one of subtypesOf(category), or "" for none
    Severity severity = Severity::Minor;
    double startSeconds = 0.0;        // span start, >= 0
    double endSeconds = 0.0;          // span end, > startSeconds, <= the take's duration
    std::string words;                // words covered by the span, space-separated ("" = unknown)
    std::string note;                 // free text, UTF-8, at most kMaxNoteBytes
    std::string rater;                // who made the mark, UTF-8, at most kMaxRaterBytes
    MeasureSnapshot measures;

    static constexpr std::size_t kMaxNoteBytes = 16384;
    static constexpr std::size_t kMaxRaterBytes = 200;
    static constexpr std::size_t kMaxWordsBytes = 4096;
    // Slack when comparing the end with the take's duration: half a sample at
    // 1 kHz, so rounding a duration to a sample count never rejects a mark
    // that ends "at the end of the take".
    static constexpr double kEndToleranceSeconds = 0.0005;

    // Checks every field against the rules above for a take of the given
    // duration (seconds). Throws ParamError whose subject names the field
    // ("Mark.endSeconds", "Mark.note", …) and whose problem quotes the value.
    void validate(double takeDurationSeconds) const;

    bool operator==(const MarkDraft&) const = default;
};

struct Mark : MarkDraft {
    MarkId id = 0;
    TakeId takeId = 0;
    std::string createdUtc;  // ISO 8601 UTC with milliseconds, "2025-03-01T09:30:12.345Z"
    std::string updatedUtc;  // same format; equals createdUtc until the mark is edited

    const MarkDraft& draft() const { return *this; }
    bool operator==(const Mark&) const = default;
};

}  // namespace earmark
