// The ctest fixture around the shared PostgreSQL test server:
// earmark_pg_test_server start|stop STATE-DIR (tests/support/pg_test_server.hpp).
#include "support/pg_test_server.hpp"

#include <cstdio>
#include <exception>
#include <string>

int main(int argc, char** argv) {
    if (argc != 3) {
        std::fprintf(stderr, "usage: earmark_pg_test_server start|stop STATE-DIR\n");
        return 2;
    }
    const std::string command = argv[1];
    try {
        std::string why;
        if (command == "start") earmark::test::PgTestServer::startInto(argv[2]);
        else if (command == "stop") earmark::test::PgTestServer::stopFrom(argv[2]);
        else return 2;
    } catch (const std::exception& e) {
        std::fprintf(stderr, "%s\n", e.what());
        return 1;
    }
    return 0;
}
