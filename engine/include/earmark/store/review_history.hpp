// Who changed what in a session, and when: one row per change made through
// Session (marks, review statuses, tiers), with the rater the Session acted
// for (Session::setRater). Rows are only ever added.
#pragma once

#include "earmark/marks/mark.hpp"

#include <optional>
#include <string>
#include <string_view>

namespace earmark {

enum class HistoryAction { MarkAdded, MarkChanged, MarkDeleted, Status, Tiers };

// "mark-added", "mark-changed", "mark-deleted", "status", "tiers" (stored in the file).
std::string_view historyActionName(HistoryAction action);
std::optional<HistoryAction> parseHistoryAction(std::string_view name);

struct HistoryEntry {
    std::int64_t id = 0;      // increasing in the order the changes were committed
    std::string atUtc;        // ISO 8601 UTC with milliseconds
    std::string rater;        // "" when the change was made without a rater name
    TakeId takeId = 0;
    std::optional<MarkId> markId;  // for mark actions
    HistoryAction action = HistoryAction::Status;
    // What changed, in words: the new status ("clean"); the mark's kind and
    // span ("timing/rushed 1.200-1.500 s"); the tier intervals ("12 intervals").
    std::string detail;
    bool operator==(const HistoryEntry&) const = default;
};

// A take given to a rater to review (earmark/agreement/assignment.hpp draws them).
struct Assignment {
    TakeId takeId = 0;
    std::string rater;
    bool operator==(const Assignment&) const = default;
};

}  // namespace earmark
