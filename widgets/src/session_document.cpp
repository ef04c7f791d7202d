#include "earmark/widgets/session_document.hpp"

#include "earmark/marks/rater_name.hpp"
#include "earmark/store/tier_rows.hpp"

#include <QStringList>
#include <QTimer>

#include <algorithm>
#include <exception>
#include <map>
#include <set>

namespace earmark::widgets {

SessionDocument::SessionDocument(const QString& path, QObject* parent)
    : QObject(parent), session_(std::make_unique<Session>(Session::open(path.toStdString()))),
      watch_(new QTimer(this)) {
    lastSeenChange_ = session_->lastChangeId();
    reloadTakes();
    connect(watch_, &QTimer::timeout, this, &SessionDocument::checkForChanges);
    setWatchInterval(kWatchIntervalMs);
}

SessionDocument::~SessionDocument() = default;

QString SessionDocument::path() const { return QString::fromStdString(session_->path()); }

template <typename F>
bool SessionDocument::attempt(F&& f) {
    try {
        f();
        return true;
    } catch (const std::exception& e) {
        emit problem(QString::fromStdString(e.what()));
        return false;
    }
}

bool SessionDocument::actForRater(const QString& settingsName) {
    return attempt([&] { session_->setRater(resolveRaterName({.settingsName = settingsName.toStdString()})); });
}

QString SessionDocument::rater() const { return QString::fromStdString(session_->rater()); }

void SessionDocument::reloadTakes() {
    takes_ = session_->takes();
    missing_.clear();
    for (const Take& t : takes_) missing_.push_back(!session_->audioExists(t.id));
}

const Take* SessionDocument::take(TakeId id) const {
    const int i = indexOf(id);
    return i < 0 ? nullptr : &takes_[static_cast<std::size_t>(i)];
}

int SessionDocument::indexOf(TakeId id) const {
    for (std::size_t i = 0; i < takes_.size(); ++i)
        if (takes_[i].id == id) return static_cast<int>(i);
    return -1;
}

bool SessionDocument::audioMissing(TakeId id) const {
    const int i = indexOf(id);
    return i >= 0 && missing_[static_cast<std::size_t>(i)];
}

bool SessionDocument::isReviewed(ReviewStatus s) {
    return s == ReviewStatus::Clean || s == ReviewStatus::HasMarks || s == ReviewStatus::Skipped;
}

int SessionDocument::reviewedCount() const {
    int n = 0;
    for (const Take& t : takes_) n += isReviewed(t.status);
    return n;
}

bool SessionDocument::setStatus(TakeId id, ReviewStatus status) {
    const Take* t = take(id);
    if (!t || t->status == status) return false;
    if (!attempt([&] { session_->setStatus(id, status); })) return false;
    reloadTakes();
    emit takesChanged();
    return true;
}

bool SessionDocument::relocate(TakeId id, const QString& audioPath) {
    if (!attempt([&] { session_->relocateTake(id, audioPath.toStdString()); })) return false;
    reloadTakes();
    emit takesChanged();
    return true;
}

std::vector<Mark> SessionDocument::marks(std::optional<TakeId> take) const { return session_->marks(take); }

std::optional<Mark> SessionDocument::mark(MarkId id) const {
    try {
        return session_->mark(id);
    } catch (const std::exception&) {
        return std::nullopt;
    }
}

std::vector<Suspect> SessionDocument::suspects(TakeId take) const { return session_->suspects(take); }

std::optional<MarkEdit> SessionDocument::addMark(TakeId take, const MarkDraft& draft) {
    std::optional<MarkEdit> edit;
    if (!attempt([&] { edit = session_->addMark(take, draft); })) return std::nullopt;
    reloadTakes();
    emit marksChanged(take);
    emit takesChanged();
    return edit;
}

std::optional<MarkEdit> SessionDocument::updateMark(const Mark& asRead, const MarkDraft& draft) {
    std::optional<MarkEdit> edit;
    if (!attempt([&] { edit = session_->updateMark(asRead, draft); })) return std::nullopt;
    reloadTakes();
    emit marksChanged(edit->takeId);
    emit takesChanged();
    return edit;
}

std::optional<MarkEdit> SessionDocument::deleteMark(const Mark& asRead) {
    std::optional<MarkEdit> edit;
    if (!attempt([&] { edit = session_->deleteMark(asRead); })) return std::nullopt;
    reloadTakes();
    emit marksChanged(edit->takeId);
    emit takesChanged();
    return edit;
}

bool SessionDocument::applyEdit(const MarkEdit& edit) {
    if (!attempt([&] { session_->apply(edit); })) return false;
    reloadTakes();
    emit marksChanged(edit.takeId);
    emit takesChanged();
    emit markRestored(edit.after ? edit.after->id : 0);
    return true;
}

bool SessionDocument::revertEdit(const MarkEdit& edit) { return applyEdit(edit.inverse()); }

TierSet SessionDocument::tiers(TakeId take) const {
    const Take* t = this->take(take);
    return toTierSet(session_->tiers(take), t ? std::optional<double>(t->durationSeconds) : std::nullopt);
}

bool SessionDocument::setTiers(TakeId take, const TierSet& tiers) {
    if (!attempt([&] { session_->setTiers(take, toTierRows(tiers)); })) return false;
    emit tiersChanged(take);
    return true;
}

void SessionDocument::setWatchInterval(int ms) {
    if (ms <= 0) {
        watch_->stop();
        return;
    }
    watch_->start(ms);
}

void SessionDocument::checkForChanges() {
    std::vector<HistoryEntry> changes;
    std::int64_t newest = lastSeenChange_;
    // A failed look (server away for a moment) is tried again at the next tick, quietly.
    try {
        newest = session_->lastChangeId();
        if (newest <= lastSeenChange_) return;
        changes = session_->changesElsewhereSince(lastSeenChange_);
    } catch (const std::exception&) {
        return;
    }
    for (const HistoryEntry& e : changes) newest = std::max(newest, e.id);
    lastSeenChange_ = newest;
    if (changes.empty()) return;  // only this window's own changes
    std::set<TakeId> marked, tiered;
    std::map<std::string, std::set<TakeId>> takesByRater;
    for (const HistoryEntry& e : changes) {
        if (e.markId) marked.insert(e.takeId);
        if (e.action == HistoryAction::Tiers) tiered.insert(e.takeId);
        takesByRater[e.rater.empty() ? tr("someone").toStdString() : e.rater].insert(e.takeId);
    }
    reloadTakes();
    emit takesChanged();
    for (TakeId t : marked) emit marksChanged(t);
    for (TakeId t : tiered) emit tiersChangedElsewhere(t);
    QStringList parts;
    for (const auto& [rater, takes] : takesByRater) {
        QStringList names;
        for (TakeId t : takes) {
            const Take* take = this->take(t);
            names << (take && !take->lineId.empty() ? QString::fromStdString(take->lineId) : QString::number(t));
        }
        if (names.size() > 3) names = names.mid(0, 3) << tr("%n more", nullptr, static_cast<int>(takes.size()) - 3);
        parts << tr("%1 changed %2").arg(QString::fromStdString(rater), names.join(", "));
    }
    emit changedElsewhere(parts.join("; "));
}

}  // namespace earmark::widgets
