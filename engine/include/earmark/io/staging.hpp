// Outputs built whole under a hidden name beside their target and moved into
// place at the end, so a failed, cancelled or killed command leaves either
// the old output or the new one, never half of one. A staging name carries
// the id of the process that made it (".NAME.KIND-PID"), so a later command
// can tell the leftovers of a killed process from the work of a running one.
//
// Errors: WriteError naming the target when a move fails. Thread-safety: the
// functions touch only the paths given; they are safe to call from any thread.
#pragma once

#include <filesystem>
#include <string_view>
#include <vector>

namespace earmark {

// The hidden sibling ".NAME.KIND-PID" of `target` for this process, e.g.
// ".bundle.partial-1234" for target "bundle" and kind "partial".
std::filesystem::path stagingPath(const std::filesystem::path& target, std::string_view kind);

// Entries of `folder` named ".ANYTHING.KIND-PID" (optionally followed by
// "-SUFFIX", e.g. SQLite's "-wal") whose process no longer runs on this
// machine. A process that runs, or that cannot be asked (another user's),
// counts as running.
std::vector<std::filesystem::path> staleStaging(const std::filesystem::path& folder, std::string_view kind);

// Moves `from` to `to` in one step, refusing (returns false, nothing moved)
// when `to` exists. WriteError for any other failure.
bool moveIntoPlaceNoReplace(const std::filesystem::path& from, const std::filesystem::path& to);

// Swaps `a` and `b` (both exist) in one step. Returns false when the file
// system cannot do that (the caller falls back to two moves); WriteError for
// any other failure.
bool exchangeInPlace(const std::filesystem::path& a, const std::filesystem::path& b);

// Flushes a folder's entries (a finished move) to disk; errors are ignored.
void syncFolder(const std::filesystem::path& folder);

}  // namespace earmark
