// The session store's one database interface: a connection, statements with
// `?N` parameters, write and read transactions. Two engines sit behind it:
// SQLite (a session file, db_sqlite.cpp) and PostgreSQL (a `postgresql://`
// URI, db_postgres.cpp); the SQL the store writes is SQLite's, and the few
// dialect differences are translated in one place (sql_dialect.hpp). Every
// failure becomes an earmark error naming the session (a URI without its
// password) and saying, in plain words, what could not be done.
#pragma once

#include <sqlite3.h>

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

struct pg_conn;    // libpq's PGconn
struct pg_result;  // libpq's PGresult

namespace earmark::store {

// How long a writer waits for another writer before giving up.
inline constexpr int kBusyTimeoutMs = 5000;

struct DbCloser {
    void operator()(sqlite3* db) const { sqlite3_close_v2(db); }
};
using DbHandle = std::unique_ptr<sqlite3, DbCloser>;
struct PgCloser {
    void operator()(pg_conn* conn) const;
};
using PgHandle = std::unique_ptr<pg_conn, PgCloser>;

// One connection (SQLite or PostgreSQL, exactly one handle set) plus the
// name used in messages: the file path, or the URI without its password.
struct Db {
    DbHandle handle;
    PgHandle pg;
    std::string path;
    sqlite3* get() const { return handle.get(); }
    bool postgres() const { return pg != nullptr; }
    // The id the last INSERT on this connection gave its row.
    std::int64_t lastInsertId() const;
    // True inside BEGIN … COMMIT on this connection.
    bool inTransaction() const;
};

// What a damaged file's messages say to do.
inline constexpr const char* kSalvageHint =
    "Copy what can still be read into a new session with: earmark-cli session salvage FILE NEW-FILE";

// Maps an SQLite result code to InputError / Error with a sentence a person
// can act on ("disk full: … nothing was changed"). `doing` names the action
// ("adding a mark").
[[noreturn]] void throwSqlite(const Db& db, int rc, const std::string& doing);
// The same for a PostgreSQL result (or a connection failure when `result` is null).
[[noreturn]] void throwPostgres(const Db& db, const pg_result* result, const std::string& doing);

// The advisory lock every PostgreSQL write transaction holds: ("ERMK", a hash
// of the session's schema).
inline constexpr std::int64_t kWriteLockKey = 0x45524D4B;

// Runs SQL without results (may hold several statements).
void exec(const Db& db, const char* sql, const std::string& doing);

class Statement {
public:
    Statement(const Db& db, std::string_view sql, std::string doing);
    ~Statement();
    Statement(const Statement&) = delete;
    Statement& operator=(const Statement&) = delete;

    // 1-based parameter index, as in SQLite.
    Statement& bind(int index, std::int64_t value);
    Statement& bind(int index, int value) { return bind(index, static_cast<std::int64_t>(value)); }
    Statement& bind(int index, double value);
    Statement& bind(int index, std::string_view text);

    bool step();  // true when a row is ready; false when done
    void run();   // steps to the end
    void reset();

    // 0-based column index.
    bool isNull(int column) const;
    std::int64_t integer(int column) const;
    double real(int column) const;
    std::string text(int column) const;

private:
    const Db& db_;
    sqlite3_stmt* stmt_ = nullptr;
    std::string doing_;
    // PostgreSQL: the statement runs at the first step() with every parameter
    // as text (unbound ones NULL, as in SQLite); rows are read from its result.
    std::string pgSql_;
    std::vector<std::optional<std::string>> params_;
    pg_result* result_ = nullptr;
    int row_ = -1;
    const char* pgValue(int column) const;
    void pgBind(int index, std::string value);
};

// BEGIN IMMEDIATE: takes the write lock at the start, so two writers queue up
// on the busy timeout instead of failing when a read upgrades to a write.
// PostgreSQL: BEGIN and a transaction-scoped advisory lock (kWriteLockKey),
// the same one-writer-at-a-time rule, so read-then-write steps (the next
// queue position, the version check of an edit) never interleave.
// Rolls back unless commit() was called. Inside a transaction already open
// on the connection (Session::inOneTransaction) it is a SAVEPOINT instead:
// its changes join the outer transaction and land only with it.
class WriteTransaction {
public:
    WriteTransaction(const Db& db, std::string doing);
    ~WriteTransaction();
    WriteTransaction(const WriteTransaction&) = delete;
    WriteTransaction& operator=(const WriteTransaction&) = delete;
    void commit();

private:
    const Db& db_;
    std::string doing_;
    bool open_ = false;
    bool nested_ = false;
};

// A deferred read transaction: several SELECTs see one snapshot (nothing to
// do inside a transaction already open).
class ReadTransaction {
public:
    explicit ReadTransaction(const Db& db);
    ~ReadTransaction();
    ReadTransaction(const ReadTransaction&) = delete;
    ReadTransaction& operator=(const ReadTransaction&) = delete;

private:
    const Db& db_;
    bool open_ = false;
};

}  // namespace earmark::store
