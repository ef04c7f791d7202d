#include "actions.hpp"

#include "exit_codes.hpp"

namespace earmark::cli {

int runActions(const std::string& command, const std::map<std::string, Action>& actions,
               const std::vector<std::string>& argv, const std::function<void(std::FILE*)>& printActions) {
    if (argv.empty() || argv[0] == "--help" || argv[0] == "-h") {
        printActions(argv.empty() ? stderr : stdout);
        return argv.empty() ? kExitUsage : kExitOk;
    }
    const auto it = actions.find(argv[0]);
    if (it == actions.end())
        throw UsageError("unknown action '" + argv[0] + "' (see earmark-cli " + command + " --help)");
    Arguments args(command + " " + it->first, it->second.synopsis, it->second.options);
    if (args.parseOrPrintHelp({argv.begin() + 1, argv.end()})) return kExitOk;
    return it->second.run(args);
}

}  // namespace earmark::cli
