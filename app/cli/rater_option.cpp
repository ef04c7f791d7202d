#include "rater_option.hpp"

#include "earmark/core/error.hpp"
#include "earmark/marks/rater_name.hpp"

namespace earmark::cli {

OptionSpec raterOption() {
    return {"rater", "NAME", std::string("$") + kRaterEnvironmentVariable + ", else your user name",
            "who makes the change (recorded in the session's history)"};
}

void actAsRater(Session& session, const Arguments& args) {
    try {
        session.setRater(resolveRaterName({.explicitName = args.value("rater")}));
    } catch (const ParamError& e) {
        throw UsageError(std::string("--rater: the name ") + e.problem());
    }
}

}  // namespace earmark::cli
