#include "run_cli.hpp"

#include "support/temp_dir.hpp"

#include <sys/wait.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <sstream>

namespace earmark::test {
namespace {

std::string shellQuote(const std::string& s) {
    std::string q = "'";
    for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
    return q + "'";
}

std::string slurp(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    std::stringstream ss;
    ss << in.rdbuf();
    return ss.str();
}

}  // namespace

CliResult runCli(const std::vector<std::string>& args) {
    TempDir dir;
    std::string cmd = shellQuote(EARMARK_CLI_PATH);
    for (const auto& a : args) cmd += " " + shellQuote(a);
    cmd += " >" + shellQuote(dir.file("out")) + " 2>" + shellQuote(dir.file("err")) + " </dev/null";
    const int status = std::system(cmd.c_str());
    CliResult r;
    r.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
    r.out = slurp(dir.file("out"));
    r.err = slurp(dir.file("err"));
    return r;
}

}  // namespace earmark::test
