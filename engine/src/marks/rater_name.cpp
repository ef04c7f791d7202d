#include "earmark/marks/rater_name.hpp"

#include "earmark/marks/mark.hpp"
#include "earmark/marks/utf8.hpp"

#include <pwd.h>
#include <unistd.h>

#include <cstdlib>

namespace earmark {
namespace {

std::optional<std::string> nonBlank(const std::optional<std::string>& s) {
    if (!s) return std::nullopt;
    const auto first = s->find_first_not_of(" \t");
    if (first == std::string::npos) return std::nullopt;
    return s->substr(first, s->find_last_not_of(" \t") - first + 1);
}

std::optional<std::string> environment(const char* name) {
    const char* v = std::getenv(name);
    return v ? std::optional<std::string>(v) : std::nullopt;
}

std::optional<std::string> systemUserName() {
    long size = ::sysconf(_SC_GETPW_R_SIZE_MAX);
    std::string buffer(size > 0 ? static_cast<std::size_t>(size) : 16384, '\0');
    passwd entry{};
    passwd* found = nullptr;
    if (::getpwuid_r(::geteuid(), &entry, buffer.data(), buffer.size(), &found) == 0 && found && found->pw_name)
        if (auto name = nonBlank(std::string(found->pw_name))) return name;
    if (auto name = nonBlank(environment("USER"))) return name;
    return nonBlank(environment("LOGNAME"));
}

}  // namespace

void checkRaterName(const std::string& name) { checkTypedText("rater", name, MarkDraft::kMaxRaterBytes, false); }

std::string resolveRaterName(const RaterSources& sources) {
    std::optional<std::string> name = nonBlank(sources.explicitName);
    if (!name) name = nonBlank(environment(kRaterEnvironmentVariable));
    if (!name) name = nonBlank(sources.settingsName);
    if (!name) name = systemUserName();
    const std::string out = name.value_or("");
    checkRaterName(out);
    return out;
}

}  // namespace earmark
