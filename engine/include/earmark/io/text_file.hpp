// Reading a whole text input: timings, rules, manifests, token lists, mel
// sidecars, scan outputs. The file is opened and read once, so a pipe, a FIFO
// or /dev/stdin works like a plain file, and reading stops at a size limit,
// so a device without end (/dev/zero) is refused instead of filling memory.
#pragma once

#include <cstddef>
#include <string>

namespace earmark {

// The largest text input Earmark reads: 256 MiB (a scan output of a million
// takes fits; docs/README.md "Limits" states it).
inline constexpr std::size_t kTextFileMaxBytes = std::size_t{256} << 20;

// Returns the file's bytes. Throws InputError(path, …) when it is missing, a
// folder, unreadable, or longer than `maxBytes` ("is larger than 256 MiB, the
// limit for a text input"). Blocks like any reader while a FIFO has no writer.
// Thread-safe.
std::string readTextFile(const std::string& path, std::size_t maxBytes = kTextFileMaxBytes);

// `text` without a leading UTF-8 byte-order mark (a mark is not text).
std::string withoutByteOrderMark(std::string text);

}  // namespace earmark
