// Writing command output: "-" means stdout; files are written to a temporary
// name next to the target and renamed, so a failed run never leaves half a file.
// Devices and pipes (/dev/null, /dev/stdout) are written to directly.
#pragma once

#include <string>

namespace earmark::cli {

// Throws earmark::Error naming the path when it cannot be written.
void writeTextOutput(const std::string& path, const std::string& text);

}  // namespace earmark::cli
