// Helpers shared by the session-store tests: short takes on disk, a ready
// mark draft, and running code in a child process (for crashes, other users
// and resource limits).
#pragma once

#include "earmark/io/audio_file.hpp"
#include "earmark/marks/mark.hpp"
#include "earmark/store/session.hpp"
#include "support/pg_test_server.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>
#include <sqlite3.h>
#include <sys/wait.h>
#include <unistd.h>

#include <filesystem>
#include <functional>
#include <string>

namespace earmark::test {

// A 16 kHz mono WAV of `seconds` (a quiet sine), written to `path`.
inline std::string writeTake(const std::string& path, double seconds = 2.0, double rate = 16000) {
    writeWav(path, sine(220.0, seconds, rate, 0.25));
    return path;
}

inline MarkDraft draftAt(double start, double end, MarkCategory category = MarkCategory::Timing,
                         std::string subtype = "rushed") {
    MarkDraft d;
    d.category = category;
    d.subtype = std::move(subtype);
    d.severity = Severity::Major;
    d.startSeconds = start;
    d.endSeconds = end;
    d.note = "note";
    d.rater = "tester";
    d.measures = {{"duration_s", end - start}};
    return d;
}

// Runs SQL on a file with plain SQLite, as another program would.
inline void rawSql(const std::string& path, const char* sql) {
    sqlite3* db = nullptr;
    ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
    char* message = nullptr;
    const int rc = sqlite3_exec(db, sql, nullptr, nullptr, &message);
    EXPECT_EQ(rc, SQLITE_OK) << (message ? message : "");
    sqlite3_free(message);
    sqlite3_close(db);
}

// Where a test's session lives: an SQLite file, or a database on the test
// run's PostgreSQL server.
enum class Backend { File, Server };

inline std::string backendName(const ::testing::TestParamInfo<Backend>& info) {
    return info.param == Backend::File ? "SQLite" : "PostgreSQL";
}

// A new session address: `dir`/`name`, or a new empty database.
inline std::string newSessionAddress(const TempDir& dir, Backend backend, const std::string& name = "s.earmark") {
    if (backend == Backend::File) return dir.file(name);
    PgTestServer* server = PgTestServer::shared(nullptr);
    if (!server) throw std::runtime_error("no PostgreSQL server for this test");
    return server->newDatabase();
}

// Tests run once per backend: TEST_P(OnBothBackends, …) with
// INSTANTIATE_TEST_SUITE_P(…, OnBothBackends, ::testing::Values(Backend::File,
// Backend::Server), backendName). Skipped, with the reason printed, where
// the server binaries are missing.
class OnBothBackends : public ::testing::TestWithParam<Backend> {
protected:
    void SetUp() override {
        std::string why;
        if (GetParam() == Backend::Server && !PgTestServer::shared(&why)) GTEST_SKIP() << why;
    }
};

// A new session with two takes (2 s and 3 s) in a takes/ folder (beside it
// for a file session).
struct TwoTakeSession {
    TempDir dir;
    std::string file;
    Session session;
    TakeId a = 0, b = 0;
    explicit TwoTakeSession(Backend backend = Backend::File)
        : file(newSessionAddress(dir, backend)), session(Session::create(file)) {
        std::filesystem::create_directories(dir.path() / "takes");
        const auto ids = session.addTakes({{writeTake(dir.file("takes/a.wav"), 2.0), "line-a", "Text A.", "b1"},
                                           {writeTake(dir.file("takes/b.wav"), 3.0), "line-b", "Text B?", "b1"}});
        a = ids[0], b = ids[1];
    }
};

struct ChildResult {
    int exitCode = -1;
    std::string output;  // what the child wrote to its pipe
};

// Runs `body` in a forked child that reports through `write(fd, …)` and
// exits with body's return value. The child never returns into the test.
inline ChildResult runInChild(const std::function<int(int fd)>& body) {
    int fds[2];
    if (pipe(fds) != 0) return {};
    const pid_t pid = fork();
    if (pid == 0) {
        close(fds[0]);
        int code = 99;
        try {
            code = body(fds[1]);
        } catch (...) {
            code = 98;
        }
        close(fds[1]);
        _exit(code);
    }
    close(fds[1]);
    ChildResult r;
    char buf[4096];
    ssize_t n;
    while ((n = read(fds[0], buf, sizeof buf)) > 0) r.output.append(buf, static_cast<std::size_t>(n));
    close(fds[0]);
    int status = 0;
    waitpid(pid, &status, 0);
    r.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
    return r;
}

inline void writeAll(int fd, const std::string& text) {
    std::size_t done = 0;
    while (done < text.size()) {
        const ssize_t n = write(fd, text.data() + done, text.size() - done);
        if (n <= 0) return;
        done += static_cast<std::size_t>(n);
    }
}

}  // namespace earmark::test
