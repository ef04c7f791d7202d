// Many writers on one server session at once: 8 processes add marks while a
// reader lists them; some writers are killed (SIGKILL) part-way. Every mark
// a writer saw acknowledged (addMark returned) must be in the session.
#include "earmark/store/session.hpp"
#include "store_test_util.hpp"

#include <gtest/gtest.h>
#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cstdio>
#include <random>
#include <set>
#include <vector>

namespace earmark {
namespace {

using test::draftAt;

constexpr int kWriters = 8;
constexpr int kMarksEach = 200;

struct Child {
    pid_t pid = -1;
    int fd = -1;  // acknowledged mark ids, one per line
    std::string acks;
};

Child startWriter(const std::string& uri, TakeId take, int writer) {
    int fds[2];
    if (pipe(fds) != 0) return {};
    const pid_t pid = fork();
    if (pid == 0) {
        close(fds[0]);
        int code = 0;
        try {
            Session s = Session::open(uri);
            s.setRater("writer-" + std::to_string(writer));
            for (int i = 0; i < kMarksEach; ++i) {
                const double start = 0.001 * i;
                const MarkId id = s.addMark(take, draftAt(start, start + 0.5)).markId();
                test::writeAll(fds[1], std::to_string(id) + "\n");  // acknowledged only after the commit
            }
        } catch (const std::exception& e) {
            std::fprintf(stderr, "writer %d: %s\n", writer, e.what());
            code = 1;
        }
        _exit(code);
    }
    close(fds[1]);
    return {pid, fds[0], {}};
}

TEST(ServerConcurrency, EightWritersAndAReaderLoseNoAcknowledgedMarkEvenWhenKilled) {
    std::string why;
    if (!test::PgTestServer::shared(&why)) GTEST_SKIP() << why;
    test::TwoTakeSession f(test::Backend::Server);
    const std::string uri = f.file;

    // The reader: the number of marks never goes down while writers add them.
    int readerPipe[2];
    ASSERT_EQ(pipe(readerPipe), 0);
    const pid_t reader = fork();
    if (reader == 0) {
        close(readerPipe[1]);
        int code = 0;
        try {
            const Session s = Session::open(uri, OpenMode::ReadOnly);
            std::size_t last = 0;
            char c;
            for (;;) {
                const std::size_t n = s.marks().size();
                if (n < last) code = 2;
                last = n;
                // Stop when the parent closes the pipe (poll without blocking).
                fd_set set;
                FD_ZERO(&set);
                FD_SET(readerPipe[0], &set);
                timeval none{0, 0};
                if (select(readerPipe[0] + 1, &set, nullptr, nullptr, &none) > 0 && read(readerPipe[0], &c, 1) <= 0)
                    break;
            }
        } catch (const std::exception& e) {
            std::fprintf(stderr, "reader: %s\n", e.what());
            code = 1;
        }
        _exit(code);
    }
    close(readerPipe[0]);

    std::vector<Child> writers;
    for (int w = 0; w < kWriters; ++w) writers.push_back(startWriter(uri, w % 2 ? f.a : f.b, w));
    // Writers 0, 3 and 6 are killed after a random number of acknowledged marks.
    std::mt19937 rng(20261204);
    std::vector<int> killAfter(kWriters, -1);
    for (int w : {0, 3, 6}) killAfter[w] = std::uniform_int_distribution<int>(5, kMarksEach - 20)(rng);

    std::set<MarkId> acknowledged;
    int killed = 0;
    for (int w = 0; w < kWriters; ++w) {
        Child& c = writers[w];
        char buf[4096];
        ssize_t n;
        int lines = 0;
        while ((n = read(c.fd, buf, sizeof buf)) > 0) {
            c.acks.append(buf, static_cast<std::size_t>(n));
            lines = static_cast<int>(std::count(c.acks.begin(), c.acks.end(), '\n'));
            if (killAfter[w] >= 0 && lines >= killAfter[w]) {
                kill(c.pid, SIGKILL);
                ++killed;
                killAfter[w] = -1;
            }
        }
        close(c.fd);
        int status = 0;
        waitpid(c.pid, &status, 0);
        const bool wasKilled = WIFSIGNALED(status) && WTERMSIG(status) == SIGKILL;
        if (!wasKilled) {
            EXPECT_TRUE(WIFEXITED(status) && WEXITSTATUS(status) == 0) << "writer " << w;
            EXPECT_EQ(lines, kMarksEach) << "writer " << w;
        }
        std::size_t pos = 0;
        while (pos < c.acks.size()) {
            const std::size_t nl = c.acks.find('\n', pos);
            if (nl == std::string::npos) break;  // a line cut by the kill was never acknowledged
            acknowledged.insert(std::stoll(c.acks.substr(pos, nl - pos)));
            pos = nl + 1;
        }
    }
    close(readerPipe[1]);
    int readerStatus = 0;
    waitpid(reader, &readerStatus, 0);
    EXPECT_TRUE(WIFEXITED(readerStatus) && WEXITSTATUS(readerStatus) == 0) << "the reader saw marks disappear";

    EXPECT_EQ(killed, 3);
    std::set<MarkId> stored;
    for (const Mark& m : f.session.marks()) stored.insert(m.id);
    for (MarkId id : acknowledged) EXPECT_TRUE(stored.count(id)) << "acknowledged mark " << id << " is missing";
    EXPECT_GE(acknowledged.size(), static_cast<std::size_t>(5 * kMarksEach));
    // A killed writer's last, unacknowledged mark may or may not have landed; nothing else is extra.
    EXPECT_LE(stored.size(), acknowledged.size() + 3);
    EXPECT_EQ(f.session.integrityCheck(), "ok");
    std::printf("%zu marks acknowledged, %zu stored, %d writers killed\n", acknowledged.size(), stored.size(), killed);
}

}  // namespace
}  // namespace earmark
