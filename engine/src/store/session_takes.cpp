// Takes, queue order, review status and tiers.
#include "session_impl.hpp"
#include "earmark/store/utc_clock.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/marks/utf8.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <set>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using store::Statement;
using store::WriteTransaction;

const std::string kTakeColumns = std::string("SELECT t.id, ") + kTakeRowColumns +
                                 ", (SELECT count(*) FROM marks m WHERE m.take_id = t.id), t.status_rater FROM takes t ";

Take takeFromRow(const Session::Impl& impl, const Statement& st) {
    Take t = takeFromColumns(st, 1, st.integer(0), impl.db.path);
    t.audioPath = impl.resolveAudioPath(t.storedAudioPath);
    t.markCount = static_cast<int>(st.integer(12));
    t.statusRater = st.text(13);
    return t;
}

void checkText(const std::string& subject, const std::string& text, std::size_t maxBytes, bool multiLine) {
    if (auto bad = firstInvalidUtf8(text))
        throw ParamError(subject, "is not valid UTF-8 (bad byte at offset " + std::to_string(*bad) + ")");
    if (text.size() > maxBytes)
        throw ParamError(subject, "is longer than " + std::to_string(maxBytes) + " bytes");
    for (char ch : text) {
        const auto c = static_cast<unsigned char>(ch);
        if ((c < 0x20 && c != '\t' && !(multiLine && (c == '\n' || c == '\r'))) || c == 0x7F)
            throw ParamError(subject, "contains a control character");
    }
}

void checkTierRow(const TierRow& row) {
    checkText("TierRow.tier", row.tier, 64, false);
    checkText("TierRow.label", row.label, 1024, false);
    if (row.tier.empty()) throw ParamError("TierRow.tier", "must not be empty");
    if (!std::isfinite(row.startSeconds) || !std::isfinite(row.endSeconds) || row.startSeconds < 0 ||
        row.endSeconds < row.startSeconds)
        throw ParamError("TierRow.endSeconds", "interval '" + row.label + "' of tier " + row.tier +
                                                   " must have 0 <= start <= end");
}

}  // namespace

std::string Session::Impl::storedAudioPath(const std::string& audioPath) const {
    const fs::path absolute = fs::absolute(audioPath).lexically_normal();
    if (folder.empty()) return absolute.generic_string();  // a server session: no folder of its own
    // Lexical (not symlink-resolving), so a folder moved together with its
    // session keeps working even when it was reached through a link.
    const fs::path relative = absolute.lexically_relative(folder);
    return (relative.empty() ? absolute : relative).generic_string();
}

std::string Session::Impl::resolveAudioPath(const std::string& stored) const {
    const fs::path p(stored);
    return (p.is_absolute() ? p : (folder / p)).lexically_normal().string();
}

Take Session::Impl::readTake(TakeId id) const {
    Statement st(db, kTakeColumns + "WHERE t.id = ?1", "reading a take");
    st.bind(1, id);
    if (!st.step()) throw InputError(db.path, "has no take with id " + std::to_string(id));
    return takeFromRow(*this, st);
}

ReviewStatus Session::Impl::readStatus(TakeId id) const { return readTake(id).status; }

void Session::Impl::writeStatus(TakeId id, ReviewStatus status) {
    Statement st(db, "UPDATE takes SET status = ?1, status_utc = ?2, status_rater = ?3 WHERE id = ?4",
                 "changing a review status");
    st.bind(1, reviewStatusName(status)).bind(2, store::utcNowIso8601()).bind(3, rater).bind(4, id).run();
    record(id, std::nullopt, HistoryAction::Status, std::string(reviewStatusName(status)));
}

int Session::Impl::countMarks(TakeId id) const {
    Statement st(db, "SELECT count(*) FROM marks WHERE take_id = ?1", "counting marks");
    st.bind(1, id);
    st.step();
    return static_cast<int>(st.integer(0));
}

std::vector<TierRow> Session::Impl::readTiers(TakeId id) const {
    Statement st(db,
                 "SELECT tier, start_s, end_s, label FROM tier_intervals WHERE take_id = ?1 "
                 "ORDER BY tier, position",
                 "reading tiers");
    st.bind(1, id);
    std::vector<TierRow> rows;
    while (st.step()) rows.push_back({st.text(0), st.real(1), st.real(2), st.text(3)});
    return rows;
}

std::vector<TakeId> Session::addTakes(const std::vector<NewTake>& newTakes) {
    impl_->requireWritable("add takes");
    struct Prepared {
        const NewTake* take;
        AudioInfo info;
        std::string stored;
    };
    std::vector<Prepared> prepared;
    std::set<std::string> batch;
    for (const NewTake& t : newTakes) {
        checkText("Take.text", t.text, 65536, true);
        checkText("Take.build", t.build, 200, false);
        checkText("Take.lineId", t.lineId, 200, false);
        // Probing first keeps slow file reads outside the write lock.
        Prepared p{&t, probeAudio(t.audioPath), impl_->storedAudioPath(t.audioPath)};
        if (!(p.info.durationSeconds() > 0)) throw InputError(t.audioPath, "has no samples");
        if (!batch.insert(p.stored).second)
            throw InputError(t.audioPath, "is listed twice; nothing was added");
        prepared.push_back(std::move(p));
    }
    WriteTransaction tx(impl_->db, "adding takes");
    Statement exists(impl_->db, "SELECT id FROM takes WHERE audio_path = ?1", "adding takes");
    Statement insert(impl_->db,
                     "INSERT INTO takes (queue_pos, audio_path, line_id, text, build, duration_s, sample_rate, "
                     "channels, added_utc) VALUES ((SELECT coalesce(max(queue_pos) + 1, 0) FROM takes), "
                     "?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8)",
                     "adding takes");
    std::vector<TakeId> ids;
    const std::string now = store::utcNowIso8601();
    for (const Prepared& p : prepared) {
        exists.bind(1, p.stored);
        if (exists.step())
            throw InputError(p.take->audioPath, "is already in " + impl_->db.path + " as take " +
                                                    std::to_string(exists.integer(0)) + "; nothing was added");
        exists.reset();
        insert.bind(1, p.stored).bind(2, p.take->lineId).bind(3, p.take->text).bind(4, p.take->build);
        insert.bind(5, p.info.durationSeconds()).bind(6, p.info.sampleRate).bind(7, p.info.channels).bind(8, now);
        insert.run();
        insert.reset();
        ids.push_back(impl_->db.lastInsertId());
    }
    tx.commit();
    return ids;
}

std::vector<Take> Session::takes() const {
    Statement st(impl_->db, kTakeColumns + "ORDER BY t.queue_pos, t.id", "listing takes");
    std::vector<Take> out;
    while (st.step()) out.push_back(takeFromRow(*impl_, st));
    return out;
}

Take Session::take(TakeId id) const { return impl_->readTake(id); }

std::optional<TakeId> Session::findTake(std::string_view key) const {
    if (key.empty()) return std::nullopt;
    if (std::all_of(key.begin(), key.end(), [](char c) { return c >= '0' && c <= '9'; }) && key.size() < 18) {
        Statement st(impl_->db, "SELECT id FROM takes WHERE id = ?1", "finding a take");
        st.bind(1, static_cast<std::int64_t>(std::stoll(std::string(key))));
        if (st.step()) return st.integer(0);
    }
    const std::vector<Take> all = takes();
    auto unique = [&](auto&& matches) -> std::optional<TakeId> {
        std::vector<TakeId> found;
        for (const Take& t : all)
            if (matches(t)) found.push_back(t.id);
        if (found.size() > 1) {
            std::string ids;
            for (TakeId id : found) ids += (ids.empty() ? "" : ", ") + std::to_string(id);
            throw InputError(impl_->db.path, "'" + std::string(key) + "' matches several takes (ids " + ids +
                                                 "); use the take id");
        }
        return found.empty() ? std::nullopt : std::optional<TakeId>(found.front());
    };
    if (auto id = unique([&](const Take& t) { return t.lineId == key; })) return id;
    if (auto id = unique([&](const Take& t) { return t.storedAudioPath == key; })) return id;
    // The trailing folders and name ("takes/b.wav"): a server session stores absolute paths.
    const std::string tail = "/" + std::string(key);
    if (auto id = unique([&](const Take& t) {
            return t.storedAudioPath.size() > tail.size() &&
                   t.storedAudioPath.compare(t.storedAudioPath.size() - tail.size(), tail.size(), tail) == 0;
        }))
        return id;
    return unique([&](const Take& t) { return fs::path(t.storedAudioPath).filename() == fs::path(key); });
}

bool Session::audioExists(TakeId id) const {
    std::error_code ec;
    return fs::is_regular_file(impl_->readTake(id).audioPath, ec);
}

std::string Session::relocateTake(TakeId id, const std::string& newAudioPath) {
    impl_->requireWritable("relocate a take");
    const AudioInfo info = probeAudio(newAudioPath);
    const std::string stored = impl_->storedAudioPath(newAudioPath);
    WriteTransaction tx(impl_->db, "relocating a take");
    const Take old = impl_->readTake(id);
    Statement other(impl_->db, "SELECT id FROM takes WHERE audio_path = ?1 AND id <> ?2", "relocating a take");
    other.bind(1, stored).bind(2, id);
    if (other.step())
        throw InputError(newAudioPath, "is already take " + std::to_string(other.integer(0)) + " of " +
                                           impl_->db.path);
    Statement lastEnd(impl_->db, "SELECT max(end_s) FROM marks WHERE take_id = ?1", "relocating a take");
    lastEnd.bind(1, id);
    if (lastEnd.step() && lastEnd.real(0) > info.durationSeconds() + MarkDraft::kEndToleranceSeconds)
        throw InputError(newAudioPath, "lasts " + std::to_string(info.durationSeconds()) +
                                           " s, shorter than the marks of take " + std::to_string(id) +
                                           " (up to " + std::to_string(lastEnd.real(0)) + " s); not relocated");
    // Tiers are refused the same way, not clipped: a cut word tier would
    // silently misplace every word after the cut.
    Statement lastTier(impl_->db, "SELECT max(end_s) FROM tier_intervals WHERE take_id = ?1", "relocating a take");
    lastTier.bind(1, id);
    if (lastTier.step() && lastTier.real(0) > info.durationSeconds() + MarkDraft::kEndToleranceSeconds)
        throw InputError(newAudioPath, "lasts " + std::to_string(info.durationSeconds()) +
                                           " s, shorter than the tiers of take " + std::to_string(id) + " (up to " +
                                           std::to_string(lastTier.real(0)) +
                                           " s); not relocated. Store tiers that fit it first (session tiers "
                                           "--replace)");
    Statement update(impl_->db,
                     "UPDATE takes SET audio_path = ?1, duration_s = ?2, sample_rate = ?3, channels = ?4 "
                     "WHERE id = ?5",
                     "relocating a take");
    update.bind(1, stored).bind(2, info.durationSeconds()).bind(3, info.sampleRate).bind(4, info.channels);
    update.bind(5, id).run();
    tx.commit();
    return old.storedAudioPath;
}

int Session::relocateMissingTakes(const std::string& folder) {
    std::error_code ec;
    if (!fs::is_directory(folder, ec)) throw InputError(folder, "is not a folder (missing?); nothing was relocated");
    int moved = 0;
    inOneTransaction("relocating takes", [&] {
        for (const Take& t : takes()) {
            if (fs::is_regular_file(t.audioPath, ec)) continue;
            const fs::path candidate = fs::path(folder) / fs::path(t.storedAudioPath).filename();
            if (!fs::is_regular_file(candidate, ec)) continue;
            relocateTake(t.id, candidate.string());
            ++moved;
        }
    });
    return moved;
}

ReviewStatus Session::setStatus(TakeId id, ReviewStatus status) {
    impl_->requireWritable("change a review status");
    WriteTransaction tx(impl_->db, "changing a review status");
    const ReviewStatus previous = impl_->readStatus(id);
    impl_->writeStatus(id, status);
    tx.commit();
    return previous;
}

std::vector<TakeId> Session::setQueueOrder(const std::vector<TakeId>& order) {
    impl_->requireWritable("reorder the queue");
    WriteTransaction tx(impl_->db, "reordering the queue");
    std::vector<TakeId> previous;
    for (const Take& t : takes()) previous.push_back(t.id);
    std::vector<TakeId> a = previous, b = order;
    std::sort(a.begin(), a.end());
    std::sort(b.begin(), b.end());
    if (a != b) throw ParamError("Session.setQueueOrder", "the new order must list every take exactly once");
    Statement st(impl_->db, "UPDATE takes SET queue_pos = ?1 WHERE id = ?2", "reordering the queue");
    for (std::size_t i = 0; i < order.size(); ++i) {
        st.bind(1, static_cast<std::int64_t>(i)).bind(2, order[i]).run();
        st.reset();
    }
    tx.commit();
    return previous;
}

std::vector<TierRow> Session::setTiers(TakeId id, const std::vector<TierRow>& rows) {
    impl_->requireWritable("change tiers");
    for (const TierRow& row : rows) checkTierRow(row);
    WriteTransaction tx(impl_->db, "writing tiers");
    impl_->readTake(id);  // throws when there is no such take
    std::vector<TierRow> previous = impl_->readTiers(id);
    Statement clear(impl_->db, "DELETE FROM tier_intervals WHERE take_id = ?1", "writing tiers");
    clear.bind(1, id).run();
    // Rows keep their given order within each tier (position).
    Statement insert(impl_->db,
                     "INSERT INTO tier_intervals (take_id, tier, position, start_s, end_s, label) "
                     "VALUES (?1, ?2, ?3, ?4, ?5, ?6)",
                     "writing tiers");
    std::map<std::string, std::int64_t> positions;
    for (const TierRow& row : rows) {
        insert.bind(1, id).bind(2, row.tier).bind(3, positions[row.tier]++).bind(4, row.startSeconds);
        insert.bind(5, row.endSeconds).bind(6, row.label).run();
        insert.reset();
    }
    impl_->record(id, std::nullopt, HistoryAction::Tiers, std::to_string(rows.size()) + " intervals");
    tx.commit();
    return previous;
}

std::vector<TierRow> Session::tiers(TakeId id) const {
    store::ReadTransaction read(impl_->db);
    impl_->readTake(id);
    return impl_->readTiers(id);
}

Take takeFromColumns(const Statement& st, int first, TakeId id, const std::string& dbPath) {
    Take t;
    t.id = id;
    t.queuePosition = static_cast<int>(st.integer(first));
    t.storedAudioPath = st.text(first + 1);
    t.lineId = st.text(first + 2);
    t.text = st.text(first + 3);
    t.build = st.text(first + 4);
    const auto status = parseReviewStatus(st.text(first + 5));
    if (!status) throw InputError(dbPath, "take " + std::to_string(id) + " has an unknown status");
    t.status = *status;
    t.statusUtc = st.text(first + 6);
    t.durationSeconds = st.real(first + 7);
    t.sampleRate = st.real(first + 8);
    t.channels = static_cast<int>(st.integer(first + 9));
    t.addedUtc = st.text(first + 10);
    return t;
}

}  // namespace earmark
