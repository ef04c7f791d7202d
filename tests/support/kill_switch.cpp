// A fault injector for crash tests, loaded into a command with LD_PRELOAD.
// It counts the calls that change files — writes, flushes to disk, renames,
// links, removals, truncations, new folders — and kills its own process with
// SIGKILL (as `kill -9` would) just before call number EARMARK_KILL_AT, so a
// test can stop a command at every step of its writing, repeatably.
// With EARMARK_KILL_COUNT_FILE set, it writes the number of such calls made
// to that file when the process ends normally (to choose kill points from).
// Built without sanitizers: it only forwards calls to the next library.
//
// No C library header that declares the wrapped functions is included: their
// declarations carry exception specifications these plain definitions would
// contradict.
#include <dlfcn.h>
#include <fcntl.h>
#include <signal.h>
#include <sys/types.h>

#include <atomic>
#include <cstdlib>
#include <utility>

struct iovec;

namespace {

std::atomic<long> calls{0};

long killAt() {
    static const long at = [] {
        const char* v = std::getenv("EARMARK_KILL_AT");
        return v ? std::atol(v) : 0L;
    }();
    return at;
}

void step() {
    if (++calls == killAt()) raise(SIGKILL);
}

template <class F>
F next(const char* name) {
    return reinterpret_cast<F>(dlsym(RTLD_NEXT, name));
}

struct CountOnExit {
    ~CountOnExit() {
        const char* path = std::getenv("EARMARK_KILL_COUNT_FILE");
        if (!path) return;
        char text[24];
        int n = 0;
        for (long v = calls.load(); n == 0 || v > 0; v /= 10) text[n++] = static_cast<char>('0' + v % 10);
        for (int i = 0; i < n / 2; ++i) std::swap(text[i], text[n - 1 - i]);
        static auto realWrite = next<ssize_t (*)(int, const void*, size_t)>("write");
        static auto realClose = next<int (*)(int)>("close");
        const int fd = open(path, O_WRONLY | O_CREAT | O_TRUNC | O_CLOEXEC, 0644);
        if (fd < 0) return;
        if (realWrite(fd, text, static_cast<size_t>(n)) != n) std::abort();
        realClose(fd);
    }
} countOnExit;

}  // namespace

#define EARMARK_COUNTED(ret, name, params, args)             \
    extern "C" ret name params {                             \
        static auto real = next<ret(*) params>(#name);       \
        step();                                              \
        return real args;                                    \
    }

EARMARK_COUNTED(ssize_t, write, (int fd, const void* buf, size_t n), (fd, buf, n))
EARMARK_COUNTED(ssize_t, writev, (int fd, const struct iovec* iov, int count), (fd, iov, count))
EARMARK_COUNTED(ssize_t, pwrite, (int fd, const void* buf, size_t n, off_t at), (fd, buf, n, at))
EARMARK_COUNTED(ssize_t, pwrite64, (int fd, const void* buf, size_t n, off64_t at), (fd, buf, n, at))
EARMARK_COUNTED(int, fsync, (int fd), (fd))
EARMARK_COUNTED(int, fdatasync, (int fd), (fd))
EARMARK_COUNTED(int, ftruncate, (int fd, off_t size), (fd, size))
EARMARK_COUNTED(int, ftruncate64, (int fd, off64_t size), (fd, size))
EARMARK_COUNTED(int, rename, (const char* a, const char* b), (a, b))
EARMARK_COUNTED(int, renameat, (int da, const char* a, int db, const char* b), (da, a, db, b))
EARMARK_COUNTED(int, renameat2, (int da, const char* a, int db, const char* b, unsigned flags), (da, a, db, b, flags))
EARMARK_COUNTED(int, link, (const char* a, const char* b), (a, b))
EARMARK_COUNTED(int, unlink, (const char* path), (path))
EARMARK_COUNTED(int, unlinkat, (int dir, const char* path, int flags), (dir, path, flags))
EARMARK_COUNTED(int, rmdir, (const char* path), (path))
EARMARK_COUNTED(int, remove, (const char* path), (path))
EARMARK_COUNTED(int, mkdir, (const char* path, mode_t mode), (path, mode))
