// Session::copy: a whole session from one place to another (SQLite file ↔
// PostgreSQL), row by row with every id kept.
#include "session_impl.hpp"

#include "earmark/core/error.hpp"

#include <vector>

namespace earmark {
namespace {

using store::Statement;

// A column to copy: its name and how its value travels.
struct Column {
    const char* name;
    char kind;  // 'i' integer, 'r' real, 't' text; upper case: may be NULL
};
struct Table {
    const char* name;
    std::vector<Column> columns;
    bool handsOutIds;  // has an id column whose counter must carry over
};

// Every table of schema 4, parents before children (foreign keys).
const std::vector<Table>& tables() {
    static const std::vector<Table> all = {
        {"takes",
         {{"id", 'i'}, {"queue_pos", 'i'}, {"audio_path", 't'}, {"line_id", 't'}, {"text", 't'}, {"build", 't'},
          {"status", 't'}, {"status_utc", 't'}, {"status_rater", 't'}, {"duration_s", 'r'}, {"sample_rate", 'r'},
          {"channels", 'i'}, {"added_utc", 't'}},
         true},
        {"tier_intervals",
         {{"take_id", 'i'}, {"tier", 't'}, {"position", 'i'}, {"start_s", 'r'}, {"end_s", 'r'}, {"label", 't'}},
         false},
        {"marks",
         {{"id", 'i'}, {"take_id", 'i'}, {"category", 't'}, {"subtype", 't'}, {"severity", 't'}, {"start_s", 'r'},
          {"end_s", 'r'}, {"words", 't'}, {"note", 't'}, {"rater", 't'}, {"created_utc", 't'}, {"updated_utc", 't'},
          {"measures", 't'}},
         true},
        {"suspects",
         {{"id", 'i'}, {"take_id", 'i'}, {"name", 't'}, {"value", 'r'}, {"threshold", 'r'}, {"start_s", 'r'},
          {"end_s", 'r'}, {"reason", 't'}},
         true},
        {"review_history",
         {{"id", 'i'}, {"at_utc", 't'}, {"rater", 't'}, {"take_id", 'i'}, {"mark_id", 'I'}, {"action", 't'},
          {"detail", 't'}},
         true},
        {"assignments", {{"take_id", 'i'}, {"rater", 't'}, {"assigned_utc", 't'}}, false},
        {"listening_tests",
         {{"id", 'i'}, {"name", 't'}, {"kind", 't'}, {"design", 't'}, {"created_utc", 't'}},
         true},
        {"listening_trials",
         {{"test_id", 'i'}, {"slot", 'i'}, {"position", 'i'}, {"line_id", 't'}, {"kind", 't'}, {"repeat_of", 'i'},
          {"stimuli", 't'}},
         false},
        {"listening_raters", {{"test_id", 'i'}, {"rater", 't'}, {"slot", 'I'}, {"joined_utc", 't'}}, false},
        {"listening_answers",
         {{"id", 'i'}, {"test_id", 'i'}, {"rater", 't'}, {"line_id", 't'}, {"system", 't'}, {"versus", 't'},
          {"kind", 't'}, {"score", 'R'}, {"trial_position", 'I'}, {"origin", 't'}, {"answered_utc", 't'}},
         true},
        {"session_info", {{"key", 't'}, {"value", 't'}}, false},
    };
    return all;
}

// The highest id a table's counter handed out (0 when none): SQLite's
// AUTOINCREMENT counter or PostgreSQL's identity sequence, and at least the
// largest id present (tables without AUTOINCREMENT in SQLite).
std::int64_t idCounter(const store::Db& db, const char* table) {
    std::int64_t highest = 0;
    {
        Statement st(db, std::string("SELECT coalesce(max(id), 0) FROM ") + table, "reading the id counters");
        if (st.step()) highest = st.integer(0);
    }
    Statement seq(db,
                  db.postgres() ? "SELECT coalesce(pg_sequence_last_value(pg_get_serial_sequence(?1, 'id')::regclass), 0)"
                                : "SELECT coalesce(max(seq), 0) FROM sqlite_sequence WHERE name = ?1",
                  "reading the id counters");
    seq.bind(1, std::string_view(table));
    if (seq.step()) highest = std::max(highest, seq.integer(0));
    return highest;
}

void setIdCounter(const store::Db& db, const char* table, std::int64_t highest) {
    if (highest <= 0) return;
    if (!db.postgres()) {  // sqlite_sequence has no key: one row per table, replaced by hand
        Statement clear(db, "DELETE FROM sqlite_sequence WHERE name = ?1", "copying the id counters");
        clear.bind(1, std::string_view(table)).run();
    }
    Statement st(db,
                 db.postgres() ? "SELECT setval(pg_get_serial_sequence(?1, 'id'), ?2)"
                               : "INSERT INTO sqlite_sequence (name, seq) VALUES (?1, ?2)",
                 "copying the id counters");
    st.bind(1, std::string_view(table)).bind(2, highest).run();
}

}  // namespace

std::map<std::string, int> Session::copy(const std::string& from, const std::string& to) {
    const Session source = open(from, OpenMode::ReadOnly);
    const Impl& src = *source.impl_;
    std::map<std::string, int> counts;
    createWhole(to, [&](Session& fresh) {
        fresh.inOneTransaction("copying the session", [&] {
            const store::Db& dst = fresh.impl_->db;
            store::exec(dst, "DELETE FROM session_info", "copying the session");  // the copy keeps the original's
            store::ReadTransaction snapshot(src.db);
            for (const Table& table : tables()) {
                std::string names, slots;
                for (std::size_t i = 0; i < table.columns.size(); ++i) {
                    names += (i ? ", " : "") + std::string(table.columns[i].name);
                    slots += (i ? ", ?" : "?") + std::to_string(i + 1);
                }
                Statement read(src.db, "SELECT " + names + " FROM " + table.name, "copying the session");
                Statement write(dst, "INSERT INTO " + std::string(table.name) + " (" + names + ") VALUES (" + slots + ")",
                                "copying the session");
                int rows = 0;
                while (read.step()) {
                    write.reset();
                    for (std::size_t i = 0; i < table.columns.size(); ++i) {
                        const Column& c = table.columns[i];
                        const int col = static_cast<int>(i), slot = col + 1;
                        if (read.isNull(col)) continue;  // unbound: NULL
                        if (std::string_view(c.name) == "audio_path")  // the same file, stored for the new place
                            write.bind(slot, fresh.impl_->storedAudioPath(src.resolveAudioPath(read.text(col))));
                        else if (c.kind == 'i' || c.kind == 'I') write.bind(slot, read.integer(col));
                        else if (c.kind == 'r' || c.kind == 'R') write.bind(slot, read.real(col));
                        else write.bind(slot, read.text(col));
                    }
                    write.run();
                    ++rows;
                }
                if (table.handsOutIds) setIdCounter(dst, table.name, idCounter(src.db, table.name));
                counts[table.name] = rows;
            }
        });
    });
    return counts;
}

}  // namespace earmark
