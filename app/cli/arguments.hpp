// A small declarative command-line parser: each option is declared once with
// its name, value placeholder, default and help text, so `--help` always
// lists every option with its default.
#pragma once

#include <map>
#include <optional>
#include <stdexcept>
#include <string>
#include <vector>

namespace earmark::cli {

// Thrown for a malformed command line; main() prints it and exits 2.
class UsageError : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

struct OptionSpec {
    std::string name;          // without the leading "--"
    std::string placeholder;   // empty for a flag without value
    std::string defaultText;   // shown in --help; empty = no default
    std::string help;
};

class Arguments {
public:
    Arguments(std::string command, std::string synopsis, std::vector<OptionSpec> specs);

    // Parses argv after the subcommand name. Throws UsageError.
    void parse(const std::vector<std::string>& args);
    // parse(), then answers --help on stdout; true when help was printed and
    // the command has nothing more to do.
    bool parseOrPrintHelp(const std::vector<std::string>& args);

    bool helpRequested() const { return help_; }
    std::string helpText() const;

    bool has(const std::string& name) const;
    std::optional<std::string> value(const std::string& name) const;
    std::string valueOr(const std::string& name, const std::string& fallback) const;
    // Parses a number; throws UsageError naming the option if it is not one.
    std::optional<double> number(const std::string& name) const;
    const std::vector<std::string>& positionals() const { return positionals_; }

private:
    const OptionSpec* find(const std::string& name) const;

    std::string command_;
    std::string synopsis_;
    std::vector<OptionSpec> specs_;
    std::map<std::string, std::string> values_;
    std::vector<std::string> positionals_;
    bool help_ = false;
};

}  // namespace earmark::cli
