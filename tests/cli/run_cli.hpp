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

}  // namespace earmark::test
