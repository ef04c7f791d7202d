#include "output_file.hpp"

#include "arguments.hpp"

#include "earmark/core/error.hpp"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>

namespace earmark::cli {

bool sameFile(const std::string& a, const std::string& b) {
    if (a == "-" || b == "-") return false;
    std::error_code ec;
    const auto sa = std::filesystem::status(a, ec);
    const auto sb = std::filesystem::status(b, ec);
    if (std::filesystem::exists(sa) && !std::filesystem::is_regular_file(sa)) return false;
    if (std::filesystem::exists(sb) && !std::filesystem::is_regular_file(sb)) return false;
    if (std::filesystem::exists(sa) && std::filesystem::exists(sb)) return std::filesystem::equivalent(a, b, ec);
    const auto ca = std::filesystem::weakly_canonical(a, ec);
    if (ec) return false;
    const auto cb = std::filesystem::weakly_canonical(b, ec);
    return !ec && ca == cb;
}

void refuseClobbering(const std::vector<std::pair<std::string, std::string>>& outputs,
                      const std::vector<std::string>& inputs) {
    for (std::size_t i = 0; i < outputs.size(); ++i) {
        for (std::size_t j = i + 1; j < outputs.size(); ++j)
            if (sameFile(outputs[i].second, outputs[j].second))
                throw UsageError(outputs[i].first + " and " + outputs[j].first + " name the same file (" +
                                 outputs[i].second + ")");
        for (const auto& input : inputs)
            if (sameFile(outputs[i].second, input))
                throw UsageError(outputs[i].first + " " + outputs[i].second + " is one of the inputs; it would be replaced");
    }
}

void writeCsvOutput(const std::string& path, std::string csv) {
    if (!csv.empty() && csv.back() == '\n') csv.pop_back();
    writeTextOutput(path, csv);
}

void writeTextOutput(const std::string& path, const std::string& text) {
    if (path == "-") {
        std::fwrite(text.data(), 1, text.size(), stdout);
        std::fputc('\n', stdout);
        if (std::fflush(stdout) != 0 || std::ferror(stdout))
            throw WriteError("standard output", std::string("write failed: ") + std::strerror(errno));
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
