#include "sqlite_db.hpp"

#include "earmark/core/error.hpp"

namespace earmark::store {

void throwSqlite(const Db& db, int rc, const std::string& doing) {
    const std::string detail = db.get() ? sqlite3_errmsg(db.get()) : sqlite3_errstr(rc);
    const std::string unchanged = "; nothing was changed";
    switch (rc & 0xFF) {
    case SQLITE_FULL:
        throw WriteError(db.path, "disk full while " + doing + unchanged);
    case SQLITE_IOERR:
        throw WriteError(db.path, "could not be written while " + doing + " (" + detail +
                                 "; disk full or failing?)" + unchanged);
    case SQLITE_READONLY:
        throw WriteError(db.path, "is read-only (file, folder or open mode) while " + doing + unchanged);
    case SQLITE_BUSY:
    case SQLITE_LOCKED:
        throw WriteError(db.path, "is locked by another program (waited " +
                                 std::to_string(kBusyTimeoutMs / 1000) + " s) while " + doing + "; try again" + unchanged);
    case SQLITE_NOTADB:
        throw InputError(db.path, "is not an Earmark session (not an SQLite database)");
    case SQLITE_CORRUPT:
        throw InputError(db.path, "is damaged (" + detail + ") while " + doing + ". " + kSalvageHint);
    case SQLITE_CANTOPEN:
        throw InputError(db.path, "cannot be opened (" + detail + ")");
    case SQLITE_CONSTRAINT:
        throw Error(db.path, "refused an inconsistent change while " + doing + " (" + detail + ")" +
                                 unchanged);
    default:
        throw Error(db.path, "SQLite error while " + doing + ": " + detail);
    }
}

void exec(const Db& db, const char* sql, const std::string& doing) {
    char* message = nullptr;
    const int rc = sqlite3_exec(db.get(), sql, nullptr, nullptr, &message);
    sqlite3_free(message);  // sqlite3_errmsg still holds the same text
    if (rc != SQLITE_OK) throwSqlite(db, rc, doing);
}

Statement::Statement(const Db& db, std::string_view sql, std::string doing)
    : db_(db), doing_(std::move(doing)) {
    const int rc = sqlite3_prepare_v2(db.get(), sql.data(), static_cast<int>(sql.size()), &stmt_, nullptr);
    if (rc != SQLITE_OK) throwSqlite(db_, rc, doing_);
}

Statement::~Statement() { sqlite3_finalize(stmt_); }

Statement& Statement::bind(int index, std::int64_t value) {
    const int rc = sqlite3_bind_int64(stmt_, index, value);
    if (rc != SQLITE_OK) throwSqlite(db_, rc, doing_);
    return *this;
}

Statement& Statement::bind(int index, double value) {
    const int rc = sqlite3_bind_double(stmt_, index, value);
    if (rc != SQLITE_OK) throwSqlite(db_, rc, doing_);
    return *this;
}

Statement& Statement::bind(int index, std::string_view text) {
    const int rc = sqlite3_bind_text64(stmt_, index, text.data(), text.size(), SQLITE_TRANSIENT, SQLITE_UTF8);
    if (rc != SQLITE_OK) throwSqlite(db_, rc, doing_);
    return *this;
}

bool Statement::step() {
    const int rc = sqlite3_step(stmt_);
    if (rc == SQLITE_ROW) return true;
    if (rc == SQLITE_DONE) return false;
    throwSqlite(db_, rc, doing_);
}

void Statement::run() {
    while (step()) {
    }
}

void Statement::reset() {
    sqlite3_reset(stmt_);
    sqlite3_clear_bindings(stmt_);
}

std::int64_t Statement::integer(int column) const { return sqlite3_column_int64(stmt_, column); }
double Statement::real(int column) const { return sqlite3_column_double(stmt_, column); }

std::string Statement::text(int column) const {
    const auto* p = reinterpret_cast<const char*>(sqlite3_column_text(stmt_, column));
    const int n = sqlite3_column_bytes(stmt_, column);
    return p ? std::string(p, static_cast<std::size_t>(n)) : std::string();
}

WriteTransaction::WriteTransaction(const Db& db, std::string doing)
    : db_(db), doing_(std::move(doing)), nested_(sqlite3_get_autocommit(db.get()) == 0) {
    exec(db_, nested_ ? "SAVEPOINT earmark_step" : "BEGIN IMMEDIATE", doing_);
    open_ = true;
}

WriteTransaction::~WriteTransaction() {
    if (!open_) return;
    if (nested_)
        sqlite3_exec(db_.get(), "ROLLBACK TO earmark_step; RELEASE earmark_step", nullptr, nullptr, nullptr);
    else
        sqlite3_exec(db_.get(), "ROLLBACK", nullptr, nullptr, nullptr);
}

void WriteTransaction::commit() {
    exec(db_, nested_ ? "RELEASE earmark_step" : "COMMIT", doing_);
    open_ = false;
}

ReadTransaction::ReadTransaction(const Db& db) : db_(db) {
    if (sqlite3_get_autocommit(db.get()) == 0) return;  // inside a transaction: already one snapshot
    exec(db_, "BEGIN", "reading");
    open_ = true;
}

ReadTransaction::~ReadTransaction() {
    if (open_) sqlite3_exec(db_.get(), "COMMIT", nullptr, nullptr, nullptr);
}

}  // namespace earmark::store
