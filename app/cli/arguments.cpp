#include "arguments.hpp"

#include <charconv>
#include <cstdio>
#include <cmath>
#include <sstream>

namespace earmark::cli {

Arguments::Arguments(std::string command, std::string synopsis, std::vector<OptionSpec> specs)
    : command_(std::move(command)), synopsis_(std::move(synopsis)), specs_(std::move(specs)) {}

const OptionSpec* Arguments::find(const std::string& name) const {
    for (const auto& s : specs_)
        if (s.name == name) return &s;
    return nullptr;
}

void Arguments::parse(const std::vector<std::string>& args) {
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string& a = args[i];
        if (a == "--help" || a == "-h") {
            help_ = true;
            continue;
        }
        if (a.rfind("--", 0) != 0 || a == "--" || a.size() == 2) {
            if (a == "--") {  // everything after is positional
                positionals_.insert(positionals_.end(), args.begin() + static_cast<long>(i) + 1, args.end());
                return;
            }
            positionals_.push_back(a);
            continue;
        }
        std::string name = a.substr(2);
        std::optional<std::string> inlineValue;
        if (auto eq = name.find('='); eq != std::string::npos) {
            inlineValue = name.substr(eq + 1);
            name = name.substr(0, eq);
        }
        const OptionSpec* spec = find(name);
        if (!spec) throw UsageError("unknown option --" + name + " (see earmark-cli " + command_ + " --help)");
        if (spec->placeholder.empty()) {
            if (inlineValue) throw UsageError("option --" + name + " takes no value");
            values_.insert_or_assign(name, std::string(1, '1'));  // not = "1": GCC 12 warns falsely (-Wrestrict)
            continue;
        }
        if (inlineValue) {
            values_[name] = *inlineValue;
        } else {
            if (i + 1 >= args.size()) throw UsageError("option --" + name + " needs a value " + spec->placeholder);
            values_[name] = args[++i];
        }
    }
}

bool Arguments::parseOrPrintHelp(const std::vector<std::string>& args) {
    parse(args);
    if (help_) std::fputs(helpText().c_str(), stdout);
    return help_;
}

std::string Arguments::helpText() const {
    std::ostringstream out;
    out << "usage: earmark-cli " << command_ << " " << synopsis_ << "\n\noptions:\n";
    for (const auto& s : specs_) {
        std::string left = "  --" + s.name + (s.placeholder.empty() ? "" : " " + s.placeholder);
        out << left;
        out << std::string(left.size() < 28 ? 28 - left.size() : 1, ' ') << s.help;
        if (!s.defaultText.empty()) out << " [default: " << s.defaultText << "]";
        out << "\n";
    }
    out << "  --help                    show this help and exit\n";
    return out.str();
}

bool Arguments::has(const std::string& name) const { return values_.count(name) > 0; }

std::optional<std::string> Arguments::value(const std::string& name) const {
    auto it = values_.find(name);
    if (it == values_.end()) return std::nullopt;
    return it->second;
}

std::string Arguments::valueOr(const std::string& name, const std::string& fallback) const {
    return value(name).value_or(fallback);
}

std::optional<double> Arguments::number(const std::string& name) const {
    auto v = value(name);
    if (!v) return std::nullopt;
    double d = 0;
    const char* first = v->data();
    const char* last = first + v->size();
    auto [ptr, ec] = std::from_chars(first, last, d);
    if (ec != std::errc() || ptr != last || !std::isfinite(d))
        throw UsageError("option --" + name + " expects a number, got '" + *v + "'");
    return d;
}

}  // namespace earmark::cli
