// A take as a session stores it: its audio file, script text, voice build,
// place in the queue and review status, plus its tiers as plain rows.
#pragma once

#include "earmark/marks/mark.hpp"

#include <optional>
#include <string>
#include <string_view>

namespace earmark {

// Where a take stands in the review of the queue.
enum class ReviewStatus { Unreviewed, InReview, Clean, HasMarks, Skipped };

// "unreviewed", "in-review", "clean", "has-marks", "skipped" (stored in the file).
std::string_view reviewStatusName(ReviewStatus status);
std::optional<ReviewStatus> parseReviewStatus(std::string_view name);
std::string reviewStatusNameList();

// One interval of one tier (e.g. tier "words", 0.42–0.77 s, "ferry"). Kept as
// rows so the store does not depend on any timing-file format; the word tier
// is the one named "words" (or "word").
struct TierRow {
    std::string tier;
    double startSeconds = 0.0;
    double endSeconds = 0.0;
    std::string label;
    bool operator==(const TierRow&) const = default;
};

// What Session::addTakes needs to add a take.
struct NewTake {
    std::string audioPath;  // as the caller sees it (absolute, or relative to the working folder)
    std::string lineId;     // the script line's id, e.g. "ferry-003" ("" = none)
    std::string text;       // the script line as intended, UTF-8
    std::string build;      // free label of the voice build / recording, UTF-8
};

struct Take {
    TakeId id = 0;
    int queuePosition = 0;          // 0-based place in the queue
    std::string storedAudioPath;    // as stored: relative to the session file's folder, '/'-separated
    std::string audioPath;          // resolved against the session file's folder (use this to open it)
    std::string lineId;
    std::string text;
    std::string build;
    ReviewStatus status = ReviewStatus::Unreviewed;
    std::string statusUtc;          // when the status last changed ("" = never)
    std::string statusRater;        // who last set it ("" = unknown)
    double durationSeconds = 0.0;   // probed when the take was added or relocated
    double sampleRate = 0.0;        // Hz, of the file
    int channels = 0;
    std::string addedUtc;
    int markCount = 0;
};

}  // namespace earmark
