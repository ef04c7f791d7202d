// One change to the marks of a session, described completely enough to undo
// and redo it: Session::addMark / updateMark / deleteMark return one, and
// Session::revert(edit) undoes it, Session::apply(edit) redoes it.
#pragma once

#include "earmark/marks/mark.hpp"
#include "earmark/store/take.hpp"

#include <optional>

namespace earmark {

struct MarkEdit {
    std::optional<Mark> before;  // the mark as it was; empty for an add
    std::optional<Mark> after;   // the mark as it is now; empty for a delete
    TakeId takeId = 0;
    // Adding a mark sets the take to has-marks; deleting its last mark sets a
    // has-marks take back to in-review. Both sides are kept for undo.
    ReviewStatus statusBefore = ReviewStatus::Unreviewed;
    ReviewStatus statusAfter = ReviewStatus::Unreviewed;

    MarkId markId() const { return after ? after->id : before ? before->id : 0; }
    // The edit that takes the session back: before and after swapped.
    MarkEdit inverse() const { return {after, before, takeId, statusAfter, statusBefore}; }
};

}  // namespace earmark
