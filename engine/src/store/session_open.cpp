// Creating and opening session files: checks that the file is a session this
// build can read, upgrades older schemas and sets the connection up.
#include "schema.hpp"
#include "session_impl.hpp"
#include "earmark/store/utc_clock.hpp"

#include "earmark/core/error.hpp"

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

Db openConnection(const std::string& path, Access access) {
    sqlite3* raw = nullptr;
    int flags = SQLITE_OPEN_NOMUTEX;
    flags |= access == Access::ReadWrite ? SQLITE_OPEN_READWRITE : SQLITE_OPEN_READONLY;
    // Immutable: SQLite reads the file without -shm or locks, which a WAL file
    // in a read-only folder needs (nobody can create its -shm there).
    const std::string name = access == Access::Immutable ? fileUri(path) + "?immutable=1" : path;
    if (access == Access::Immutable) flags |= SQLITE_OPEN_URI;
    const int rc = sqlite3_open_v2(name.c_str(), &raw, flags, nullptr);
    Db db{store::DbHandle(raw), path};
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
        throw Error(db.path, "cannot use write-ahead logging here (network or read-only file system?)");
    store::exec(db, "PRAGMA synchronous = FULL; PRAGMA foreign_keys = ON;", "setting up the session");
}

void removeSessionFiles(const std::string& path) {
    std::error_code ec;
    for (const char* suffix : {"", "-wal", "-shm", "-journal"}) fs::remove(path + suffix, ec);
}

// Creates the file exclusively (so an existing file is never taken over) and
// migrates it to `version`. On failure nothing is left behind.
Db createFile(const std::string& path, int version) {
    const fs::path folder = fs::absolute(path).parent_path();
    std::error_code ec;
    if (!fs::is_directory(folder, ec))
        throw Error(path, "cannot be created: folder " + folder.string() + " does not exist");
    const int fd = ::open(path.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0666);
    if (fd < 0) {
        if (errno == EEXIST) throw InputError(path, "already exists; choose another name or remove it first");
        throw Error(path, std::string("cannot be created: ") + std::strerror(errno));
    }
    ::close(fd);
    try {
        Db db = openConnection(path, Access::ReadWrite);
        configureWritable(db);
        store::migrate(db, version);
        store::Statement info(db, "INSERT INTO session_info (key, value) VALUES ('created_utc', ?1)",
                              "creating the session");
        info.bind(1, store::utcNowIso8601()).run();
        return db;
    } catch (...) {
        removeSessionFiles(path);
        throw;
    }
}

}  // namespace

Session::Session(std::unique_ptr<Impl> impl) : impl_(std::move(impl)) {}
Session::Session(Session&&) noexcept = default;
Session& Session::operator=(Session&&) noexcept = default;
Session::~Session() = default;

Session Session::create(const std::string& path) {
    auto impl = std::make_unique<Impl>();
    impl->db = createFile(path, kSchemaVersion);
    impl->folder = fs::absolute(path).parent_path().lexically_normal();
    return Session(std::move(impl));
}

Session Session::open(const std::string& path, OpenMode mode) {
    checkExistingFile(path);
    const bool readOnly = mode == OpenMode::ReadOnly;
    const fs::path folder = fs::absolute(path).parent_path().lexically_normal();
    if (!readOnly) {
        // Checked before SQLite sees the file, so nothing is created or changed.
        if (::access(path.c_str(), W_OK) != 0)
            throw Error(path, std::string("is read-only (") + std::strerror(errno) +
                                  "); nothing was changed. Copy it somewhere writable to edit it");
        if (::access(folder.c_str(), W_OK | X_OK) != 0)
            throw Error(path, "is in a read-only folder (" + std::string(std::strerror(errno)) +
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
        configureWritable(db);
        if (version < kSchemaVersion) store::migrate(db, kSchemaVersion);
    }
    return Session(std::move(impl));
}

const std::string& Session::path() const { return impl_->db.path; }
bool Session::readOnly() const { return impl_->readOnly; }

std::string Session::integrityCheck() const {
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
    createFile(path, version);
}

void Session::Impl::requireWritable(const std::string& doing) const {
    if (readOnly) throw Error(db.path, "is open read-only; cannot " + doing);
}

}  // namespace earmark
