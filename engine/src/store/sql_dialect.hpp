// The few places where the store's SQL (written for SQLite) differs on
// PostgreSQL, translated in one place so the schema and queries are written once.
#pragma once

#include <string>
#include <string_view>

namespace earmark::store {

// `?N` and `?` parameters → `$N` (outside quoted text). `count` receives the
// highest parameter number.
std::string postgresParameters(std::string_view sql, int& count);

// A migration step's DDL for PostgreSQL: 64-bit integers and ids handed out
// by an identity column (INTEGER [PRIMARY KEY [AUTOINCREMENT]]), 64-bit
// floating point (REAL is 32-bit there), text compared byte by byte as in
// SQLite (COLLATE "C"), no WITHOUT ROWID, and no PRAGMA lines (the schema
// version lives in the earmark_schema table instead).
std::string postgresSchema(std::string_view sqliteDdl);

}  // namespace earmark::store
