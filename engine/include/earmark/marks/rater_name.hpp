// Who is making a change: the rater name recorded with marks, review
// statuses and tier edits (DESIGN.md: "every mark and rating records its
// rater").
//
// The name is taken from the first of these that is set and not blank:
//   1. the explicit choice (`--rater NAME` on the command line),
//   2. the environment variable EARMARK_RATER,
//   3. the program's settings (the window's "rater" setting; the command
//      line has none),
//   4. the operating system's user name (the password database entry of the
//      effective user id, else $USER, else $LOGNAME).
// Surrounding spaces are trimmed. "" when none is set.
// Thread-safety: reads the environment; do not call while another thread
// changes it.
#pragma once

#include <optional>
#include <string>

namespace earmark {

inline constexpr const char* kRaterEnvironmentVariable = "EARMARK_RATER";

struct RaterSources {
    std::optional<std::string> explicitName{};  // e.g. --rater
    std::optional<std::string> settingsName{};  // the window's stored setting
};

// Throws ParamError (subject "rater") when the chosen name is not valid
// UTF-8, longer than MarkDraft::kMaxRaterBytes or holds control characters.
std::string resolveRaterName(const RaterSources& sources);

// The same checks on a name from anywhere else (ParamError, subject "rater").
void checkRaterName(const std::string& name);

}  // namespace earmark
