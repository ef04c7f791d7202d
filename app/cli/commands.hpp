// The earmark-cli subcommands. Each takes the arguments after its name and
// returns an exit code (exit_codes.hpp); errors are thrown and mapped to exit
// codes and one-line messages by main().
#pragma once

#include <string>
#include <vector>

namespace earmark::cli {

int runAnalyze(const std::vector<std::string>& args);
int runSession(const std::vector<std::string>& args);
int runMark(const std::vector<std::string>& args);
int runExport(const std::vector<std::string>& args);
int runScan(const std::vector<std::string>& args);
int runMerge(const std::vector<std::string>& args);
int runAlign(const std::vector<std::string>& args);
int runCompare(const std::vector<std::string>& args);
int runModel(const std::vector<std::string>& args);
int runListen(const std::vector<std::string>& args);
int runLongform(const std::vector<std::string>& args);
int runArtefacts(const std::vector<std::string>& args);
int runWords(const std::vector<std::string>& args);
int runAgreement(const std::vector<std::string>& args);

}  // namespace earmark::cli
