// A listening session: one `.earmark` file (an SQLite 3 database) holding the
// queue of takes, their tiers, marks, review statuses and suspects. The file
// layout is described in docs/session-store.md.
//
// Team sessions: wherever a path is taken, a PostgreSQL connection URI
// ("postgresql://user@host/db", docs/team-sessions.md) names a session kept
// in that database instead, with the same schema, rules and errors; messages
// show the URI without its password. Writers take turns through one advisory
// lock (like SQLite's write lock); audio paths are stored absolute there.
//
// Durability: every change is one SQLite transaction, committed before the
// call returns; there is no "save". The file is in WAL mode with
// synchronous=FULL, so a committed change survives a crash of the program and
// of the machine (the WAL is fsync'ed at each commit). Other processes (the
// command line, a second window) may open the same file at any time: each
// reader sees the state after some committed transaction, never half of one;
// writers wait for each other up to kBusyTimeoutMs.
//
// Raters: each change made through a Session is written to the review
// history with the rater the Session acts for (setRater) and the time.
//
// Schema versions: PRAGMA user_version holds the version; opening a file with
// an older version upgrades it in one transaction (all steps or none); a file
// from a newer Earmark is refused and left untouched.
//
// Errors: InputError (subject = the session file) for a file that is missing,
// not a session, damaged, from a newer schema, or a take/mark id that does not
// exist; ParamError for an invalid mark, take or suspect field; Error for
// write failures (disk full, read-only location, locked too long). After any
// error the file holds exactly what it held before the failed call.
//
// Thread-safety: a Session is one SQLite connection and must be used by one
// thread at a time. Separate Session objects (in any threads or processes) on
// the same file are safe.
#pragma once

#include "earmark/marks/mark.hpp"
#include "earmark/store/mark_edit.hpp"
#include "earmark/store/review_history.hpp"
#include "earmark/store/suspect.hpp"
#include "earmark/store/take.hpp"

#include <functional>
#include <map>
#include <memory>
#include <optional>
#include <set>
#include <string>
#include <string_view>
#include <vector>

namespace earmark {

enum class OpenMode {
    ReadWrite,  // upgrades an older schema; refuses a read-only file or folder
    ReadOnly,   // never writes; refuses an older schema (it would need an upgrade)
};

class Session {
public:
    static constexpr int kSchemaVersion = 4;
    static constexpr int kBusyTimeoutMs = 5000;

    // Creates a new, empty session file. Refuses (InputError) when `path`
    // exists; Error when the folder is missing or not writable.
    static Session create(const std::string& path);
    static Session open(const std::string& path, OpenMode mode = OpenMode::ReadWrite);
    // Whether `address` holds a session (or anything else) already: a file
    // that exists, or a database with an Earmark schema. InputError when the
    // server cannot be reached.
    static bool exists(const std::string& address);
    // Creates a new session file whole: built under a hidden name beside
    // `path` (".NAME.new-PID"), filled by `fill` and moved into place only
    // after `fill` returned and the file was closed, so a failed or killed
    // command leaves no session at all. Messages name `path`. Refuses
    // (InputError) when `path` exists, now or by the time it would be moved.
    // Leftovers of killed processes (".NAME.new-PID…") are removed first.
    static void createWhole(const std::string& path, const std::function<void(Session&)>& fill);

    // Copies a whole session to a new one, between any two kinds (file →
    // server, server → file, …): every row of every table with its id, the
    // id counters (ids handed out stay handed out), audio paths re-stored for
    // the new place (they resolve to the same files). `to` is created whole
    // (createWhole) or not at all. Returns the number of rows copied per
    // table. InputError when `from` cannot be opened or `to` exists.
    static std::map<std::string, int> copy(const std::string& from, const std::string& to);

    // What Session::salvage copied, and how many rows it could not read.
    struct SalvageReport {
        int takes = 0, tierIntervals = 0, suspects = 0, marks = 0;
        int takesUnreadable = 0;             // take ids whose row could not be read (or that an
                                             // index lists but the table no longer finds)
        int takesWithTiersLost = 0;          // copied takes whose tiers could not all be read (none kept)
        int takesWithSuspectsLost = 0;       // the same for suspects
        int marksUnreadable = 0;             // the same for marks, and marks read back invalid
        int marksOfLostTakes = 0;            // readable marks whose take could not be read
    };
    // Copies every take, tier, suspect and mark that can still be read from a
    // damaged session into a new session file at `newPath` (made whole, see
    // createWhole), keeping every id. Rows are looked up one id at a time, so
    // one damaged page loses only the rows stored on it; a take's tiers or
    // suspects are kept only when all of them could be read. The damaged file
    // is only read. Listening tests are not copied. Refuses (InputError) when
    // `newPath` exists or the damaged file cannot be opened at all.
    static SalvageReport salvage(const std::string& damagedPath, const std::string& newPath);

    Session(Session&&) noexcept;
    Session& operator=(Session&&) noexcept;
    ~Session();

    const std::string& path() const;
    // Runs `change` as one write transaction: every write it makes through
    // this Session lands together when it returns, or not at all when it
    // throws (the exception is passed on) or the process dies. The write
    // lock is held throughout, so keep slow work (analysis, file reads)
    // outside. Calls may nest; only the outermost one commits. `doing`
    // names the change in messages ("writing the scan").
    void inOneTransaction(const std::string& doing, const std::function<void()>& change);
    bool readOnly() const;
    // SQLite's PRAGMA integrity_check: "ok", or its list of problems.
    std::string integrityCheck() const;

    // --- takes ---------------------------------------------------------
    // Probes every audio file (InputError naming the file if it cannot be
    // read) and appends the takes to the end of the queue in one transaction.
    // Refuses (InputError) a file already in the session. Returns the new ids.
    std::vector<TakeId> addTakes(const std::vector<NewTake>& takes);
    std::vector<Take> takes() const;  // queue order
    Take take(TakeId id) const;
    // Finds a take by its id ("3"), its line id ("ferry-003") or its audio
    // file's name ("ferry-003.wav"); empty when nothing matches. Throws
    // InputError when the key matches more than one take.
    std::optional<TakeId> findTake(std::string_view key) const;
    // Whether the take's audio file is where the session says (false after
    // the folder was moved). Its marks stay either way.
    bool audioExists(TakeId id) const;
    // Points a take at a new audio file (probed first). Refuses (InputError)
    // a file shorter than the end of one of the take's marks or tier
    // intervals (beyond 0.5 ms; tiers are never clipped). Returns the
    // previous stored path, for undo.
    std::string relocateTake(TakeId id, const std::string& newAudioPath);
    // For every take whose audio is missing, looks for a file of the same
    // name in `folder` and relocates the take to it, all in one transaction
    // (one refused file relocates nothing). InputError when `folder` is not
    // a folder. Returns how many moved.
    int relocateMissingTakes(const std::string& folder);
    // Returns the previous status, for undo.
    ReviewStatus setStatus(TakeId id, ReviewStatus status);
    // `order` must list every take once. Returns the previous order, for undo.
    std::vector<TakeId> setQueueOrder(const std::vector<TakeId>& order);
    // Replaces all tiers of a take. Returns the previous rows, for undo.
    std::vector<TierRow> setTiers(TakeId id, const std::vector<TierRow>& rows);
    std::vector<TierRow> tiers(TakeId id) const;  // by tier name, then in the order given

    // --- marks ---------------------------------------------------------
    // The draft is validated against the take's duration (ParamError). When
    // the take has a word tier, `words` is filled from it (see wordsCovered);
    // otherwise the draft's words are kept. Measures are stored as given.
    MarkEdit addMark(TakeId take, const MarkDraft& draft);
    MarkEdit updateMark(MarkId id, const MarkDraft& draft);
    MarkEdit deleteMark(MarkId id);
    // The same, for a change based on a mark read earlier (a window shows
    // `asRead` while its rater edits): refused with ConflictError, nothing
    // changed, when the stored mark is no longer `asRead` — another window
    // or rater changed or deleted it since. The message names who and when.
    MarkEdit updateMark(const Mark& asRead, const MarkDraft& draft);
    MarkEdit deleteMark(const Mark& asRead);
    // Redo / undo an edit returned above. Refuses (Error, nothing changed)
    // when the mark is no longer as the edit left it (changed elsewhere).
    void apply(const MarkEdit& edit);
    void revert(const MarkEdit& edit) { apply(edit.inverse()); }
    Mark mark(MarkId id) const;
    // All marks (of one take, when given), by take queue order then start time.
    std::vector<Mark> marks(std::optional<TakeId> take = std::nullopt) const;

    // --- raters, history, assignments ----------------------------------
    // The rater this Session acts for (earmark/marks/rater_name.hpp): written
    // into the history with every mark change, review status and tier edit
    // made through it, as the status's rater, and as the rater of a new mark
    // whose draft names none. "" (the default) records no name. ParamError
    // for a name that is not valid text (checkRaterName).
    void setRater(const std::string& name);
    const std::string& rater() const;
    // The history of the session (of one take, when given), oldest first.
    std::vector<HistoryEntry> history(std::optional<TakeId> take = std::nullopt) const;
    // The history entries after `afterId` (an entry's id; 0 for all), oldest
    // first: what a window polls to show changes made by other windows,
    // command lines and raters (every mark, status and tier change writes one).
    std::vector<HistoryEntry> changesSince(std::int64_t afterId) const;
    // The same without the changes made through this Session object.
    std::vector<HistoryEntry> changesElsewhereSince(std::int64_t afterId) const;
    // The id of the newest history entry; 0 for none.
    std::int64_t lastChangeId() const;
    // Raters who reviewed each take: who made, changed or deleted a mark on
    // it, who set its status to clean or has-marks, and the raters of its
    // marks. Takes nobody named reviewed are absent. (Being assigned a take
    // is not reviewing it.)
    std::map<TakeId, std::set<std::string>> reviewers() const;
    // Replaces every assignment with `assignments` in one transaction.
    // InputError for a take that does not exist; ParamError for a blank or
    // invalid rater name or an assignment listed twice.
    void setAssignments(const std::vector<Assignment>& assignments);
    std::vector<Assignment> assignments() const;  // by take queue order, then rater

    // --- suspects ------------------------------------------------------
    // Replaces the suspects of a take (the scan writes a take's set at once).
    void replaceSuspects(TakeId take, const std::vector<Suspect>& suspects);
    std::vector<Suspect> suspects(std::optional<TakeId> take = std::nullopt) const;

    struct Impl;

private:
    static Session openOnServer(const std::string& uri, OpenMode mode);
    friend class ListeningStore;  // listening tests live in the same file (store/listening_store.hpp)
    explicit Session(std::unique_ptr<Impl> impl);
    std::unique_ptr<Impl> impl_;
};

// Words covered by [start, end] in a word tier: the non-empty labels of the
// intervals of tier "words" (or "word") whose middle lies inside the span;
// when no middle does (a span inside one word, or across a boundary), the
// words the span overlaps. Space-separated, in time order; "" when there is
// no word tier or no word is touched.
std::string wordsCovered(const std::vector<TierRow>& tiers, double startSeconds, double endSeconds);

// For tests and tools that exercise upgrades: creates a new session file at
// an older schema version (1 … Session::kSchemaVersion), with no takes.
void createSessionAtSchemaVersion(const std::string& path, int version);

}  // namespace earmark
