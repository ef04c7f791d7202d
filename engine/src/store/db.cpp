#include "db.hpp"

#include "sql_dialect.hpp"

#include "earmark/core/error.hpp"

#include <libpq-fe.h>

#include <charconv>
#include <cstdlib>

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
    if (db.postgres()) {
        PGresult* r = PQexec(db.pg.get(), sql);
        const auto status = PQresultStatus(r);
        if (status != PGRES_COMMAND_OK && status != PGRES_TUPLES_OK) {
            const std::unique_ptr<PGresult, void (*)(PGresult*)> owned(r, PQclear);
            throwPostgres(db, r, doing);
        }
        PQclear(r);
        return;
    }
    char* message = nullptr;
    const int rc = sqlite3_exec(db.get(), sql, nullptr, nullptr, &message);
    sqlite3_free(message);  // sqlite3_errmsg still holds the same text
    if (rc != SQLITE_OK) throwSqlite(db, rc, doing);
}

Statement::Statement(const Db& db, std::string_view sql, std::string doing)
    : db_(db), doing_(std::move(doing)) {
    if (db.postgres()) {
        int count = 0;
        pgSql_ = postgresParameters(sql, count);
        params_.resize(static_cast<std::size_t>(count));
        return;
    }
    const int rc = sqlite3_prepare_v2(db.get(), sql.data(), static_cast<int>(sql.size()), &stmt_, nullptr);
    if (rc != SQLITE_OK) throwSqlite(db_, rc, doing_);
}

Statement::~Statement() {
    sqlite3_finalize(stmt_);
    PQclear(result_);
}

void Statement::pgBind(int index, std::string value) {
    if (index < 1 || index > static_cast<int>(params_.size()))
        throw Error(db_.path, "internal: parameter " + std::to_string(index) + " out of range while " + doing_);
    params_[static_cast<std::size_t>(index - 1)] = std::move(value);
}

Statement& Statement::bind(int index, std::int64_t value) {
    if (db_.postgres()) {
        pgBind(index, std::to_string(value));
        return *this;
    }
    const int rc = sqlite3_bind_int64(stmt_, index, value);
    if (rc != SQLITE_OK) throwSqlite(db_, rc, doing_);
    return *this;
}

Statement& Statement::bind(int index, double value) {
    if (db_.postgres()) {
        // Shortest text that reads back as the same double (lossless).
        char buf[32];
        const auto end = std::to_chars(buf, buf + sizeof buf, value).ptr;
        pgBind(index, std::string(buf, end));
        return *this;
    }
    const int rc = sqlite3_bind_double(stmt_, index, value);
    if (rc != SQLITE_OK) throwSqlite(db_, rc, doing_);
    return *this;
}

Statement& Statement::bind(int index, std::string_view text) {
    if (db_.postgres()) {
        pgBind(index, std::string(text));
        return *this;
    }
    const int rc = sqlite3_bind_text64(stmt_, index, text.data(), text.size(), SQLITE_TRANSIENT, SQLITE_UTF8);
    if (rc != SQLITE_OK) throwSqlite(db_, rc, doing_);
    return *this;
}

bool Statement::step() {
    if (db_.postgres()) {
        if (!result_) {
            std::vector<const char*> values;
            for (const auto& p : params_) values.push_back(p ? p->c_str() : nullptr);
            result_ = PQexecParams(db_.pg.get(), pgSql_.c_str(), static_cast<int>(values.size()), nullptr,
                                   values.data(), nullptr, nullptr, 0);
            const auto status = PQresultStatus(result_);
            if (status != PGRES_COMMAND_OK && status != PGRES_TUPLES_OK) throwPostgres(db_, result_, doing_);
            row_ = -1;
        }
        return ++row_ < PQntuples(result_);
    }
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
    if (db_.postgres()) {
        PQclear(result_);
        result_ = nullptr;
        for (auto& p : params_) p.reset();
        return;
    }
    sqlite3_reset(stmt_);
    sqlite3_clear_bindings(stmt_);
}

// PostgreSQL values arrive as text; NULL reads as 0 or "" as in SQLite.
const char* Statement::pgValue(int column) const {
    if (!result_ || row_ < 0 || row_ >= PQntuples(result_) || column >= PQnfields(result_) ||
        PQgetisnull(result_, row_, column))
        return nullptr;
    return PQgetvalue(result_, row_, column);
}

bool Statement::isNull(int column) const {
    if (!db_.postgres()) return sqlite3_column_type(stmt_, column) == SQLITE_NULL;
    return pgValue(column) == nullptr;
}

std::int64_t Statement::integer(int column) const {
    if (!db_.postgres()) return sqlite3_column_int64(stmt_, column);
    const char* v = pgValue(column);
    if (!v) return 0;
    if (v[0] == 't' && v[1] == 0) return 1;  // boolean results (x IS NULL, a = b)
    if (v[0] == 'f' && v[1] == 0) return 0;
    return std::strtoll(v, nullptr, 10);
}

double Statement::real(int column) const {
    if (!db_.postgres()) return sqlite3_column_double(stmt_, column);
    const char* v = pgValue(column);
    return v ? std::strtod(v, nullptr) : 0.0;
}

std::string Statement::text(int column) const {
    if (db_.postgres()) {
        const char* v = pgValue(column);
        return v ? std::string(v, static_cast<std::size_t>(PQgetlength(result_, row_, column))) : std::string();
    }
    const auto* p = reinterpret_cast<const char*>(sqlite3_column_text(stmt_, column));
    const int n = sqlite3_column_bytes(stmt_, column);
    return p ? std::string(p, static_cast<std::size_t>(n)) : std::string();
}

bool Db::inTransaction() const {
    if (postgres()) return PQtransactionStatus(pg.get()) != PQTRANS_IDLE;
    return sqlite3_get_autocommit(get()) == 0;
}

std::int64_t Db::lastInsertId() const {
    if (!postgres()) return sqlite3_last_insert_rowid(get());
    Statement st(*this, "SELECT lastval()", "reading the new row's id");
    return st.step() ? st.integer(0) : 0;
}

namespace {
// Best effort, for destructors: a failure here leaves the transaction to the server or SQLite.
void quietly(const Db& db, const char* sql) {
    if (db.postgres()) PQclear(PQexec(db.pg.get(), sql));
    else sqlite3_exec(db.get(), sql, nullptr, nullptr, nullptr);
}
}  // namespace

WriteTransaction::WriteTransaction(const Db& db, std::string doing)
    : db_(db), doing_(std::move(doing)), nested_(db.inTransaction()) {
    if (nested_) {
        exec(db_, "SAVEPOINT earmark_step", doing_);
    } else if (db_.postgres()) {
        exec(db_, "BEGIN", doing_);
        open_ = true;
        // Per schema: several sessions may share one database, one schema each.
        exec(db_,
             ("SELECT pg_advisory_xact_lock(" + std::to_string(kWriteLockKey) + ", hashtext(current_schema()))").c_str(),
             doing_);
    } else {
        exec(db_, "BEGIN IMMEDIATE", doing_);
    }
    open_ = true;
}

WriteTransaction::~WriteTransaction() {
    if (!open_) return;
    quietly(db_, nested_ ? "ROLLBACK TO earmark_step; RELEASE earmark_step" : "ROLLBACK");
}

void WriteTransaction::commit() {
    exec(db_, nested_ ? "RELEASE earmark_step" : "COMMIT", doing_);
    open_ = false;
}

ReadTransaction::ReadTransaction(const Db& db) : db_(db) {
    if (db.inTransaction()) return;  // inside a transaction: already one snapshot
    exec(db_, db.postgres() ? "BEGIN ISOLATION LEVEL REPEATABLE READ" : "BEGIN", "reading");
    open_ = true;
}

ReadTransaction::~ReadTransaction() {
    if (open_) quietly(db_, "COMMIT");
}

}  // namespace earmark::store
