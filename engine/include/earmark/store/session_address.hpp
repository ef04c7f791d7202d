// How a session is addressed: a file path (an SQLite session, the default)
// or a PostgreSQL connection URI (a team session on a server,
// docs/team-sessions.md). Pure string functions, thread-safe.
#pragma once

#include <string>

namespace earmark {

// True for "postgresql://…" and "postgres://…" (libpq's URI forms).
bool isServerSession(const std::string& address);

// The address as messages and logs may show it: a URI without the password
// (neither "user:password@" nor a "password=" parameter); a path unchanged.
std::string shownSessionAddress(const std::string& address);

}  // namespace earmark
