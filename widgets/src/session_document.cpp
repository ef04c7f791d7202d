#include "earmark/widgets/session_document.hpp"

#include "earmark/marks/rater_name.hpp"
#include "earmark/store/tier_rows.hpp"

#include <exception>

namespace earmark::widgets {

SessionDocument::SessionDocument(const QString& path, QObject* parent)
    : QObject(parent), session_(std::make_unique<Session>(Session::open(path.toStdString()))) {
    reloadTakes();
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

std::optional<MarkEdit> SessionDocument::updateMark(MarkId id, const MarkDraft& draft) {
    std::optional<MarkEdit> edit;
    if (!attempt([&] { edit = session_->updateMark(id, draft); })) return std::nullopt;
    reloadTakes();
    emit marksChanged(edit->takeId);
    emit takesChanged();
    return edit;
}

std::optional<MarkEdit> SessionDocument::deleteMark(MarkId id) {
    std::optional<MarkEdit> edit;
    if (!attempt([&] { edit = session_->deleteMark(id); })) return std::nullopt;
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

}  // namespace earmark::widgets
