// The agreement report as JSON (docs/agreement.md, "JSON"): written by
// `earmark-cli agreement --json`. Undefined figures (NaN) are written as null.
// Pure function; thread-safe.
#pragma once

#include "earmark/agreement/mark_agreement.hpp"

#include <string>

namespace earmark::agreement {

// `sessionName` is the session file's name as shown to the reader.
std::string agreementToJson(const AgreementReport& report, const std::string& sessionName);

}  // namespace earmark::agreement
