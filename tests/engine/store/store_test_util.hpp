// Helpers shared by the session-store tests: short takes on disk, a ready
// mark draft, and running code in a child process (for crashes, other users
// and resource limits).
#pragma once

#include "earmark/io/audio_file.hpp"
#include "earmark/marks/mark.hpp"
#include "support/test_signals.hpp"

#include <sys/wait.h>
#include <unistd.h>

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
