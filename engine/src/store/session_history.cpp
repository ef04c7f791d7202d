// Raters: the review history, who reviewed which take, and assignments.
#include "session_impl.hpp"
#include "earmark/store/utc_clock.hpp"

#include "earmark/core/error.hpp"
#include "earmark/marks/rater_name.hpp"

#include <array>
#include <functional>
#include <set>

namespace earmark {
namespace {

using store::Statement;

constexpr std::array kActions = {HistoryAction::MarkAdded, HistoryAction::MarkChanged, HistoryAction::MarkDeleted,
                                 HistoryAction::Status, HistoryAction::Tiers};

}  // namespace

std::string_view historyActionName(HistoryAction action) {
    switch (action) {
    case HistoryAction::MarkAdded: return "mark-added";
    case HistoryAction::MarkChanged: return "mark-changed";
    case HistoryAction::MarkDeleted: return "mark-deleted";
    case HistoryAction::Status: return "status";
    case HistoryAction::Tiers: return "tiers";
    }
    return "status";
}

std::optional<HistoryAction> parseHistoryAction(std::string_view name) {
    for (HistoryAction a : kActions)
        if (historyActionName(a) == name) return a;
    return std::nullopt;
}

void Session::Impl::record(TakeId take, std::optional<MarkId> mark, HistoryAction action, const std::string& detail) {
    Statement st(db,
                 "INSERT INTO review_history (at_utc, rater, take_id, mark_id, action, detail) "
                 "VALUES (?1, ?2, ?3, ?4, ?5, ?6)",
                 "recording the review history");
    const std::string at = store::utcNowIso8601();
    st.bind(1, at).bind(2, rater).bind(3, take);
    if (mark) st.bind(4, *mark);
    st.bind(5, historyActionName(action)).bind(6, detail).run();
    const std::int64_t id = db.lastInsertId();
    recordedHere[id] = HistoryEntry{id, at, rater, take, mark, action, detail};
}

void Session::setRater(const std::string& name) {
    checkRaterName(name);
    impl_->rater = name;
}

const std::string& Session::rater() const { return impl_->rater; }

namespace {

// History rows chosen by `where` (binding its parameters with `bind`), oldest first.
std::vector<HistoryEntry> readHistory(const Session::Impl& impl, const std::string& where,
                                      const std::function<void(Statement&)>& bind) {
    Statement st(impl.db,
                 "SELECT id, at_utc, rater, take_id, mark_id, action, detail FROM review_history " + where +
                     " ORDER BY id",
                 "reading the review history");
    bind(st);
    std::vector<HistoryEntry> out;
    while (st.step()) {
        HistoryEntry e;
        e.id = st.integer(0);
        e.atUtc = st.text(1);
        e.rater = st.text(2);
        e.takeId = st.integer(3);
        if (const std::int64_t mark = st.integer(4); mark != 0) e.markId = mark;
        const auto action = parseHistoryAction(st.text(5));
        if (!action)
            throw InputError(impl.db.path, "history entry " + std::to_string(e.id) + " has an unknown action '" +
                                               st.text(5) + "'");
        e.action = *action;
        e.detail = st.text(6);
        out.push_back(std::move(e));
    }
    return out;
}

}  // namespace

std::vector<HistoryEntry> Session::history(std::optional<TakeId> take) const {
    store::ReadTransaction read(impl_->db);
    if (take) impl_->readTake(*take);
    return readHistory(*impl_, take ? "WHERE take_id = ?1" : "", [&](Statement& st) {
        if (take) st.bind(1, *take);
    });
}

std::vector<HistoryEntry> Session::changesSince(std::int64_t afterId) const {
    return readHistory(*impl_, "WHERE id > ?1", [&](Statement& st) { st.bind(1, afterId); });
}

std::vector<HistoryEntry> Session::changesElsewhereSince(std::int64_t afterId) const {
    std::vector<HistoryEntry> out = changesSince(afterId);
    std::erase_if(out, [&](const HistoryEntry& e) {
        const auto here = impl_->recordedHere.find(e.id);
        return here != impl_->recordedHere.end() && here->second == e;
    });
    return out;
}

std::optional<HistoryEntry> Session::Impl::lastChangeOfMark(MarkId mark) const {
    auto entries = readHistory(*this, "WHERE id = (SELECT MAX(id) FROM review_history WHERE mark_id = ?1)",
                               [&](Statement& st) { st.bind(1, mark); });
    if (entries.empty()) return std::nullopt;
    return std::move(entries.front());
}

std::int64_t Session::lastChangeId() const {
    Statement st(impl_->db, "SELECT COALESCE(MAX(id), 0) FROM review_history", "reading the review history");
    return st.step() ? st.integer(0) : 0;
}

std::map<TakeId, std::set<std::string>> Session::reviewers() const {
    Statement st(impl_->db,
                 "SELECT take_id, rater FROM review_history WHERE rater <> '' AND (action IN "
                 "('mark-added', 'mark-changed', 'mark-deleted') OR (action = 'status' AND detail IN "
                 "('clean', 'has-marks'))) UNION SELECT take_id, rater FROM marks WHERE rater <> ''",
                 "reading who reviewed which take");
    std::map<TakeId, std::set<std::string>> out;
    while (st.step()) out[st.integer(0)].insert(st.text(1));
    return out;
}

void Session::setAssignments(const std::vector<Assignment>& assignments) {
    impl_->requireWritable("assign takes");
    std::set<std::pair<TakeId, std::string>> seen;
    for (const Assignment& a : assignments) {
        checkRaterName(a.rater);
        if (a.rater.empty()) throw ParamError("Assignment.rater", "is blank; every assignment names a rater");
        if (!seen.emplace(a.takeId, a.rater).second)
            throw ParamError("Assignment", "take " + std::to_string(a.takeId) + " is assigned to " + a.rater + " twice");
    }
    store::WriteTransaction tx(impl_->db, "assigning takes");
    store::exec(impl_->db, "DELETE FROM assignments", "assigning takes");
    Statement insert(impl_->db, "INSERT INTO assignments (take_id, rater, assigned_utc) VALUES (?1, ?2, ?3)",
                     "assigning takes");
    const std::string now = store::utcNowIso8601();
    for (const Assignment& a : assignments) {
        impl_->readTake(a.takeId);  // InputError when there is no such take
        insert.bind(1, a.takeId).bind(2, a.rater).bind(3, now).run();
        insert.reset();
    }
    tx.commit();
}

std::vector<Assignment> Session::assignments() const {
    Statement st(impl_->db,
                 "SELECT a.take_id, a.rater FROM assignments a JOIN takes t ON t.id = a.take_id "
                 "ORDER BY t.queue_pos, t.id, a.rater",
                 "reading assignments");
    std::vector<Assignment> out;
    while (st.step()) out.push_back({st.integer(0), st.text(1)});
    return out;
}

}  // namespace earmark
