// A real PostgreSQL server for the tests of team sessions: initdb + pg_ctl
// in a temporary folder, listening on a free local port (127.0.0.1 only),
// password login (scram-sha-256) for a generated admin role, stopped and
// removed afterwards. Under root the server runs as the unprivileged user
// "nobody" (PostgreSQL refuses root), and owns its data folder.
//
// One server per test run: the ctest fixture "pg_server" starts it once
// (earmark_pg_test_server start DIR) and the tests find it through
// EARMARK_TEST_PG_STATE=DIR; a test binary run by hand starts its own on
// first use and stops it when the process ends.
#pragma once

#include <optional>
#include <string>

namespace earmark::test {

class PgTestServer {
public:
    // The shared server, started on first use. nullopt (with `why` set) when
    // the server binaries are not installed: callers skip with that message.
    // Throws std::runtime_error when they are installed but the server fails.
    static PgTestServer* shared(std::string* why);

    // A new empty session place (a schema of database "postgres", named by
    // the URI's search_path); the URI carries the admin's password.
    std::string newDatabase();
    // Runs SQL as the admin in database `db` ("postgres" when empty).
    void adminSql(const std::string& sql, const std::string& db = {});
    const std::string& adminPassword() const { return password_; }
    int port() const { return port_; }
    std::string uri(const std::string& user, const std::string& password, const std::string& db) const;

    // For the ctest fixture: starts a server whose state lives in `stateDir`
    // (admin-uri, the data folder, the log), or stops it.
    static void startInto(const std::string& stateDir);
    static void stopFrom(const std::string& stateDir);

private:
    std::string password_;
    int port_ = 0;
};

}  // namespace earmark::test
