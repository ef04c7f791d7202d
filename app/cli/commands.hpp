// The earmark-cli subcommands. Each takes the arguments after its name and
// returns an exit code (exit_codes.hpp); errors are thrown and mapped to exit
// codes and one-line messages by main().
#pragma once

#include <string>
#include <vector>

namespace earmark::cli {

int runAnalyze(const std::vector<std::string>& args);

}  // namespace earmark::cli
