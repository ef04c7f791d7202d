// Runs the built earmark-cli with arguments and captures what it printed.
#pragma once

#include <string>
#include <vector>

namespace earmark::test {

struct CliResult {
    int exitCode = -1;
    std::string out;
    std::string err;
};

CliResult runCli(const std::vector<std::string>& args);
// The same, after shell commands run in the same shell first (e.g. a file
// size limit: "ulimit -f 16; ", or environment: "LD_PRELOAD=… ").
CliResult runCliAfter(const std::string& shellPrefix, const std::vector<std::string>& args);

// Same, with stdin read from `stdinPath` and, when `stdoutPath` is not empty,
// stdout written there instead of captured (e.g. /dev/full).
CliResult runCliRedirected(const std::vector<std::string>& args, const std::string& stdinPath,
                           const std::string& stdoutPath = "");

// The failure contract of every command: stderr is exactly one line, it
// contains `part` (usually the file's path), and nothing crashed.
void expectOneLineError(const CliResult& r, const std::string& part);

}  // namespace earmark::test
