// Creating and opening session files: checks that the file is a session this
// build can read, upgrades older schemas and sets the connection up.
#include "pg_connect.hpp"
#include "schema.hpp"
#include "session_impl.hpp"
#include "earmark/store/session_address.hpp"
#include "earmark/store/utc_clock.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/staging.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using store::Db;

static_assert(Session::kBusyTimeoutMs == store::kBusyTimeoutMs);

// An SQLite 3 file starts with these 16 bytes ("SQLite format 3" and a NUL).
bool hasSqliteHeader(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    char header[16] = {};
    in.read(header, sizeof header);
    return in.gcount() == 16 && std::memcmp(header, "SQLite format 3", 16) == 0;
}

void checkExistingFile(const std::string& path) {
    std::error_code ec;
    if (!fs::exists(path, ec)) throw InputError(path, "file not found");
    if (fs::is_directory(path, ec)) throw InputError(path, "is a folder, not an Earmark session");
    if (::access(path.c_str(), R_OK) != 0)
        throw InputError(path, std::string("cannot be read: ") + std::strerror(errno));
    if (fs::file_size(path, ec) == 0) throw InputError(path, "is empty, not an Earmark session");
    if (!hasSqliteHeader(path))
        throw InputError(path, "is not an Earmark session (not an SQLite database)");
}

// "file:" URI of a path, percent-encoding every byte but unreserved ones and '/'.
std::string fileUri(const std::string& path) {
    std::string uri = "file:";
    for (unsigned char c : fs::absolute(path).string()) {
        const bool plain = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') ||
                           c == '/' || c == '-' || c == '.' || c == '_' || c == '~';
        if (plain) {
            uri += static_cast<char>(c);
        } else {
            char hex[4];
            std::snprintf(hex, sizeof hex, "%%%02X", c);
            uri += hex;
        }
    }
    return uri;
}

enum class Access { ReadWrite, ReadOnly, Immutable };

// `shownAs` is the name messages use (the file being made, for a staging file).
Db openConnection(const std::string& path, Access access, const std::string& shownAs = {}) {
    sqlite3* raw = nullptr;
    int flags = SQLITE_OPEN_NOMUTEX;
    flags |= access == Access::ReadWrite ? SQLITE_OPEN_READWRITE : SQLITE_OPEN_READONLY;
    // Immutable: SQLite reads the file without -shm or locks, which a WAL file
    // in a read-only folder needs (nobody can create its -shm there).
    const std::string name = access == Access::Immutable ? fileUri(path) + "?immutable=1" : path;
    if (access == Access::Immutable) flags |= SQLITE_OPEN_URI;
    const int rc = sqlite3_open_v2(name.c_str(), &raw, flags, nullptr);
    Db db{store::DbHandle(raw), {}, shownAs.empty() ? path : shownAs};
    if (rc != SQLITE_OK) store::throwSqlite(db, rc, "opening the session");
    sqlite3_extended_result_codes(raw, 1);
    sqlite3_busy_timeout(raw, store::kBusyTimeoutMs);
    return db;
}

// WAL: readers and one writer work at the same time, and a crash leaves the
// file consistent. synchronous=FULL: the WAL is fsync'ed at every commit, so
// a committed mark survives a power cut too, not only a program crash (with
// NORMAL the last commits may roll back after a power cut). Marks are made at
// human pace, so one fsync per change costs nothing anyone notices.
void configureWritable(const Db& db) {
    store::Statement mode(db, "PRAGMA journal_mode = WAL", "switching the session to WAL mode");
    if (!mode.step() || mode.text(0) != "wal")
        throw WriteError(db.path, "cannot use write-ahead logging here (network or read-only file system?)");
    store::exec(db, "PRAGMA synchronous = FULL; PRAGMA foreign_keys = ON;", "setting up the session");
}

// SQLite's quick check (the b-trees and records, without comparing indexes to
// their tables; linear in the file's size): "ok" or its first problem.
std::string quickCheck(const Db& db) {
    store::Statement st(db, "PRAGMA quick_check(1)", "checking the session");
    std::string problem = st.step() ? st.text(0) : std::string("no answer from the check");
    // One line for messages: "*** in database main ***\nOn tree page 11 …" → "on tree page 11 …".
    const std::string heading = "*** in database main ***\n";
    if (problem.rfind(heading, 0) == 0) problem.erase(0, heading.size());
    for (char& c : problem)
        if (c == '\n' || c == '\r') c = ' ';
    return problem;
}

void removeSessionFiles(const std::string& path) {
    std::error_code ec;
    for (const char* suffix : {"", "-wal", "-shm", "-journal"}) fs::remove(path + suffix, ec);
}

void recordCreation(const Db& db) {
    store::Statement info(db, "INSERT INTO session_info (key, value) VALUES ('created_utc', ?1)",
                          "creating the session");
    info.bind(1, store::utcNowIso8601()).run();
}

// Creates the file exclusively (so an existing file is never taken over) and
// migrates it to `version`. On failure nothing is left behind.
Db createFile(const std::string& path, int version, const std::string& shownAs = {}) {
    const std::string& name = shownAs.empty() ? path : shownAs;
    const fs::path folder = fs::absolute(path).parent_path();
    std::error_code ec;
    if (!fs::is_directory(folder, ec))
        throw WriteError(name, "cannot be created: folder " + folder.string() + " does not exist");
    const int fd = ::open(path.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0666);
    if (fd < 0) {
        if (errno == EEXIST) throw InputError(name, "already exists; choose another name or remove it first");
        throw WriteError(name, std::string("cannot be created: ") + std::strerror(errno));
    }
    ::close(fd);
    try {
        Db db = openConnection(path, Access::ReadWrite, shownAs);
        configureWritable(db);
        store::migrate(db, version);
        recordCreation(db);
        return db;
    } catch (...) {
        removeSessionFiles(path);
        throw;
    }
}

// A session in an empty PostgreSQL database (its schema and first row in
// one transaction: DDL is transactional there, so a failure leaves nothing).
// `fill` runs inside that transaction too.
Db createOnServer(const std::string& uri, int version, const std::function<void(const Db&)>& fill = {}) {
    Db db = store::connectPostgres(uri);
    store::WriteTransaction tx(db, "creating the session");
    if (store::userVersion(db) != 0)
        throw InputError(db.path, "already holds an Earmark session; choose another database or remove it first");
    store::migrate(db, version);  // nested: joins this transaction
    recordCreation(db);
    if (fill) fill(db);
    tx.commit();
    return db;
}

// Audio paths of a server session are stored absolute (it has no folder of its own).
std::unique_ptr<Session::Impl> serverImpl(Db db) {
    auto impl = std::make_unique<Session::Impl>();
    impl->db = std::move(db);
    return impl;
}

}  // namespace

Session::Session(std::unique_ptr<Impl> impl) : impl_(std::move(impl)) {}
Session::Session(Session&&) noexcept = default;
Session& Session::operator=(Session&&) noexcept = default;
Session::~Session() = default;

Session Session::create(const std::string& path) {
    if (isServerSession(path)) return Session(serverImpl(createOnServer(path, kSchemaVersion)));
    auto impl = std::make_unique<Impl>();
    impl->db = createFile(path, kSchemaVersion);
    impl->folder = fs::absolute(path).parent_path().lexically_normal();
    return Session(std::move(impl));
}

void Session::createWhole(const std::string& path, const std::function<void(Session&)>& fill) {
    if (isServerSession(path)) {
        // One transaction: the session appears whole or not at all.
        Db db = store::connectPostgres(path);
        Session session(serverImpl(std::move(db)));
        session.inOneTransaction("creating the session", [&] {
            const Db& conn = session.impl_->db;
            if (store::userVersion(conn) != 0)
                throw InputError(conn.path,
                                 "already holds an Earmark session; choose another database or remove it first");
            store::migrate(conn, kSchemaVersion);
            recordCreation(conn);
            fill(session);
        });
        return;
    }
    const fs::path target = fs::absolute(path).lexically_normal();
    std::error_code ec;
    if (fs::exists(target, ec)) throw InputError(path, "already exists; choose another name or remove it first");
    const fs::path folder = target.parent_path();
    std::string leftoverPrefix = ".";
    leftoverPrefix.append(target.filename().string()).append(".");
    for (const fs::path& stale : staleStaging(folder, "new"))
        if (stale.filename().string().rfind(leftoverPrefix, 0) == 0) fs::remove(stale, ec);
    const fs::path temp = stagingPath(target, "new");
    removeSessionFiles(temp.string());
    try {
        {
            auto impl = std::make_unique<Impl>();
            impl->db = createFile(temp.string(), kSchemaVersion, path);  // messages name `path`
            impl->folder = folder;
            Session session(std::move(impl));
            fill(session);
        }  // closed: SQLite folds the write-ahead log into the file and removes it
        if (fs::exists(temp.string() + "-wal", ec))
            throw WriteError(path, "could not be finished (its write-ahead log was not folded back; disk full?); "
                                   "nothing was created");
        if (!moveIntoPlaceNoReplace(temp, target))
            throw InputError(path, "was created by another program meanwhile; nothing was changed");
    } catch (...) {
        removeSessionFiles(temp.string());
        throw;
    }
    syncFolder(folder);
}

Session Session::openOnServer(const std::string& uri, OpenMode mode) {
    auto impl = serverImpl(store::connectPostgres(uri));
    impl->readOnly = mode == OpenMode::ReadOnly;
    const Db& db = impl->db;
    const int version = store::userVersion(db);
    if (version == 0 || store::applicationId(db) != store::kApplicationId)
        throw InputError(db.path, "is not an Earmark session (this database holds no Earmark schema)");
    if (version > kSchemaVersion)
        throw InputError(db.path, "was written by a newer Earmark (session schema " + std::to_string(version) +
                                      "; this version reads up to " + std::to_string(kSchemaVersion) +
                                      "). It was not changed; open it with a newer Earmark");
    if (impl->readOnly) {
        if (version < kSchemaVersion)
            throw InputError(db.path, "uses the older session schema " + std::to_string(version) +
                                          "; open it once for writing to upgrade it");
        store::exec(db, "SET default_transaction_read_only = on", "opening the session");
    } else if (version < kSchemaVersion) {
        store::migrate(db, kSchemaVersion);
    }
    return Session(std::move(impl));
}

bool Session::exists(const std::string& address) {
    if (!isServerSession(address)) {
        std::error_code ec;
        return fs::exists(address, ec);
    }
    const Db db = store::connectPostgres(address);
    return store::userVersion(db) != 0;
}

Session Session::open(const std::string& path, OpenMode mode) {
    if (isServerSession(path)) return openOnServer(path, mode);
    checkExistingFile(path);
    const bool readOnly = mode == OpenMode::ReadOnly;
    const fs::path folder = fs::absolute(path).parent_path().lexically_normal();
    if (!readOnly) {
        // Checked before SQLite sees the file, so nothing is created or changed.
        if (::access(path.c_str(), W_OK) != 0)
            throw WriteError(path, std::string("is read-only (") + std::strerror(errno) +
                                  "); nothing was changed. Copy it somewhere writable to edit it");
        if (::access(folder.c_str(), W_OK | X_OK) != 0)
            throw WriteError(path, "is in a read-only folder (" + std::string(std::strerror(errno)) +
                                  "); SQLite needs to write its -wal and -shm files beside it. "
                                  "Nothing was changed");
    }
    // A read-only session in a writable place still gets a read-write
    // connection (held to query_only below): as the last connection to close,
    // it can then remove the -wal and -shm files instead of leaving them.
    // A read-only place without a -wal file: every committed change is in the
    // file itself, and SQLite cannot create the -shm file it would need
    // there, so the file is read as immutable.
    const bool writablePlace = ::access(path.c_str(), W_OK) == 0 && ::access(folder.c_str(), W_OK | X_OK) == 0;
    std::error_code ec;
    Access access = Access::ReadWrite;
    if (readOnly && !writablePlace) access = fs::exists(path + "-wal", ec) ? Access::ReadOnly : Access::Immutable;
    auto impl = std::make_unique<Impl>();
    impl->db = openConnection(path, access);
    impl->folder = folder;
    impl->readOnly = readOnly;
    const Db& db = impl->db;

    if (store::applicationId(db) != store::kApplicationId)
        throw InputError(path, "is an SQLite database but not an Earmark session");
    const int version = store::userVersion(db);
    if (version > kSchemaVersion)
        throw InputError(path, "was written by a newer Earmark (session schema " + std::to_string(version) +
                                   "; this version reads up to " + std::to_string(kSchemaVersion) +
                                   "). It was not changed; open it with a newer Earmark");
    if (version < 1) throw InputError(path, "is not an Earmark session (no schema version)");
    if (readOnly) {
        if (version < kSchemaVersion)
            throw InputError(path, "uses the older session schema " + std::to_string(version) +
                                       "; open it once for writing to upgrade it");
        store::exec(db, "PRAGMA query_only = ON", "opening the session");
    } else {
        // A write into a damaged file may land in a page nobody can read back
        // (a mark "added" that can never be listed): refuse before writing.
        const std::string check = quickCheck(db);
        if (check != "ok")
            throw InputError(path, "is damaged (" + check + "); nothing was written. " + store::kSalvageHint);
        configureWritable(db);
        if (version < kSchemaVersion) store::migrate(db, kSchemaVersion);
    }
    return Session(std::move(impl));
}

const std::string& Session::path() const { return impl_->db.path; }

void Session::inOneTransaction(const std::string& doing, const std::function<void()>& change) {
    store::WriteTransaction tx(impl_->db, doing);
    change();
    tx.commit();
}
bool Session::readOnly() const { return impl_->readOnly; }

std::string Session::integrityCheck() const {
    if (impl_->db.postgres()) {
        // The server keeps its own pages consistent; what can be wrong here is the schema.
        const int version = store::userVersion(impl_->db);
        return version == kSchemaVersion ? "ok"
                                         : "session schema " + std::to_string(version) + ", expected " +
                                               std::to_string(kSchemaVersion);
    }
    store::Statement st(impl_->db, "PRAGMA integrity_check", "checking the session");
    std::string result;
    while (st.step()) {
        if (!result.empty()) result += '\n';
        result += st.text(0);
    }
    return result;
}

void createSessionAtSchemaVersion(const std::string& path, int version) {
    if (version < 1 || version > Session::kSchemaVersion)
        throw ParamError("createSessionAtSchemaVersion.version",
                         "must be 1 to " + std::to_string(Session::kSchemaVersion));
    if (isServerSession(path)) createOnServer(path, version);
    else createFile(path, version);
}

void Session::Impl::requireWritable(const std::string& doing) const {
    if (readOnly) throw Error(db.path, "is open read-only; cannot " + doing);
}

}  // namespace earmark
