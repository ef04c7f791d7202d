// Parsing a timings document as JSON with errors that name the line and
// column (internal to the timings readers).
#pragma once

#include <nlohmann/json.hpp>

#include <string>
#include <string_view>

namespace earmark::tiers_detail {

using Json = nlohmann::ordered_json;

// Parses `text` (a leading byte-order mark is skipped). Throws
// InputError(source, "line L, column C: not valid JSON"), InputError(source,
// "holds a number too large to read: 1e400"), and
// InputError(source, notAnObject) when the document is not a JSON object.
Json parseJsonObject(std::string_view text, const std::string& source, const std::string& notAnObject);

}  // namespace earmark::tiers_detail
