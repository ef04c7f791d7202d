#include "schema.hpp"
#include "sql_dialect.hpp"

#include "earmark/store/session.hpp"

#include <iterator>

namespace earmark::store {
namespace {

struct Migration {
    int toVersion;
    const char* sql;
};

// Each step takes the schema from toVersion − 1 to toVersion. Steps are never
// edited once released: a change is a new step, so every older file upgrades
// along the same path.
constexpr Migration kMigrations[] = {
    {1, R"sql(
PRAGMA application_id = 1163021643; -- kApplicationId, 0x45524D4B "ERMK"
CREATE TABLE session_info (
    key   TEXT PRIMARY KEY,
    value TEXT NOT NULL
) WITHOUT ROWID;
CREATE TABLE takes (
    id          INTEGER PRIMARY KEY AUTOINCREMENT,
    queue_pos   INTEGER NOT NULL,
    audio_path  TEXT NOT NULL,
    line_id     TEXT NOT NULL DEFAULT '',
    text        TEXT NOT NULL DEFAULT '',
    build       TEXT NOT NULL DEFAULT '',
    status      TEXT NOT NULL DEFAULT 'unreviewed'
                CHECK (status IN ('unreviewed', 'in-review', 'clean', 'has-marks', 'skipped')),
    duration_s  REAL NOT NULL CHECK (duration_s >= 0),
    sample_rate REAL NOT NULL,
    channels    INTEGER NOT NULL,
    added_utc   TEXT NOT NULL
);
CREATE INDEX takes_by_queue ON takes (queue_pos);
CREATE TABLE tier_intervals (
    take_id  INTEGER NOT NULL REFERENCES takes (id) ON DELETE CASCADE,
    tier     TEXT NOT NULL,
    position INTEGER NOT NULL,
    start_s  REAL NOT NULL,
    end_s    REAL NOT NULL CHECK (end_s >= start_s),
    label    TEXT NOT NULL DEFAULT '',
    PRIMARY KEY (take_id, tier, position)
) WITHOUT ROWID;
CREATE TABLE marks (
    id          INTEGER PRIMARY KEY AUTOINCREMENT,
    take_id     INTEGER NOT NULL REFERENCES takes (id) ON DELETE RESTRICT,
    category    TEXT NOT NULL,
    subtype     TEXT NOT NULL DEFAULT '',
    severity    TEXT NOT NULL,
    start_s     REAL NOT NULL CHECK (start_s >= 0),
    end_s       REAL NOT NULL CHECK (end_s > start_s),
    words       TEXT NOT NULL DEFAULT '',
    note        TEXT NOT NULL DEFAULT '',
    rater       TEXT NOT NULL DEFAULT '',
    created_utc TEXT NOT NULL,
    updated_utc TEXT NOT NULL,
    measures    TEXT NOT NULL DEFAULT '{}'
);
CREATE INDEX marks_by_take ON marks (take_id, start_s);
)sql"},
    // Version 2: suspects raised by the scan, and when a take's review status last changed.
    {2, R"sql(
CREATE TABLE suspects (
    id        INTEGER PRIMARY KEY,
    take_id   INTEGER NOT NULL REFERENCES takes (id) ON DELETE CASCADE,
    name      TEXT NOT NULL,
    value     REAL NOT NULL,
    threshold REAL NOT NULL,
    start_s   REAL NOT NULL,
    end_s     REAL NOT NULL CHECK (end_s >= start_s),
    reason    TEXT NOT NULL DEFAULT ''
);
CREATE INDEX suspects_by_take ON suspects (take_id);
ALTER TABLE takes ADD COLUMN status_utc TEXT NOT NULL DEFAULT '';
)sql"},
    // Version 3: listening tests, their recorded plans, raters and answers.
    {3, R"sql(
CREATE TABLE listening_tests (
    id          INTEGER PRIMARY KEY AUTOINCREMENT,
    name        TEXT NOT NULL UNIQUE,
    kind        TEXT NOT NULL CHECK (kind IN ('mos', 'cmos', 'mushra', 'ab')),
    design      TEXT NOT NULL,
    created_utc TEXT NOT NULL
);
CREATE TABLE listening_trials (
    test_id   INTEGER NOT NULL REFERENCES listening_tests (id) ON DELETE CASCADE,
    slot      INTEGER NOT NULL,
    position  INTEGER NOT NULL,
    line_id   TEXT NOT NULL,
    kind      TEXT NOT NULL CHECK (kind IN ('main', 'repeat', 'attention')),
    repeat_of INTEGER NOT NULL DEFAULT -1,
    stimuli   TEXT NOT NULL,
    PRIMARY KEY (test_id, slot, position)
) WITHOUT ROWID;
CREATE TABLE listening_raters (
    test_id    INTEGER NOT NULL REFERENCES listening_tests (id) ON DELETE CASCADE,
    rater      TEXT NOT NULL,
    slot       INTEGER,
    joined_utc TEXT NOT NULL,
    PRIMARY KEY (test_id, rater)
) WITHOUT ROWID;
CREATE UNIQUE INDEX listening_raters_by_slot ON listening_raters (test_id, slot) WHERE slot IS NOT NULL;
CREATE TABLE listening_answers (
    id             INTEGER PRIMARY KEY,
    test_id        INTEGER NOT NULL REFERENCES listening_tests (id) ON DELETE CASCADE,
    rater          TEXT NOT NULL,
    line_id        TEXT NOT NULL,
    system         TEXT NOT NULL,
    versus         TEXT NOT NULL DEFAULT '',
    kind           TEXT NOT NULL CHECK (kind IN ('main', 'repeat')),
    score          REAL,
    trial_position INTEGER,
    origin         TEXT NOT NULL DEFAULT '',
    answered_utc   TEXT NOT NULL,
    UNIQUE (test_id, rater, line_id, system, versus, kind)
);
)sql"},
    // Version 4: raters. Who changed what and when (the review history), who
    // last set each take's status, and which takes each rater is to review.
    {4, R"sql(
CREATE TABLE review_history (
    id      INTEGER PRIMARY KEY AUTOINCREMENT,
    at_utc  TEXT NOT NULL,
    rater   TEXT NOT NULL DEFAULT '',
    take_id INTEGER NOT NULL REFERENCES takes (id) ON DELETE CASCADE,
    mark_id INTEGER,
    action  TEXT NOT NULL CHECK (action IN ('mark-added', 'mark-changed', 'mark-deleted', 'status', 'tiers')),
    detail  TEXT NOT NULL DEFAULT ''
);
CREATE INDEX review_history_by_take ON review_history (take_id, id);
ALTER TABLE takes ADD COLUMN status_rater TEXT NOT NULL DEFAULT '';
CREATE TABLE assignments (
    take_id      INTEGER NOT NULL REFERENCES takes (id) ON DELETE CASCADE,
    rater        TEXT NOT NULL CHECK (rater <> ''),
    assigned_utc TEXT NOT NULL,
    PRIMARY KEY (take_id, rater)
) WITHOUT ROWID;
)sql"},
};

static_assert(std::size(kMigrations) == Session::kSchemaVersion, "one migration step per schema version");

int pragmaInt(const Db& db, const char* sql) {
    Statement st(db, sql, "reading the schema version");
    return st.step() ? static_cast<int>(st.integer(0)) : 0;
}

// PostgreSQL has no file header: the same two numbers sit in one row of
// earmark_schema; a database without that table is not a session (0).
int serverSchemaValue(const Db& db, const char* column) {
    Statement exists(db, "SELECT to_regclass('earmark_schema') IS NOT NULL", "reading the schema version");
    if (!exists.step() || exists.integer(0) == 0) return 0;
    return pragmaInt(db, (std::string("SELECT ") + column + " FROM earmark_schema").c_str());
}

}  // namespace

int userVersion(const Db& db) {
    return db.postgres() ? serverSchemaValue(db, "version") : pragmaInt(db, "PRAGMA user_version");
}
int applicationId(const Db& db) {
    return db.postgres() ? serverSchemaValue(db, "application_id") : pragmaInt(db, "PRAGMA application_id");
}

void migrate(const Db& db, int toVersion) {
    WriteTransaction tx(db, "upgrading the session to schema " + std::to_string(toVersion));
    // Read again under the write lock: another process may have upgraded the file meanwhile.
    const int from = userVersion(db);
    if (from >= toVersion) return;
    for (const Migration& m : kMigrations)
        if (m.toVersion > from && m.toVersion <= toVersion)
            exec(db, db.postgres() ? postgresSchema(m.sql).c_str() : m.sql,
                 "upgrading the session to schema " + std::to_string(m.toVersion));
    const std::string doing = "upgrading the session to schema " + std::to_string(toVersion);
    if (!db.postgres()) {
        exec(db, ("PRAGMA user_version = " + std::to_string(toVersion)).c_str(), doing);
    } else {
        if (from == 0)
            exec(db, "CREATE TABLE earmark_schema (application_id BIGINT NOT NULL, version BIGINT NOT NULL)", doing);
        exec(db, "DELETE FROM earmark_schema", doing);
        Statement set(db, "INSERT INTO earmark_schema (application_id, version) VALUES (?1, ?2)", doing);
        set.bind(1, kApplicationId).bind(2, toVersion).run();
    }
    tx.commit();
}

}  // namespace earmark::store
