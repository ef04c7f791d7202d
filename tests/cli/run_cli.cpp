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

CliResult runShell(const std::string& shellPrefix, const std::vector<std::string>& args,
                   const std::string& stdinPath, const std::string& stdoutPath) {
    TempDir dir;
    std::string cmd = shellPrefix;
    cmd.append(shellQuote(EARMARK_CLI_PATH));
    // Appended piece by piece: GCC 12 raises a false -Wrestrict on chained
    // temporaries of std::string here.
    for (const auto& a : args) cmd.append(" ").append(shellQuote(a));
    cmd.append(" >").append(shellQuote(stdoutPath.empty() ? dir.file("out") : stdoutPath));
    cmd.append(" 2>").append(shellQuote(dir.file("err")));
    cmd.append(" <").append(shellQuote(stdinPath));
    const int status = std::system(cmd.c_str());
    CliResult r;
    r.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
    r.out = slurp(dir.file("out"));
    r.err = slurp(dir.file("err"));
    return r;
}

}  // namespace

CliResult runCli(const std::vector<std::string>& args) { return runShell("", args, "/dev/null", ""); }

CliResult runCliAfter(const std::string& shellPrefix, const std::vector<std::string>& args) {
    return runShell(shellPrefix, args, "/dev/null", "");
}

CliResult runCliRedirected(const std::vector<std::string>& args, const std::string& stdinPath,
                           const std::string& stdoutPath) {
    return runShell("", args, stdinPath, stdoutPath);
}

void expectOneLineError(const CliResult& r, const std::string& part) {
    EXPECT_THAT(r.err, ::testing::HasSubstr(part));
    EXPECT_EQ(std::count(r.err.begin(), r.err.end(), '\n'), 1) << r.err;
    EXPECT_THAT(r.err, ::testing::Not(::testing::HasSubstr("terminate called")));
}

}  // namespace earmark::test
