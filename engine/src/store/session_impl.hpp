// Private state of a Session and row readers shared by its source files.
#pragma once

#include "earmark/store/session.hpp"
#include "db.hpp"

#include <filesystem>
#include <map>
#include <string>

namespace earmark {

struct Session::Impl {
    store::Db db;
    std::filesystem::path folder;  // absolute folder of the session file (audio paths are relative to it)
    bool readOnly = false;
    std::string rater;  // Session::setRater
    // History entries this Session recorded, by id: changesElsewhereSince
    // leaves them out. Kept whole, so an id that a rolled-back transaction
    // used and another connection's entry took over is not mistaken for ours.
    std::map<std::int64_t, HistoryEntry> recordedHere;

    // Appends a row to the review history (inside the caller's transaction).
    void record(TakeId take, std::optional<MarkId> mark, HistoryAction action, const std::string& detail);
    // The newest history entry about a mark; empty when none names it.
    std::optional<HistoryEntry> lastChangeOfMark(MarkId mark) const;

    // Throws Error when the session was opened read-only.
    void requireWritable(const std::string& doing) const;
    // Audio path as stored: relative to `folder`, '/'-separated.
    std::string storedAudioPath(const std::string& audioPath) const;
    std::string resolveAudioPath(const std::string& stored) const;

    Take readTake(TakeId id) const;          // InputError when missing
    Mark readMark(MarkId id) const;          // InputError when missing
    std::optional<Mark> findMark(MarkId id) const;
    ReviewStatus readStatus(TakeId id) const;
    void writeStatus(TakeId id, ReviewStatus status);
    std::vector<TierRow> readTiers(TakeId id) const;
    int countMarks(TakeId id) const;
};

// The take columns every reader of the takes table selects, in this order.
inline constexpr const char* kTakeRowColumns =
    "queue_pos, audio_path, line_id, text, build, status, status_utc, duration_s, sample_rate, channels, added_utc";

// A take from those columns of `st`, starting at column `first`; `id` and
// the mark count are the caller's. Throws InputError(dbPath) for a status
// this version does not know.
Take takeFromColumns(const store::Statement& st, int first, TakeId id, const std::string& dbPath);

}  // namespace earmark
