// Private RAII helpers over the SQLite C API for the session store. Every
// failure becomes an earmark error naming the session file and saying, in
// plain words, what could not be done.
#pragma once

#include <sqlite3.h>

#include <cstdint>
#include <memory>
#include <string>
#include <string_view>

namespace earmark::store {

// How long a writer waits for another writer before giving up.
inline constexpr int kBusyTimeoutMs = 5000;

struct DbCloser {
    void operator()(sqlite3* db) const { sqlite3_close_v2(db); }
};
using DbHandle = std::unique_ptr<sqlite3, DbCloser>;

// The connection plus the file name used in messages.
struct Db {
    DbHandle handle;
    std::string path;
    sqlite3* get() const { return handle.get(); }
};

// What a damaged file's messages say to do.
inline constexpr const char* kSalvageHint =
    "Copy what can still be read into a new session with: earmark-cli session salvage FILE NEW-FILE";

// Maps an SQLite result code to InputError / Error with a sentence a person
// can act on ("disk full: … nothing was changed"). `doing` names the action
// ("adding a mark").
[[noreturn]] void throwSqlite(const Db& db, int rc, const std::string& doing);

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
    std::int64_t integer(int column) const;
    double real(int column) const;
    std::string text(int column) const;

private:
    const Db& db_;
    sqlite3_stmt* stmt_ = nullptr;
    std::string doing_;
};

// BEGIN IMMEDIATE: takes the write lock at the start, so two writers queue up
// on the busy timeout instead of failing when a read upgrades to a write.
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
