// Opening a PostgreSQL connection for the store. Private to the store.
#pragma once

#include "db.hpp"

namespace earmark::store {

// Connects to `uri` (libpq reads credentials from it, PG* variables or the
// password file); messages name the URI without its password. InputError
// when the server cannot be reached or refuses the login.
Db connectPostgres(const std::string& uri);

}  // namespace earmark::store
