// Shared by the fuzz targets: the input as text, or as a file for readers
// that take a path (one file per process, rewritten for every input).
#pragma once

#include "earmark/core/error.hpp"

#include <unistd.h>

#include <cstddef>
#include <cstdint>
#include <fstream>
#include <string>
#include <string_view>

namespace earmark::fuzz {

inline std::string_view asText(const std::uint8_t* data, std::size_t size) {
    return {reinterpret_cast<const char*>(data), size};
}

// Writes the input to /tmp/earmark-fuzz-<pid><suffix> and returns the path.
inline std::string asFile(const std::uint8_t* data, std::size_t size, const std::string& suffix) {
    const std::string path = "/tmp/earmark-fuzz-" + std::to_string(::getpid()) + suffix;
    std::ofstream(path, std::ios::binary | std::ios::trunc).write(reinterpret_cast<const char*>(data),
                                                                   static_cast<std::streamsize>(size));
    return path;
}

// Runs `read`; Earmark's own errors are the expected answer to bad input.
// Anything else (a library exception, a crash, a sanitizer report) is a finding.
template <class Read>
void expectOnlyEarmarkErrors(Read&& read) {
    try {
        read();
    } catch (const earmark::Error&) {
    }
}

}  // namespace earmark::fuzz
