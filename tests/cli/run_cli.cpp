#include "run_cli.hpp"

#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <sys/wait.h>

#include <algorithm>

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

}  // namespace

CliResult runCli(const std::vector<std::string>& args) { return runCliAfter("", args); }

CliResult runCliAfter(const std::string& shellPrefix, const std::vector<std::string>& args) {
    TempDir dir;
    std::string cmd = shellPrefix;
    cmd.append(shellQuote(EARMARK_CLI_PATH));
    // Appended piece by piece: GCC 12 raises a false -Wrestrict on chained
    // temporaries of std::string here.
    for (const auto& a : args) cmd.append(" ").append(shellQuote(a));
    cmd.append(" >").append(shellQuote(dir.file("out")));
    cmd.append(" 2>").append(shellQuote(dir.file("err")));
    cmd.append(" </dev/null");
    const int status = std::system(cmd.c_str());
    CliResult r;
    r.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
    r.out = slurp(dir.file("out"));
    r.err = slurp(dir.file("err"));
    return r;
}

void expectOneLineError(const CliResult& r, const std::string& part) {
    EXPECT_THAT(r.err, ::testing::HasSubstr(part));
    EXPECT_EQ(std::count(r.err.begin(), r.err.end(), '\n'), 1) << r.err;
    EXPECT_THAT(r.err, ::testing::Not(::testing::HasSubstr("terminate called")));
}

}  // namespace earmark::test
