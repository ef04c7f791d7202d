#include "earmark/io/text_file.hpp"

#include "earmark/core/error.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>

namespace earmark {
namespace {

struct Fd {
    int fd;
    ~Fd() {
        if (fd >= 0) ::close(fd);
    }
};

std::string sizeText(std::size_t bytes) {
    if (bytes >= (std::size_t{1} << 20) && bytes % (std::size_t{1} << 20) == 0)
        return std::to_string(bytes >> 20) + " MiB";
    return std::to_string(bytes) + " bytes";
}

// Built by append: GCC 12 raises a false -Wrestrict on "literal" + std::string&&.
std::string tooLarge(std::size_t maxBytes) {
    return std::string("is larger than ").append(sizeText(maxBytes)).append(", the limit for a text input");
}

}  // namespace

std::string readTextFile(const std::string& path, std::size_t maxBytes) {
    Fd file{::open(path.c_str(), O_RDONLY | O_CLOEXEC)};
    if (file.fd < 0) {
        if (errno == ENOENT) throw InputError(path, "no such file");
        throw InputError(path, std::string("cannot be opened: ") + std::strerror(errno));
    }
    struct stat st {};
    if (::fstat(file.fd, &st) != 0) throw InputError(path, std::string("cannot be read: ") + std::strerror(errno));
    if (S_ISDIR(st.st_mode)) throw InputError(path, "is a folder, not a file");
    if (S_ISREG(st.st_mode) && static_cast<unsigned long long>(st.st_size) > maxBytes)
        throw InputError(path, tooLarge(maxBytes));
    std::string text;
    if (S_ISREG(st.st_mode)) text.reserve(static_cast<std::size_t>(st.st_size));
    char block[1 << 16];
    for (;;) {
        const ssize_t got = ::read(file.fd, block, sizeof block);
        if (got < 0) {
            if (errno == EINTR) continue;
            throw InputError(path, std::string("read failed: ") + std::strerror(errno));
        }
        if (got == 0) break;
        if (static_cast<std::size_t>(got) > maxBytes - text.size())
            throw InputError(path, tooLarge(maxBytes));
        text.append(block, static_cast<std::size_t>(got));
    }
    return text;
}

std::string withoutByteOrderMark(std::string text) {
    if (text.rfind("\xEF\xBB\xBF", 0) == 0) text.erase(0, 3);
    return text;
}

}  // namespace earmark
