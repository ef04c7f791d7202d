#include "earmark/io/staging.hpp"

#include "earmark/core/error.hpp"

#include <fcntl.h>
#include <signal.h>
#include <stdio.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <string>

namespace earmark {
namespace {

namespace fs = std::filesystem;

bool processRuns(long long pid) {
    if (pid <= 0 || pid != static_cast<pid_t>(pid)) return false;
    return ::kill(static_cast<pid_t>(pid), 0) == 0 || errno == EPERM;
}

// The PID in ".ANYTHING.KIND-PID[-SUFFIX]", or -1 when the name has another form.
long long stagingPid(const std::string& name, std::string_view kind) {
    if (name.size() < 2 || name[0] != '.') return -1;
    // Built by append: GCC 12 raises a false -Wrestrict on "." + std::string.
    const std::string marker = std::string(".").append(kind).append("-");
    const auto at = name.rfind(marker);
    if (at == std::string::npos || at == 0) return -1;
    std::size_t i = at + marker.size();
    const std::size_t digits = i;
    while (i < name.size() && name[i] >= '0' && name[i] <= '9') ++i;
    if (i == digits || i - digits > 10 || (i < name.size() && name[i] != '-')) return -1;
    return std::stoll(name.substr(digits, i - digits));
}

}  // namespace

fs::path stagingPath(const fs::path& target, std::string_view kind) {
    std::string name(".");
    name.append(target.filename().string()).append(".").append(kind).append("-").append(std::to_string(::getpid()));
    return target.parent_path() / name;
}

std::vector<fs::path> staleStaging(const fs::path& folder, std::string_view kind) {
    std::vector<fs::path> out;
    std::error_code ec;
    for (fs::directory_iterator it(folder, ec), end; !ec && it != end; it.increment(ec)) {
        const long long pid = stagingPid(it->path().filename().string(), kind);
        if (pid > 0 && !processRuns(pid)) out.push_back(it->path());
    }
    return out;
}

bool moveIntoPlaceNoReplace(const fs::path& from, const fs::path& to) {
    if (::renameat2(AT_FDCWD, from.c_str(), AT_FDCWD, to.c_str(), RENAME_NOREPLACE) == 0) return true;
    if (errno == EEXIST) return false;
    if (errno != EINVAL && errno != ENOSYS)
        throw WriteError(to.string(), std::string("cannot be created: ") + std::strerror(errno));
    // No RENAME_NOREPLACE on this file system: a hard link also refuses an existing name.
    if (::link(from.c_str(), to.c_str()) != 0) {
        if (errno == EEXIST) return false;
        throw WriteError(to.string(), std::string("cannot be created: ") + std::strerror(errno));
    }
    ::unlink(from.c_str());
    return true;
}

bool exchangeInPlace(const fs::path& a, const fs::path& b) {
    if (::renameat2(AT_FDCWD, a.c_str(), AT_FDCWD, b.c_str(), RENAME_EXCHANGE) == 0) return true;
    if (errno == EINVAL || errno == ENOSYS) return false;
    throw WriteError(b.string(), std::string("cannot be replaced: ") + std::strerror(errno));
}

void syncFolder(const fs::path& folder) {
    const int fd = ::open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
    if (fd < 0) return;
    ::fsync(fd);
    ::close(fd);
}

}  // namespace earmark
