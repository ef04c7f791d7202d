#include "support/pg_test_server.hpp"

#include <libpq-fe.h>
#include <netinet/in.h>
#include <pwd.h>
#include <sys/socket.h>
#include <unistd.h>

#include <atomic>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <memory>
#include <random>
#include <sstream>
#include <stdexcept>

namespace earmark::test {
namespace {

namespace fs = std::filesystem;

// The newest installed server's programs (Debian: /usr/lib/postgresql/N/bin).
std::string serverBinDir() {
    std::string best;
    int bestVersion = -1;
    std::error_code ec;
    for (const auto& entry : fs::directory_iterator("/usr/lib/postgresql", ec)) {
        const fs::path bin = entry.path() / "bin";
        if (!fs::exists(bin / "initdb") || !fs::exists(bin / "pg_ctl")) continue;
        const int version = std::atoi(entry.path().filename().c_str());
        if (version > bestVersion) bestVersion = version, best = bin.string();
    }
    return best;
}

std::string quoted(const std::string& s) {
    std::string q = "'";
    for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
    return q + "'";
}

void run(const std::string& command, const std::string& what) {
    if (std::system(command.c_str()) != 0) throw std::runtime_error("PostgreSQL test server: " + what + " failed: " + command);
}

// A port the kernel just handed out on 127.0.0.1 (free a moment ago).
int freePort() {
    const int fd = ::socket(AF_INET, SOCK_STREAM, 0);
    sockaddr_in a{};
    a.sin_family = AF_INET;
    a.sin_addr.s_addr = htonl(INADDR_LOOPBACK);
    socklen_t len = sizeof a;
    if (fd < 0 || ::bind(fd, reinterpret_cast<sockaddr*>(&a), sizeof a) != 0 ||
        ::getsockname(fd, reinterpret_cast<sockaddr*>(&a), &len) != 0)
        throw std::runtime_error("PostgreSQL test server: no free local port");
    const int port = ntohs(a.sin_port);
    ::close(fd);
    return port;
}

std::string randomPassword() {
    std::random_device rd;
    std::string p = "pw-";
    const char* digits = "abcdefghijkmnpqrstuvwxyz23456789";
    for (int i = 0; i < 24; ++i) p += digits[rd() % 32];
    return p;
}

// `runuser -u nobody --` under root, nothing otherwise.
std::string asServerUser() { return ::geteuid() == 0 ? "runuser -u nobody -- " : ""; }

void startServer(const fs::path& state, std::string& password, int& port) {
    const std::string bin = serverBinDir();
    fs::create_directories(state);
    const fs::path data = state / "data";
    password = randomPassword();
    {
        std::ofstream(state / "pw") << password << "\n";
    }
    if (::geteuid() == 0) {
        const passwd* nobody = ::getpwnam("nobody");
        if (!nobody) throw std::runtime_error("PostgreSQL test server: no user 'nobody' to run the server as");
        if (::chown(state.c_str(), nobody->pw_uid, nobody->pw_gid) != 0 ||
            ::chown((state / "pw").c_str(), nobody->pw_uid, nobody->pw_gid) != 0)
            throw std::runtime_error("PostgreSQL test server: cannot hand " + state.string() + " to nobody");
    }
    fs::permissions(state, fs::perms::owner_all | fs::perms::group_exec | fs::perms::others_exec);
    run(asServerUser() + quoted(bin + "/initdb") + " -D " + quoted(data.string()) +
            " -U earmark_admin --pwfile=" + quoted((state / "pw").string()) +
            " --auth-host=scram-sha-256 --auth-local=scram-sha-256 --no-sync --no-instructions -E UTF8 --locale=C > " +
            quoted((state / "initdb.log").string()) + " 2>&1",
        "initdb (see " + (state / "initdb.log").string() + ")");
    fs::remove(state / "pw");
    for (int attempt = 0;; ++attempt) {
        port = freePort();
        // fsync off: the tests kill clients, never the server, and nothing here must outlive the run.
        const std::string options = "-p " + std::to_string(port) + " -k " + state.string() +
                                    " -c listen_addresses=127.0.0.1 -c fsync=off -c full_page_writes=off"
                                    " -c max_connections=60";
        const std::string cmd = asServerUser() + quoted(bin + "/pg_ctl") + " -D " + quoted(data.string()) + " -l " +
                                quoted((state / "server.log").string()) + " -w -t 30 -o " + quoted(options) +
                                " start > /dev/null 2>&1";
        if (std::system(cmd.c_str()) == 0) break;
        if (attempt == 2) throw std::runtime_error("PostgreSQL test server: pg_ctl start failed (see " +
                                                   (state / "server.log").string() + ")");
    }
    std::ofstream(state / "admin") << port << "\n" << password << "\n";
}

void stopServer(const fs::path& state) {
    const std::string bin = serverBinDir();
    if (!bin.empty() && fs::exists(state / "data"))
        std::system((asServerUser() + quoted(bin + "/pg_ctl") + " -D " + quoted((state / "data").string()) +
                     " -m immediate -w stop > /dev/null 2>&1")
                        .c_str());
    std::error_code ec;
    fs::remove_all(state, ec);
}

// A server this process started itself, stopped when the process exits normally.
struct OwnServer {
    fs::path state;
    ~OwnServer() {
        if (!state.empty()) stopServer(state);
    }
};

}  // namespace

PgTestServer* PgTestServer::shared(std::string* why) {
    static std::unique_ptr<PgTestServer> server;
    static OwnServer own;
    if (server) return server.get();
    if (serverBinDir().empty()) {
        if (why) *why = "PostgreSQL server binaries not found under /usr/lib/postgresql/*/bin (Debian package "
                        "postgresql); skipping the tests against a server";
        return nullptr;
    }
    fs::path state;
    if (const char* dir = std::getenv("EARMARK_TEST_PG_STATE"); dir && fs::exists(fs::path(dir) / "admin")) {
        state = dir;
    } else {
        char tmpl[] = "/tmp/earmark-pg-XXXXXX";
        if (!::mkdtemp(tmpl)) throw std::runtime_error("PostgreSQL test server: cannot make a temporary folder");
        own.state = tmpl;
        std::string password;
        int port = 0;
        startServer(own.state, password, port);
        state = own.state;
    }
    server = std::make_unique<PgTestServer>();
    std::ifstream in(state / "admin");
    in >> server->port_ >> server->password_;
    return server.get();
}

std::string PgTestServer::uri(const std::string& user, const std::string& password, const std::string& db) const {
    return "postgresql://" + user + ":" + password + "@127.0.0.1:" + std::to_string(port_) + "/" + db;
}

void PgTestServer::adminSql(const std::string& sql, const std::string& db) {
    const std::string u = uri("earmark_admin", password_, db.empty() ? "postgres" : db);
    std::unique_ptr<PGconn, void (*)(PGconn*)> conn(PQconnectdb(u.c_str()), PQfinish);
    if (PQstatus(conn.get()) != CONNECTION_OK)
        throw std::runtime_error(std::string("PostgreSQL test server: cannot connect: ") + PQerrorMessage(conn.get()));
    std::unique_ptr<PGresult, void (*)(PGresult*)> r(PQexec(conn.get(), sql.c_str()), PQclear);
    const auto status = PQresultStatus(r.get());
    if (status != PGRES_COMMAND_OK && status != PGRES_TUPLES_OK)
        throw std::runtime_error("PostgreSQL test server: " + sql + ": " + PQresultErrorMessage(r.get()));
}

std::string PgTestServer::newDatabase() {
    static std::atomic<int> counter{0};
    const std::string name = "s_" + std::to_string(::getpid()) + "_" + std::to_string(counter++);
    // A schema, not a database: far cheaper to make, and a session lives in
    // the first schema of the connection's search_path.
    adminSql("CREATE SCHEMA " + name);
    return uri("earmark_admin", password_, "postgres") + "?options=-csearch_path%3D" + name;
}

void PgTestServer::startInto(const std::string& stateDir) {
    if (serverBinDir().empty()) return;  // the tests skip with a message
    std::string password;
    int port = 0;
    stopServer(stateDir);  // a leftover of an interrupted run
    startServer(stateDir, password, port);
}

void PgTestServer::stopFrom(const std::string& stateDir) { stopServer(stateDir); }

}  // namespace earmark::test
