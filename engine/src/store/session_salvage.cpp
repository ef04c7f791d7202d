// Salvage: copying what can still be read from a damaged session into a new one.
#include "session_impl.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <set>

namespace earmark {
namespace {

using store::Statement;

// The largest id a table has handed out: the AUTOINCREMENT counter and the
// largest id a plain scan reaches before any damage, whichever is larger.
std::int64_t highestId(const store::Db& db, const char* table) {
    std::int64_t highest = 0;
    try {
        Statement seq(db, "SELECT seq FROM sqlite_sequence WHERE name = ?1", "reading the id counters");
        seq.bind(1, std::string_view(table));
        if (seq.step()) highest = seq.integer(0);
    } catch (const Error&) {
    }
    try {
        Statement scan(db, std::string("SELECT id FROM ") + table, "reading ids");
        while (scan.step()) highest = std::max(highest, scan.integer(0));
    } catch (const Error&) {
    }
    return highest;
}

// The ids an index of `table` lists (read from the index alone): rows that
// existed even when the table's own page holding them is damaged. Empty when
// the index cannot be read either.
std::set<std::int64_t> idsInIndex(const store::Db& db, const char* table, const char* index) {
    std::set<std::int64_t> ids;
    try {
        Statement st(db, std::string("SELECT id FROM ") + table + " INDEXED BY " + index, "reading an index");
        while (st.step()) ids.insert(st.integer(0));
    } catch (const Error&) {
    }
    return ids;
}

struct TakeRow {
    Take take;
    bool found = false;
};

// One take's row by its id, without the mark count (that would read the marks).
TakeRow readTakeRow(const store::Db& db, TakeId id) {
    Statement st(db, std::string("SELECT ") + kTakeRowColumns + " FROM takes WHERE id = ?1", "reading a take");
    st.bind(1, id);
    TakeRow row;
    if (!st.step()) return row;
    row.take = takeFromColumns(st, 0, id, db.path);
    row.found = true;
    return row;
}

void insertTakeRow(const store::Db& db, const Take& t) {
    Statement st(db,
                 "INSERT INTO takes (id, queue_pos, audio_path, line_id, text, build, status, status_utc, duration_s, "
                 "sample_rate, channels, added_utc) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12)",
                 "salvaging a take");
    st.bind(1, t.id).bind(2, t.queuePosition).bind(3, t.storedAudioPath).bind(4, t.lineId).bind(5, t.text);
    st.bind(6, t.build).bind(7, reviewStatusName(t.status)).bind(8, t.statusUtc).bind(9, t.durationSeconds);
    st.bind(10, t.sampleRate).bind(11, t.channels).bind(12, t.addedUtc).run();
}

std::vector<Suspect> readSuspects(const store::Db& db, TakeId id) {
    Statement st(db, "SELECT name, value, threshold, start_s, end_s, reason FROM suspects WHERE take_id = ?1 ORDER BY id",
                 "reading suspects");
    st.bind(1, id);
    std::vector<Suspect> out;
    while (st.step()) out.push_back({0, id, st.text(0), st.real(1), st.real(2), st.real(3), st.real(4), st.text(5)});
    return out;
}

// Ids handed out stay handed out: the new file's counters start where the old ones were.
void keepIdCounter(const store::Db& db, const char* table, std::int64_t highest) {
    Statement st(db,
                 "INSERT OR REPLACE INTO sqlite_sequence (name, seq) VALUES (?1, max(?2, coalesce((SELECT seq FROM "
                 "sqlite_sequence WHERE name = ?1), 0)))",
                 "salvaging the id counters");
    st.bind(1, std::string_view(table)).bind(2, highest).run();
}

}  // namespace

Session::SalvageReport Session::salvage(const std::string& damagedPath, const std::string& newPath) {
    const Session source = open(damagedPath, OpenMode::ReadOnly);
    const store::Db& from = source.impl_->db;
    SalvageReport report;
    struct Copied {
        Take take;
        std::optional<std::vector<TierRow>> tiers;
        std::optional<std::vector<Suspect>> suspects;
    };
    std::vector<Copied> takes;
    const std::int64_t highestTake = highestId(from, "takes");
    const std::set<std::int64_t> indexedTakes = idsInIndex(from, "takes", "takes_by_queue");
    for (TakeId id = 1; id <= highestTake; ++id) {
        try {
            TakeRow row = readTakeRow(from, id);
            if (!row.found) {
                report.takesUnreadable += indexedTakes.count(id) ? 1 : 0;  // listed, but its row is gone
                continue;
            }
            Copied c{row.take, std::nullopt, std::nullopt};
            try {
                c.tiers = source.impl_->readTiers(id);
            } catch (const Error&) {
                ++report.takesWithTiersLost;
            }
            try {
                c.suspects = readSuspects(from, id);
            } catch (const Error&) {
                ++report.takesWithSuspectsLost;
            }
            takes.push_back(std::move(c));
        } catch (const Error&) {
            ++report.takesUnreadable;
        }
    }
    std::vector<Mark> marks;
    const std::int64_t highestMark = highestId(from, "marks");
    const std::set<std::int64_t> indexedMarks = idsInIndex(from, "marks", "marks_by_take");
    for (MarkId id = 1; id <= highestMark; ++id) {
        try {
            if (auto m = source.impl_->findMark(id)) marks.push_back(*m);
            else report.marksUnreadable += indexedMarks.count(id) ? 1 : 0;
        } catch (const Error&) {
            ++report.marksUnreadable;
        }
    }

    createWhole(newPath, [&](Session& fresh) {
        fresh.inOneTransaction("salvaging the session", [&] {
            const store::Db& to = fresh.impl_->db;
            for (const Copied& c : takes) {
                insertTakeRow(to, c.take);
                ++report.takes;
                if (c.tiers && !c.tiers->empty()) {
                    fresh.setTiers(c.take.id, *c.tiers);
                    report.tierIntervals += static_cast<int>(c.tiers->size());
                }
                if (c.suspects && !c.suspects->empty()) {
                    fresh.replaceSuspects(c.take.id, *c.suspects);
                    report.suspects += static_cast<int>(c.suspects->size());
                }
            }
            for (const Mark& m : marks) {
                const auto take = std::find_if(takes.begin(), takes.end(),
                                               [&](const Copied& c) { return c.take.id == m.takeId; });
                if (take == takes.end()) {
                    ++report.marksOfLostTakes;
                    continue;
                }
                try {
                    // The same id, fields and times; the take's status is copied as it was.
                    fresh.apply(MarkEdit{std::nullopt, m, m.takeId, take->take.status, take->take.status});
                    ++report.marks;
                } catch (const ParamError&) {
                    ++report.marksUnreadable;  // read back, but not a valid mark
                }
            }
            keepIdCounter(to, "takes", highestTake);
            keepIdCounter(to, "marks", highestMark);
        });
    });
    return report;
}

}  // namespace earmark
