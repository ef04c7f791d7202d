// The --rater option of commands that change a session: who the change is
// recorded for (order of the sources: earmark/marks/rater_name.hpp).
#pragma once

#include "arguments.hpp"

#include "earmark/store/session.hpp"

namespace earmark::cli {

OptionSpec raterOption();

// Resolves the rater name (--rater, then $EARMARK_RATER, then the user name)
// and makes `session` act for it. A bad name is a usage error.
void actAsRater(Session& session, const Arguments& args);

}  // namespace earmark::cli
