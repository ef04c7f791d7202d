#include "output_file.hpp"

#include "earmark/core/error.hpp"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>

namespace earmark::cli {

void writeTextOutput(const std::string& path, const std::string& text) {
    if (path == "-") {
        std::fwrite(text.data(), 1, text.size(), stdout);
        std::fputc('\n', stdout);
        std::fflush(stdout);
        return;
    }
    std::error_code kind;
    const auto status = std::filesystem::status(path, kind);
    if (!kind && std::filesystem::exists(status) && !std::filesystem::is_regular_file(status)) {
        // A device or pipe (/dev/null, /dev/stdout, a FIFO): write straight to
        // it; renaming a temporary file over it would replace the device.
        std::ofstream out(path, std::ios::binary);
        out << text << '\n';
        out.flush();
        if (!out) throw WriteError(path, std::string("cannot be written: ") + std::strerror(errno));
        return;
    }
    const std::string temp = path + ".part";
    {
        std::ofstream out(temp, std::ios::binary | std::ios::trunc);
        if (!out) throw WriteError(path, std::string("cannot be written: ") + std::strerror(errno));
        out << text << '\n';
        out.flush();
        if (!out) {
            std::error_code ec;
            std::filesystem::remove(temp, ec);
            throw WriteError(path, "write failed (disk full?)");
        }
    }
    std::error_code ec;
    std::filesystem::rename(temp, path, ec);
    if (ec) {
        std::filesystem::remove(temp, ec);
        throw WriteError(path, "cannot be replaced: " + ec.message());
    }
}

}  // namespace earmark::cli
