// An open session as the window sees it: the engine's Session (every change
// committed at once, no save), a cached copy of its queue, and signals when
// takes, marks or tiers change — by this window, or elsewhere (other windows,
// command lines and raters on the same file or server, found by polling the
// review history). Mark and tier changes that the person makes go through
// edit_commands.hpp so they can be undone. A mark is changed or deleted on the
// basis of the mark as the window read it: when someone changed it since, the
// change is refused (problem() names who) rather than overwriting theirs.
//
// Errors: open() throws what Session::open throws (InputError naming the
// file). Other calls catch engine errors and report them through problem()
// and return false / empty, leaving the file as it was.
//
// Thread-safety: GUI thread only.
#pragma once

#include "earmark/store/session.hpp"
#include "earmark/tiers/tier.hpp"

#include <QObject>
#include <QString>

class QTimer;

#include <cstdint>
#include <memory>
#include <optional>
#include <vector>

namespace earmark::widgets {

class SessionDocument : public QObject {
    Q_OBJECT
public:
    // Opens an existing session read-write. Throws InputError / Error.
    explicit SessionDocument(const QString& path, QObject* parent = nullptr);
    ~SessionDocument() override;

    QString path() const;
    // Makes the session record this window's changes for a rater: the name
    // from $EARMARK_RATER, else `settingsName`, else the user name
    // (earmark/marks/rater_name.hpp). False (problem() emitted) for a bad name.
    bool actForRater(const QString& settingsName);
    QString rater() const;
    const std::vector<Take>& takes() const { return takes_; }  // queue order
    const Take* take(TakeId id) const;
    int indexOf(TakeId id) const;  // queue position, −1 when unknown
    bool audioMissing(TakeId id) const;
    // Clean, has-marks or skipped: the take has had its verdict.
    static bool isReviewed(ReviewStatus status);
    int reviewedCount() const;

    bool setStatus(TakeId id, ReviewStatus status);
    bool relocate(TakeId id, const QString& audioPath);

    std::vector<Mark> marks(std::optional<TakeId> take = std::nullopt) const;
    std::optional<Mark> mark(MarkId id) const;
    std::vector<Suspect> suspects(TakeId take) const;

    // The engine's edit on success; empty (and problem() emitted) on failure.
    std::optional<MarkEdit> addMark(TakeId take, const MarkDraft& draft);
    // `asRead`: the mark as the window shows it (see the class comment).
    std::optional<MarkEdit> updateMark(const Mark& asRead, const MarkDraft& draft);
    std::optional<MarkEdit> deleteMark(const Mark& asRead);
    bool applyEdit(const MarkEdit& edit);  // redo
    bool revertEdit(const MarkEdit& edit); // undo

    TierSet tiers(TakeId take) const;  // without confidences (the store keeps none)
    bool setTiers(TakeId take, const TierSet& tiers);

    // How often to look for changes made elsewhere, in milliseconds (0: never).
    // The constructor starts it at kWatchIntervalMs.
    void setWatchInterval(int ms);
    static constexpr int kWatchIntervalMs = 2000;
    // Looks now (what the timer does): emits the signals below for every take
    // changed elsewhere since the last look, then changedElsewhere once.
    void checkForChanges();

signals:
    void takesChanged();                 // statuses, mark counts, audio paths
    void marksChanged(qint64 take);
    // An undo or redo has put a mark back (0 when the mark is gone after it).
    void markRestored(qint64 mark);
    void tiersChanged(qint64 take);
    // Tiers changed elsewhere (tiersChanged is this window's own change).
    void tiersChangedElsewhere(qint64 take);
    // Changes made elsewhere were found (after the signals above): `summary`
    // says who changed what ("ben: 2 marks on ferry-003").
    void changedElsewhere(const QString& summary);
    void problem(const QString& message);

private:
    template <typename F>
    bool attempt(F&& f);
    void reloadTakes();

    std::unique_ptr<Session> session_;
    QTimer* watch_ = nullptr;
    std::int64_t lastSeenChange_ = 0;  // review-history id checkForChanges has looked at
    std::vector<Take> takes_;
    std::vector<bool> missing_;  // parallel to takes_
};

}  // namespace earmark::widgets
