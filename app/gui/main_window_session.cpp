// The window's review side: the session's queue and statuses, marks (lane,
// palette, inspector, list), tiers (lanes and their edits) and suspects. Every
// change to marks and tiers goes through the one undo stack.
#include "main_window.hpp"

#include "earmark/acoustic/evidence_review.hpp"
#include "earmark/core/error.hpp"
#include "earmark/store/tier_rows.hpp"
#include "earmark/tiers/timings_csv.hpp"
#include "earmark/tiers/timings_file.hpp"
#include "earmark/tiers/timings_json.hpp"
#include "earmark/widgets/align_dialog.hpp"
#include "earmark/widgets/edit_commands.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/mark_inspector.hpp"
#include "earmark/widgets/mark_lane.hpp"
#include "earmark/widgets/mark_list.hpp"
#include "earmark/widgets/mark_palette.hpp"
#include "earmark/widgets/mark_snapshot.hpp"
#include "earmark/widgets/review_queue.hpp"
#include "earmark/widgets/session_document.hpp"
#include "earmark/widgets/suspect_lane.hpp"
#include "earmark/widgets/tier_editing.hpp"
#include "earmark/widgets/transport.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "earmark/widgets/view_state.hpp"

#include <QDockWidget>
#include <QFile>
#include <QFileDialog>
#include <QFileInfo>
#include <QListWidget>
#include <QSettings>
#include <QStackedWidget>
#include <QUndoStack>

#include <cmath>

namespace earmark::gui {

using namespace earmark::widgets;

void MainWindow::buildSessionPanels() {
    align_ = new AlignDialog(this);
    connect(align_, &AlignDialog::aligned, this, &MainWindow::onAligned);
    connect(align_, &AlignDialog::failed, this, [this](const QString& m) { notify(tr("Alignment failed: %1").arg(m), 8000); });
    palette_ = new MarkPalette(this);
    connect(palette_, &MarkPalette::chosen, this, &MainWindow::createMark);

    inspector_ = new MarkInspector(this);
    addPanel(tr("Mark"), "markDock", inspector_, Qt::RightDockWidgetArea);
    connect(inspector_, &MarkInspector::draftEdited, this, [this](qint64 id, const MarkDraft& d) { editMark(id, d); });
    connect(view_, &ViewState::selectionChanged, this, &MainWindow::showSelectionMeasures);

    markList_ = new MarkList(this);
    addPanel(tr("Marks of the session"), "markListDock", markList_, Qt::BottomDockWidgetArea);
    connect(markList_, &MarkList::markChosen, this, [this](qint64 id) { goToMark(id, false); });
    connect(markList_, &MarkList::markPlayRequested, this, [this](qint64 id) { goToMark(id, true); });
    connect(undo_, &QUndoStack::cleanChanged, this, [this] { updateTitle(); });
}

TierLane* MainWindow::tierLane(const QString& tierName) const {
    for (TierLane* l : tierLanes_)
        if (l->tierName() == tierName) return l;
    return nullptr;
}

TierLane* MainWindow::activeTier() const { return activeTier_ ? activeTier_ : tierLanes_.front(); }

bool MainWindow::tiersUnsaved() const { return !session_ && !tiers_.tiers.empty() && !undo_->isClean(); }

bool MainWindow::openSession(const QString& path) {
    SessionDocument* doc = nullptr;
    try {
        doc = new SessionDocument(path, this);
    } catch (const std::exception& e) {
        notify(QString::fromStdString(e.what()));
        return false;
    }
    if (session_) session_->deleteLater();
    session_ = doc;
    session_->actForRater(QSettings().value("review/rater").toString());  // who the changes are recorded for
    undo_->clear();
    connect(session_, &SessionDocument::problem, this, [this](const QString& m) { notify(m, 8000); });
    connect(session_, &SessionDocument::marksChanged, this, [this](qint64 take) {
        if (currentTake_ && *currentTake_ == take) showMarks();
    });
    connect(session_, &SessionDocument::markRestored, this, [this](qint64 id) {
        const auto m = id ? session_->mark(id) : std::nullopt;
        if (m && currentTake_ && m->takeId == *currentTake_) selectMark(id);
    });
    // Changes made elsewhere (other windows, command lines, raters) are shown as they come.
    connect(session_, &SessionDocument::takesChanged, this, [this] { syncTakesFromSession(); });
    connect(session_, &SessionDocument::tiersChangedElsewhere, this,
            [this](qint64 take) { showTiersChangedElsewhere(take); });
    connect(session_, &SessionDocument::changedElsewhere, this, [this](const QString& summary) { notify(summary, 6000); });
    currentRow_ = -1;
    currentTake_.reset();
    syncTakesFromSession();
    queue_->setDocument(session_);
    markList_->setDocument(session_);
    takePanel_->setCurrentWidget(queue_);
    if (auto* dock = findChild<QDockWidget*>("takeDock")) dock->show();
    if (auto* dock = findChild<QDockWidget*>("markDock")) dock->show();
    updateSessionActions();
    if (!takes_.empty()) selectTake(0);
    else notify(tr("The session has no takes yet: add them with earmark-cli session add."));
    return true;
}

void MainWindow::syncTakesFromSession() {
    if (!session_) return;
    takes_.clear();
    takeIds_.clear();
    for (const Take& t : session_->takes()) {
        takes_.push_back({QString::fromStdString(t.lineId.empty() ? std::to_string(t.id) : t.lineId),
                          QString::fromStdString(t.audioPath), QString::fromStdString(t.text)});
        takeIds_.push_back(t.id);
    }
    if (currentTake_) currentRow_ = session_->indexOf(*currentTake_);  // the queue may have been reordered
}

void MainWindow::showTiersChangedElsewhere(TakeId take) {
    if (!session_ || !currentTake_ || *currentTake_ != take) return;
    const TierSet stored = session_->tiers(take);
    // This window's own edits are already shown (with confidences the store does not keep).
    if (toTierRows(stored) == toTierRows(tiers_)) return;
    tiers_ = stored;
    // Undoing an older tier edit now would overwrite the other rater's change.
    undo_->clear();
    showTiers();
    notify(tr("The tiers of this take were changed elsewhere: showing them now (undo history cleared)."), 6000);
}

bool MainWindow::showSessionTake(const QString& key) {
    if (!session_) return false;
    for (std::size_t i = 0; i < takes_.size(); ++i)
        if (takes_[i].id == key || QString::number(takeIds_[i]) == key || QFileInfo(takes_[i].audio).fileName() == key) {
            if (static_cast<int>(i) != currentRow_) selectTake(static_cast<int>(i));
            return true;
        }
    return false;
}

void MainWindow::openSessionDialog() {
    const QString path = QFileDialog::getOpenFileName(this, tr("Open session"), {}, tr("Earmark sessions (*.earmark)"));
    if (!path.isEmpty()) openSession(path);
}

void MainWindow::updateTitle() {
    QString name = currentRow_ >= 0 && currentRow_ < static_cast<int>(takes_.size())
                       ? takes_[static_cast<std::size_t>(currentRow_)].id
                       : QString();
    if (tiersUnsaved()) name += tr(" (timings not saved)");
    QString title = name.isEmpty() ? tr("Earmark") : tr("%1 — Earmark").arg(name);
    if (session_) title += tr(" — %1").arg(QFileInfo(session_->path()).fileName());
    setWindowTitle(title);
}

void MainWindow::updateSessionActions() {
    const bool loaded = audio_ != nullptr;
    for (QAction* a : sessionActions_) a->setEnabled(session_ != nullptr);
    for (QAction* a : markActions_) a->setEnabled(session_ && loaded);
    for (QAction* a : tierActions_) a->setEnabled(loaded);
    if (saveTimingsAction_) saveTimingsAction_->setEnabled(loaded && !session_ && !tiers_.tiers.empty());
}

// --- review status -------------------------------------------------------

void MainWindow::setTakeStatus(ReviewStatus status) {
    if (!session_ || !currentTake_) return;
    if (session_->setStatus(*currentTake_, status))
        notify(tr("%1: %2 — %3").arg(takes_[static_cast<std::size_t>(currentRow_)].id, statusLabel(status), queue_->progressText()), 4000);
}

void MainWindow::locateAudio() {
    if (!session_ || !currentTake_) return;
    const Take* t = session_->take(*currentTake_);
    if (!t) return;
    const QString path = QFileDialog::getOpenFileName(
        this, tr("Where is %1 now?").arg(QFileInfo(QString::fromStdString(t->audioPath)).fileName()),
        QFileInfo(session_->path()).absolutePath(), tr("Audio (*.wav *.flac *.ogg *.aiff *.aif);;All files (*)"));
    if (path.isEmpty() || !session_->relocate(*currentTake_, path)) return;
    const int row = currentRow_;
    takes_[static_cast<std::size_t>(row)].audio = QString::fromStdString(session_->take(*currentTake_)->audioPath);
    currentRow_ = -1;
    selectTake(row);
}

// --- marks ---------------------------------------------------------------

MeasureSnapshot MainWindow::measuresFor(double start, double end) const {
    if (!tracks_ || !audio_) return {};
    const std::string text = currentRow_ >= 0 ? takes_[static_cast<std::size_t>(currentRow_)].text.toStdString() : std::string();
    return snapshotForSpan(*tracks_, audio_->duration(), tiers_, text, start, end);
}

void MainWindow::showSelectionMeasures() {
    const std::optional<TimeRange> selection = view_->selection();
    if (!selection || !tracks_) {
        inspector_->setSelection(std::nullopt);
        return;
    }
    inspector_->setSelection(std::make_pair(selection->start, selection->end), measuresFor(selection->start, selection->end));
}

void MainWindow::showMarks() {
    markLane_->setHint(session_ ? tr("no marks: select a span or a word, then press N")
                                : tr("marks are kept in a session (File ▸ Open session…)"));
    suspectLane_->setHint(session_ ? tr("no suspects from the scan") : tr("suspects come with a scanned session or the take's text"));
    if (session_ && currentTake_) {
        markLane_->setMarks(session_->marks(*currentTake_));
        suspectLane_->setSuspects(mergeSuspects(session_->suspects(*currentTake_), evidenceSuspectsShown()));
    } else {
        markLane_->setMarks({});
        suspectLane_->setSuspects(evidenceSuspectsShown());
    }
    if (selectedMark_ && session_) {
        const auto m = session_->mark(*selectedMark_);
        if (!m || !currentTake_ || m->takeId != *currentTake_) selectedMark_.reset();
        markLane_->setSelectedMark(selectedMark_);
        inspector_->setMark(selectedMark_ ? m : std::nullopt);
    } else {
        selectedMark_.reset();
        markLane_->setSelectedMark(std::nullopt);
        inspector_->setMark(std::nullopt);
    }
}

void MainWindow::selectMark(std::optional<MarkId> id) {
    selectedMark_ = id;
    markLane_->setSelectedMark(id);
    inspector_->setMark(id && session_ ? session_->mark(*id) : std::nullopt);
}

void MainWindow::openMarkPalette() {
    if (!session_ || !currentTake_ || !audio_) {
        notify(tr("Marks are kept in a session: open one with %1.")
                   .arg(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_O).toString(QKeySequence::NativeText)), 5000);
        return;
    }
    std::optional<TimeRange> span = view_->selection();
    if (!span) {
        // No selection: the word under the cursor.
        if (const Tier* words = tiers_.find(kWordsTier)) {
            const int i = intervalAt(*words, view_->cursor());
            if (i >= 0) span = TimeRange{words->intervals[static_cast<std::size_t>(i)].startS,
                                         words->intervals[static_cast<std::size_t>(i)].endS};
        }
    }
    if (!span) {
        notify(tr("Select a span or click a word first, then make the mark."), 4000);
        return;
    }
    view_->setSelection(span);
    const std::string words = wordsCovered(toTierRows(tiers_), span->start, span->end);
    palette_->begin(tr("%1–%2 s%3").arg(span->start, 0, 'f', 3).arg(span->end, 0, 'f', 3)
                        .arg(words.empty() ? QString() : " · " + QString::fromStdString(words)));
}

void MainWindow::createMark(const MarkChoice& choice) {
    const auto span = view_->selection();
    if (!session_ || !currentTake_ || !span) return;
    MarkDraft d;
    d.category = choice.category;
    d.subtype = choice.subtype;
    d.severity = choice.severity;
    d.startSeconds = span->start;
    d.endSeconds = std::min(span->end, audio_ ? audio_->duration() : span->end);
    d.measures = measuresFor(d.startSeconds, d.endSeconds);
    const auto edit = session_->addMark(*currentTake_, d);
    if (!edit) return;
    undo_->push(new MarkCommand(session_, *edit));
    selectMark(edit->markId());
    notify(tr("Marked %1 (%2 undoes)").arg(describeMarkEdit(*edit).section(' ', 1),
                                            QKeySequence(QKeySequence::Undo).toString(QKeySequence::NativeText)), 4000);
}

std::optional<Mark> MainWindow::shownMark(MarkId id) const {
    if (inspector_->mark() && inspector_->mark()->id == id) return inspector_->mark();
    for (const Mark& m : markLane_->marks())
        if (m.id == id) return m;
    return session_ ? session_->mark(id) : std::nullopt;
}

void MainWindow::editMark(MarkId id, const MarkDraft& draft) {
    if (!session_) return;
    const std::optional<Mark> asRead = shownMark(id);
    if (!asRead) return;
    const auto edit = session_->updateMark(*asRead, draft);
    if (!edit) {
        showMarks();  // put the lane and inspector back to the stored mark
        return;
    }
    undo_->push(new MarkCommand(session_, *edit));
    selectMark(id);
}

void MainWindow::deleteSelectedMark() {
    if (!session_ || !selectedMark_) {
        notify(tr("Click a mark first."), 3000);
        return;
    }
    const std::optional<Mark> asRead = shownMark(*selectedMark_);
    const auto edit = asRead ? session_->deleteMark(*asRead) : std::nullopt;
    if (!edit) {
        showMarks();  // gone or changed elsewhere: show it as it is now
        return;
    }
    undo_->push(new MarkCommand(session_, *edit));
    selectMark(std::nullopt);
}

void MainWindow::goToMark(MarkId id, bool playIt) {
    if (!session_) return;
    const auto m = session_->mark(id);
    if (!m) return;
    if (!currentTake_ || *currentTake_ != m->takeId || !audio_) {
        pendingMark_ = id;
        pendingPlay_ = playIt;
        const int row = session_->indexOf(m->takeId);
        if (row >= 0 && row != currentRow_) selectTake(row);
        return;
    }
    jumpTo(m->startSeconds, m->endSeconds);
    selectMark(id);
    if (playIt) play(static_cast<int>(PlayMode::Selection));
}

// --- tiers ---------------------------------------------------------------

void MainWindow::showTiers() {
    for (TierLane* lane : tierLanes_) {
        const Tier* t = tiers_.find(lane->tierName().toStdString());
        lane->setTier(t ? *t : Tier{lane->tierName().toStdString(), {}});
    }
    showOutline();
    if (saveTimingsAction_) updateSessionActions();
}

void MainWindow::storeTiers(std::optional<TakeId> take, const TierSet& tiers) {
    if (session_ && take) session_->setTiers(*take, tiers);  // written at once: nothing to save
    const bool current = session_ ? (take && currentTake_ && *take == *currentTake_) : true;
    if (!current) return;
    tiers_ = tiers;
    showTiers();
    updateTitle();
}

void MainWindow::editTiers(const QString& description, const TierSet& after) {
    const std::optional<TakeId> take = currentTake_;
    undo_->push(new TierCommand(description, tiers_, after, [this, take](const TierSet& s) { storeTiers(take, s); }));
}

void MainWindow::editTier(const QString& description, const Tier& after) {
    TierSet set = tiers_;
    set.getOrAdd(after.name) = after;
    editTiers(description, set);
}

bool MainWindow::openTimings(const QString& path) {
    if (!audio_) {
        notify(tr("Open a take first; timings belong to a take."), 5000);
        return false;
    }
    try {
        TimingsReadOptions options;
        options.takeDurationS = audio_->duration();
        LoadedTimings loaded = loadTimings(path.toStdString(), options);
        loaded.tiers.durationS = audio_->duration();
        editTiers(tr("open timings %1").arg(QFileInfo(path).fileName()), loaded.tiers);
        if (!session_) {
            timingsPath_ = path;
            undo_->setClean();
        }
        notify(loaded.warnings.empty() ? tr("Read %1").arg(QFileInfo(path).fileName())
                                       : tr("Read %1 with %2 warnings (first: %3)")
                                             .arg(QFileInfo(path).fileName())
                                             .arg(loaded.warnings.size())
                                             .arg(QString::fromStdString(loaded.warnings.front())),
               6000);
        return true;
    } catch (const std::exception& e) {
        notify(QString::fromStdString(e.what()));
        return false;
    }
}

void MainWindow::openTimingsDialog() {
    QString start = timingsPath_;
    if (start.isEmpty() && audio_) start = QFileInfo(audio_->path).absolutePath();
    const QString path = QFileDialog::getOpenFileName(this, tr("Open timings"), start,
                                                      tr("Timings (*.json *.csv *.vtt);;All files (*)"));
    if (!path.isEmpty()) openTimings(path);
}

void MainWindow::saveTimings() {
    if (session_ || tiers_.tiers.empty()) return;
    QString path = timingsPath_;
    const QString suffix = QFileInfo(path).suffix().toLower();
    if (path.isEmpty() || (suffix != "json" && suffix != "csv")) {
        const QString suggestion = audio_ ? QFileInfo(audio_->path).absolutePath() + "/" +
                                                QFileInfo(audio_->path).completeBaseName() + ".json"
                                          : QString();
        path = QFileDialog::getSaveFileName(this, tr("Save timings"), suggestion, tr("Earmark timings (*.json);;CSV (*.csv)"));
        if (path.isEmpty()) return;
    }
    const bool csv = QFileInfo(path).suffix().toLower() == "csv";
    const std::string text = csv ? timingsToCsv(tiers_) : timingsToJson(tiers_);
    QFile f(path);
    if (!f.open(QIODevice::WriteOnly | QIODevice::Truncate) ||
        f.write(text.data(), static_cast<qint64>(text.size())) != static_cast<qint64>(text.size())) {
        notify(tr("%1: cannot write (%2)").arg(path, f.errorString()));
        return;
    }
    timingsPath_ = path;
    undo_->setClean();
    notify(tr("Saved %1").arg(path), 4000);
}

double MainWindow::snapTime(double t) const {
    if (!snapToZero_ || !audio_ || audio_->signal.empty()) return t;
    // Nearest sign change within ±5 ms (common practice: cutting at a zero
    // crossing avoids a click).
    const auto& x = audio_->signal.samples;
    const double rate = audio_->signal.sampleRate;
    const long centre = std::lround(t * rate);
    const long reach = std::lround(0.005 * rate);
    for (long d = 0; d <= reach; ++d)
        for (long i : {centre - d, centre + d}) {
            if (i <= 0 || i >= static_cast<long>(x.size())) continue;
            if ((x[static_cast<std::size_t>(i - 1)] < 0.0f) != (x[static_cast<std::size_t>(i)] < 0.0f)) return i / rate;
        }
    return t;
}

void MainWindow::splitAtCursor() {
    TierLane* lane = activeTier();
    if (auto t = splitAt(lane->tier(), view_->cursor())) editTier(tr("split %1 interval").arg(lane->tierName()), *t);
    else notify(tr("No %1 interval at the cursor to split.").arg(lane->tierName()), 3000);
}

void MainWindow::mergeWithNext() {
    TierLane* lane = activeTier();
    const int i = intervalAt(lane->tier(), view_->cursor());
    const std::string joiner = lane->tierName() == "words" ? " " : "";
    if (auto t = widgets::mergeWithNext(lane->tier(), i, joiner)) editTier(tr("merge %1 intervals").arg(lane->tierName()), *t);
    else notify(tr("Put the cursor in a %1 interval that has a next one.").arg(lane->tierName()), 3000);
}

void MainWindow::editLabelAtCursor() {
    TierLane* lane = activeTier();
    const int i = intervalAt(lane->tier(), view_->cursor());
    if (i < 0) notify(tr("No %1 interval at the cursor.").arg(lane->tierName()), 3000);
    else lane->editLabel(i);
}

void MainWindow::insertIntervalOverSelection() {
    TierLane* lane = activeTier();
    const auto sel = view_->selection();
    std::optional<Tier> t;
    if (sel) t = insertInterval(lane->tier(), sel->start, sel->end);
    if (!t) {
        notify(tr("Select a span in a gap of the %1 tier first.").arg(lane->tierName()), 3000);
        return;
    }
    editTier(tr("insert %1 interval").arg(lane->tierName()), *t);
    lane->editLabel(intervalAt(lane->tier(), 0.5 * (sel->start + sel->end)));
}

void MainWindow::deleteIntervalAtCursor() {
    TierLane* lane = activeTier();
    if (auto t = removeInterval(lane->tier(), intervalAt(lane->tier(), view_->cursor())))
        editTier(tr("delete %1 interval").arg(lane->tierName()), *t);
    else notify(tr("No %1 interval at the cursor.").arg(lane->tierName()), 3000);
}

void MainWindow::openAlignDialog() {
    if (!audio_) return;
    align_->begin(audio_, currentRow_ >= 0 ? takes_[static_cast<std::size_t>(currentRow_)].text : QString());
}

void MainWindow::onAligned(const QString& audioPath, const AlignResult& result) {
    if (!audio_ || audio_->path != audioPath) return;  // the take changed meanwhile
    TierSet set = tiers_;
    for (const Tier& t : result.tiers.tiers) set.getOrAdd(t.name) = t;
    set.durationS = audio_->duration();
    editTiers(tr("align words from text"), set);
    int doubtful = 0, count = 0;
    if (const Tier* words = result.tiers.find(kWordsTier))
        for (const Interval& w : words->intervals) {
            ++count;
            doubtful += w.confidence && *w.confidence < kLowConfidence;
        }
    notify(tr("Aligned %1 words with %2 (mean confidence %3); %4 doubtful, tinted in the words lane")
               .arg(count)
               .arg(QString::fromStdString(result.voiceName))
               .arg(result.meanConfidence, 0, 'f', 2)
               .arg(doubtful),
           8000);
}

}  // namespace earmark::gui
