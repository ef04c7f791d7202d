// Commands with actions ("session new", "mark add"): each action declares its
// options once; runActions() picks the action, parses and answers --help.
#pragma once

#include "arguments.hpp"

#include <cstdio>
#include <functional>
#include <map>
#include <string>
#include <vector>

namespace earmark::cli {

struct Action {
    const char* synopsis;
    const char* summary;
    std::vector<OptionSpec> options;
    std::function<int(const Arguments&)> run;
};

// `printActions` writes the command's overview (used for --help and when no
// action is given). Throws UsageError for an unknown action.
int runActions(const std::string& command, const std::map<std::string, Action>& actions,
               const std::vector<std::string>& argv, const std::function<void(std::FILE*)>& printActions);

}  // namespace earmark::cli
