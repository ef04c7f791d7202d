// Writing command output: "-" means stdout; files are written to a temporary
// name next to the target and renamed, so a failed run never leaves half a file.
// Devices and pipes (/dev/null, /dev/stdout) are written to directly.
#pragma once

#include <string>
#include <utility>
#include <vector>

namespace earmark::cli {

// Throws earmark::WriteError naming the path when it cannot be written.
void writeTextOutput(const std::string& path, const std::string& text);

// The same for CSV text that ends in its own line end: writeTextOutput adds
// '\n', so the CSV's final LF is dropped and the last record still ends in
// CRLF (RFC 4180) with no blank line after it.
void writeCsvOutput(const std::string& path, std::string csv);

// Whether two paths name one regular file (existing or not yet); "-" and
// devices are never the same file. For refusing `--out X --json X` and an
// output that would replace an input.
bool sameFile(const std::string& a, const std::string& b);

// Throws UsageError when one of `outputs` (option name, path) names the same
// file as another output or as one of `inputs`.
void refuseClobbering(const std::vector<std::pair<std::string, std::string>>& outputs,
                      const std::vector<std::string>& inputs = {});

}  // namespace earmark::cli
