// Marks: add, update, delete, and undo/redo of those edits.
#include "session_impl.hpp"
#include "earmark/store/utc_clock.hpp"

#include "earmark/core/error.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cstdio>

namespace earmark {
namespace {

using store::Statement;
using store::WriteTransaction;

constexpr const char* kMarkColumns =
    "SELECT m.id, m.take_id, m.category, m.subtype, m.severity, m.start_s, m.end_s, m.words, m.note, "
    "m.rater, m.created_utc, m.updated_utc, m.measures FROM marks m ";

std::string measuresToJson(const MeasureSnapshot& measures) {
    nlohmann::json j = nlohmann::json::object();
    for (const auto& [name, value] : measures) j[name] = value;
    return j.dump();  // shortest text that reads back as the same double
}

Mark markFromRow(const std::string& path, const Statement& st) {
    Mark m;
    m.id = st.integer(0);
    m.takeId = st.integer(1);
    const std::string what = "mark " + std::to_string(m.id);
    const auto category = parseCategory(st.text(2));
    if (!category) throw InputError(path, what + " has an unknown category '" + st.text(2) + "'");
    m.category = *category;
    m.subtype = st.text(3);
    const auto severity = parseSeverity(st.text(4));
    if (!severity) throw InputError(path, what + " has an unknown severity '" + st.text(4) + "'");
    m.severity = *severity;
    m.startSeconds = st.real(5);
    m.endSeconds = st.real(6);
    m.words = st.text(7);
    m.note = st.text(8);
    m.rater = st.text(9);
    m.createdUtc = st.text(10);
    m.updatedUtc = st.text(11);
    const auto measures = nlohmann::json::parse(st.text(12), nullptr, false);
    if (!measures.is_object()) throw InputError(path, what + " has damaged measures");
    for (const auto& [name, value] : measures.items()) {
        if (!value.is_number()) throw InputError(path, what + " has a non-numeric measure '" + name + "'");
        m.measures[name] = value.get<double>();
    }
    return m;
}

// Binds the draft's fields to ?1 … ?9 (category … measures) in one order
// shared by INSERT and UPDATE.
void bindDraft(Statement& st, const MarkDraft& d) {
    st.bind(1, categoryName(d.category)).bind(2, d.subtype).bind(3, severityName(d.severity));
    st.bind(4, d.startSeconds).bind(5, d.endSeconds).bind(6, d.words).bind(7, d.note).bind(8, d.rater);
    st.bind(9, measuresToJson(d.measures));
}

void insertMark(const store::Db& db, const Mark& m) {
    // A restored mark keeps its id; a new one gets the next (the id column is
    // left out: PostgreSQL's identity column takes no NULL).
    const bool keepId = m.id > 0;
    Statement st(db,
                 std::string("INSERT INTO marks (category, subtype, severity, start_s, end_s, words, note, rater, "
                             "measures, take_id, created_utc, updated_utc") +
                     (keepId ? ", id" : "") + ") VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12" +
                     (keepId ? ", ?13" : "") + ")",
                 "saving a mark");
    bindDraft(st, m);
    st.bind(10, m.takeId).bind(11, m.createdUtc).bind(12, m.updatedUtc);
    if (keepId) st.bind(13, m.id);
    st.run();
}

void writeMark(const store::Db& db, const Mark& m) {
    Statement st(db,
                 "UPDATE marks SET category = ?1, subtype = ?2, severity = ?3, start_s = ?4, end_s = ?5, "
                 "words = ?6, note = ?7, rater = ?8, measures = ?9, created_utc = ?10, updated_utc = ?11 "
                 "WHERE id = ?12",
                 "saving a mark");
    bindDraft(st, m);
    st.bind(10, m.createdUtc).bind(11, m.updatedUtc).bind(12, m.id).run();
}

void eraseMark(const store::Db& db, MarkId id) {
    Statement st(db, "DELETE FROM marks WHERE id = ?1", "deleting a mark");
    st.bind(1, id).run();
}

// The draft as it will be stored: words taken from the word tier when the
// take has one, then validated.
MarkDraft prepareDraft(const Session::Impl& impl, const Take& take, MarkDraft draft) {
    const std::vector<TierRow> tiers = impl.readTiers(take.id);
    const bool hasWordTier = std::any_of(tiers.begin(), tiers.end(), [](const TierRow& r) {
        return r.tier == "words" || r.tier == "word";
    });
    if (hasWordTier) draft.words = wordsCovered(tiers, draft.startSeconds, draft.endSeconds);
    if (draft.rater.empty()) draft.rater = impl.rater;
    draft.validate(take.durationSeconds);
    return draft;
}

// "timing/rushed 1.200-1.500 s": what the history says about a mark.
std::string historyDetail(const Mark& m) {
    std::string kind(categoryName(m.category));
    if (!m.subtype.empty()) kind += "/" + m.subtype;
    char span[64];
    std::snprintf(span, sizeof span, " %.3f-%.3f s", m.startSeconds, m.endSeconds);
    return kind + span;
}

// "by ben at 2026-12-05T20:41:03.120Z": who made the newest change of a mark.
std::string changedBy(const Session::Impl& impl, MarkId id) {
    const auto last = impl.lastChangeOfMark(id);
    if (!last) return "elsewhere";
    return "by " + (last->rater.empty() ? std::string("a rater without a name") : last->rater) + " at " + last->atUtc;
}

// The stored mark `id`; when `asRead` is given, refused (ConflictError,
// nothing changed) unless the stored mark is still exactly `asRead`.
Mark markToChange(const Session::Impl& impl, MarkId id, const Mark* asRead, const std::string& doing) {
    if (!asRead) return impl.readMark(id);
    const std::optional<Mark> stored = impl.findMark(id);
    const std::string what = "mark " + std::to_string(id);
    if (!stored)
        throw ConflictError(impl.db.path, "cannot " + doing + ": " + what + " was deleted " + changedBy(impl, id) +
                                              " since it was read; nothing was changed");
    if (*stored != *asRead)
        throw ConflictError(impl.db.path, "cannot " + doing + ": " + what + " was changed " + changedBy(impl, id) +
                                              " since it was read (it is now " + historyDetail(*stored) +
                                              "); nothing was changed — look at it again and repeat the change "
                                              "if it still applies");
    return *stored;
}

}  // namespace

std::optional<Mark> Session::Impl::findMark(MarkId id) const {
    Statement st(db, std::string(kMarkColumns) + "WHERE m.id = ?1", "reading a mark");
    st.bind(1, id);
    if (!st.step()) return std::nullopt;
    return markFromRow(db.path, st);
}

Mark Session::Impl::readMark(MarkId id) const {
    auto m = findMark(id);
    if (!m) throw InputError(db.path, "has no mark with id " + std::to_string(id));
    return *m;
}

MarkEdit Session::addMark(TakeId takeId, const MarkDraft& draft) {
    impl_->requireWritable("add a mark");
    WriteTransaction tx(impl_->db, "adding a mark");
    const Take take = impl_->readTake(takeId);
    Mark m;
    static_cast<MarkDraft&>(m) = prepareDraft(*impl_, take, draft);
    m.takeId = takeId;
    m.createdUtc = m.updatedUtc = store::utcNowIso8601();
    insertMark(impl_->db, m);
    m.id = impl_->db.lastInsertId();
    impl_->record(takeId, m.id, HistoryAction::MarkAdded, historyDetail(m));
    MarkEdit edit{std::nullopt, m, takeId, take.status, ReviewStatus::HasMarks};
    if (edit.statusBefore != edit.statusAfter) impl_->writeStatus(takeId, edit.statusAfter);
    tx.commit();
    return edit;
}

namespace {

MarkEdit changeMark(Session::Impl& impl, MarkId id, const Mark* asRead, const MarkDraft& draft) {
    impl.requireWritable("change a mark");
    WriteTransaction tx(impl.db, "changing a mark");
    const Mark before = markToChange(impl, id, asRead, "change a mark");
    const Take take = impl.readTake(before.takeId);
    Mark after = before;
    static_cast<MarkDraft&>(after) = prepareDraft(impl, take, draft);
    after.updatedUtc = store::utcNowIso8601();
    writeMark(impl.db, after);
    impl.record(take.id, id, HistoryAction::MarkChanged, historyDetail(after));
    tx.commit();
    return {before, after, take.id, take.status, take.status};
}

MarkEdit removeMark(Session::Impl& impl, MarkId id, const Mark* asRead) {
    impl.requireWritable("delete a mark");
    WriteTransaction tx(impl.db, "deleting a mark");
    const Mark before = markToChange(impl, id, asRead, "delete a mark");
    const ReviewStatus status = impl.readStatus(before.takeId);
    eraseMark(impl.db, id);
    impl.record(before.takeId, id, HistoryAction::MarkDeleted, historyDetail(before));
    MarkEdit edit{before, std::nullopt, before.takeId, status, status};
    if (status == ReviewStatus::HasMarks && impl.countMarks(before.takeId) == 0) {
        edit.statusAfter = ReviewStatus::InReview;
        impl.writeStatus(before.takeId, edit.statusAfter);
    }
    tx.commit();
    return edit;
}

}  // namespace

MarkEdit Session::updateMark(MarkId id, const MarkDraft& draft) { return changeMark(*impl_, id, nullptr, draft); }
MarkEdit Session::updateMark(const Mark& asRead, const MarkDraft& draft) {
    return changeMark(*impl_, asRead.id, &asRead, draft);
}
MarkEdit Session::deleteMark(MarkId id) { return removeMark(*impl_, id, nullptr); }
MarkEdit Session::deleteMark(const Mark& asRead) { return removeMark(*impl_, asRead.id, &asRead); }

void Session::apply(const MarkEdit& edit) {
    impl_->requireWritable("undo or redo a mark change");
    const MarkId id = edit.markId();
    if (edit.before && edit.after && (edit.before->id != edit.after->id || edit.before->takeId != edit.after->takeId))
        throw ParamError("MarkEdit", "before and after must be the same mark of the same take");
    WriteTransaction tx(impl_->db, "undoing or redoing a mark change");
    const Take take = impl_->readTake(edit.takeId);
    if (impl_->findMark(id) != edit.before)
        throw Error(impl_->db.path, "mark " + std::to_string(id) +
                                        " was changed elsewhere since; this change cannot be undone or redone");
    if (edit.after) {
        if (edit.after->takeId != edit.takeId) throw ParamError("MarkEdit.takeId", "does not match the mark");
        edit.after->validate(take.durationSeconds);
        if (edit.before) writeMark(impl_->db, *edit.after);
        else insertMark(impl_->db, *edit.after);
        impl_->record(edit.takeId, id, edit.before ? HistoryAction::MarkChanged : HistoryAction::MarkAdded,
                      historyDetail(*edit.after));
    } else {
        eraseMark(impl_->db, id);
        if (edit.before) impl_->record(edit.takeId, id, HistoryAction::MarkDeleted, historyDetail(*edit.before));
    }
    // Only restore the status this edit set; a status chosen since is kept.
    if (edit.statusBefore != edit.statusAfter && take.status == edit.statusBefore)
        impl_->writeStatus(edit.takeId, edit.statusAfter);
    tx.commit();
}

Mark Session::mark(MarkId id) const { return impl_->readMark(id); }

std::vector<Mark> Session::marks(std::optional<TakeId> take) const {
    const std::string order = "ORDER BY (SELECT queue_pos FROM takes t WHERE t.id = m.take_id), m.take_id, "
                              "m.start_s, m.id";
    Statement st(impl_->db, std::string(kMarkColumns) + (take ? "WHERE m.take_id = ?1 " : "") + order,
                 "listing marks");
    if (take) {
        impl_->readTake(*take);
        st.bind(1, *take);
    }
    std::vector<Mark> out;
    while (st.step()) out.push_back(markFromRow(impl_->db.path, st));
    return out;
}

}  // namespace earmark
