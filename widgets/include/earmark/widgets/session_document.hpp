// An open `.earmark` session as the window sees it: the engine's Session
// (every change committed at once, no save), a cached copy of its queue, and
// signals when takes, marks or tiers change. Mark and tier changes that the
// person makes go through edit_commands.hpp so they can be undone.
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
    std::optional<MarkEdit> updateMark(MarkId id, const MarkDraft& draft);
    std::optional<MarkEdit> deleteMark(MarkId id);
    bool applyEdit(const MarkEdit& edit);  // redo
    bool revertEdit(const MarkEdit& edit); // undo

    TierSet tiers(TakeId take) const;  // without confidences (the store keeps none)
    bool setTiers(TakeId take, const TierSet& tiers);

signals:
    void takesChanged();                 // statuses, mark counts, audio paths
    void marksChanged(qint64 take);
    // An undo or redo has put a mark back (0 when the mark is gone after it).
    void markRestored(qint64 mark);
    void tiersChanged(qint64 take);
    void problem(const QString& message);

private:
    template <typename F>
    bool attempt(F&& f);
    void reloadTakes();

    std::unique_ptr<Session> session_;
    std::vector<Take> takes_;
    std::vector<bool> missing_;  // parallel to takes_
};

}  // namespace earmark::widgets
