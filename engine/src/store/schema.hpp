// The session file's schema: the list of migrations from an empty database
// to Session::kSchemaVersion. Private to the store.
#pragma once

#include "db.hpp"

namespace earmark::store {

// PRAGMA application_id of every session file: "ERMK" read as a big-endian
// 32-bit number, so other programs (and `file`) can tell the file apart
// from other SQLite databases.
inline constexpr int kApplicationId = 0x45524D4B;

int userVersion(const Db& db);
int applicationId(const Db& db);

// Runs the migration steps (from the version found in the file) up to
// `toVersion` in one write transaction, then sets user_version. A file
// already at or past `toVersion` is left as it is.
void migrate(const Db& db, int toVersion);

}  // namespace earmark::store
