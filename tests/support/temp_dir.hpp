// A temporary folder removed when the test ends.
#pragma once

#include <filesystem>
#include <string>

namespace earmark::test {

class TempDir {
public:
    TempDir();
    ~TempDir();
    TempDir(const TempDir&) = delete;
    TempDir& operator=(const TempDir&) = delete;
    const std::filesystem::path& path() const { return path_; }
    std::string file(const std::string& name) const { return (path_ / name).string(); }

private:
    std::filesystem::path path_;
};

// The whole content of a file as bytes ("" when it cannot be read).
std::string slurp(const std::filesystem::path& path);

}  // namespace earmark::test
