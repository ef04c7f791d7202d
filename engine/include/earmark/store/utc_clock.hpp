// Timestamps stored in sessions and exports: ISO 8601 UTC with milliseconds.
#pragma once

#include <string>

namespace earmark::store {

// e.g. "2025-03-01T09:30:12.345Z". Thread-safe.
std::string utcNowIso8601();

}  // namespace earmark::store
