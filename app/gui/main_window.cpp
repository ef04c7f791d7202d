#include "main_window.hpp"

#include "earmark/widgets/attention_lane.hpp"
#include "earmark/widgets/audio_player.hpp"
#include "earmark/widgets/drift_lane.hpp"
#include "earmark/widgets/energy_lane.hpp"
#include "earmark/widgets/help_overlay.hpp"
#include "earmark/widgets/elided_label.hpp"
#include "earmark/widgets/hover_readout.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/mark_lane.hpp"
#include "earmark/widgets/mark_list.hpp"
#include "earmark/widgets/model_loader.hpp"
#include "earmark/widgets/model_mel_lane.hpp"
#include "earmark/widgets/review_queue.hpp"
#include "earmark/widgets/session_document.hpp"
#include "earmark/widgets/suspect_lane.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "earmark/widgets/overview_lane.hpp"
#include "earmark/widgets/pitch_lane.hpp"
#include "earmark/widgets/settings_dialog.hpp"
#include "earmark/widgets/spectrogram_lane.hpp"
#include "earmark/widgets/take_loader.hpp"
#include "earmark/widgets/time_ruler_lane.hpp"
#include "earmark/widgets/view_export.hpp"
#include "earmark/widgets/view_state.hpp"
#include "earmark/widgets/waveform_lane.hpp"

#include <QCloseEvent>
#include <QDragEnterEvent>
#include <QDropEvent>
#include <QMimeData>
#include <QDockWidget>
#include <QFileDialog>
#include <QFileInfo>
#include <QGuiApplication>
#include <QLabel>
#include <QListWidget>
#include <QMenuBar>
#include <QProgressBar>
#include <QScreen>
#include <QSettings>
#include <QStatusBar>
#include <QStackedWidget>
#include <QToolButton>
#include <QTimer>
#include <QUndoStack>

#include <cmath>

namespace earmark::gui {

using namespace earmark::widgets;

namespace {
constexpr int takeListWidth = 250;  // px

// First start (no saved geometry): most of the screen, centred, so the lanes
// are not squeezed into the layout's minimum size.
void fitToScreen(QWidget& window) {
    const QScreen* screen = window.screen() ? window.screen() : QGuiApplication::primaryScreen();
    if (!screen) return;
    const QRect area = screen->availableGeometry();
    const QSize size(area.width() * 85 / 100, area.height() * 85 / 100);
    window.resize(size);
    window.move(area.center() - QPoint(size.width() / 2, size.height() / 2));
}
}  // namespace

MainWindow::MainWindow(QWidget* parent) : QMainWindow(parent) {
    setWindowTitle(tr("Earmark"));
    setWindowIcon(QIcon(QStringLiteral(":/earmark/icons/earmark.svg")));
    QSettings q;
    settings_ = AnalysisSettings::load(q);

    view_ = new ViewState(this);
    undo_ = new QUndoStack(this);
    loader_ = new TakeLoader(this);
    modelLoader_ = new ModelLoader(this);
    player_ = new AudioPlayer(view_, this);
    stack_ = new LaneStack(view_, this);
    setCentralWidget(stack_);
    buildLanes();

    takeList_ = new QListWidget(this);
    takeList_->setObjectName("takeList");
    takeList_->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    takeList_->setMinimumWidth(takeListWidth);
    queue_ = new ReviewQueue(this);
    takePanel_ = new QStackedWidget(this);
    takePanel_->addWidget(takeList_);
    takePanel_->addWidget(queue_);
    addPanel(tr("Takes"), "takeDock", takePanel_, Qt::LeftDockWidgetArea);
    connect(takeList_, &QListWidget::currentRowChanged, this, &MainWindow::selectTake);
    connect(queue_, &ReviewQueue::takeChosen, this, [this](qint64 id) {
        if (!session_) return;
        const int row = session_->indexOf(id);
        if (row != currentRow_) selectTake(row);
    });
    connect(queue_, &ReviewQueue::locateRequested, this, [this] { locateAudio(); });

    buildStatusBar();
    buildSessionPanels();
    buildEvidence();
    buildLongform();
    buildActions();
    help_ = new HelpOverlay(menuBar(), this);

    connect(loader_, &TakeLoader::audioReady, this, &MainWindow::onAudio);
    connect(loader_, &TakeLoader::tracksReady, this, &MainWindow::onTracks);
    connect(loader_, &TakeLoader::failed, this, &MainWindow::onFailed);
    connect(loader_, &TakeLoader::progressChanged, this,
            [this](quint64, double f) { progress_->setValue(static_cast<int>(f * 100)); });
    connect(loader_, &TakeLoader::busyChanged, this, [this](bool busy) {
        progress_->setVisible(busy);
        cancelButton_->setVisible(busy);
        if (busy) progress_->setValue(0);
    });
    connect(modelLoader_, &ModelLoader::melReady, this, &MainWindow::onModelMel);
    connect(modelLoader_, &ModelLoader::attentionReady, this, &MainWindow::onAttention);
    connect(modelLoader_, &ModelLoader::failed, this, [this](ModelJob job, const QString& message) {
        notify((job == ModelJob::Mel ? tr("Predicted mel: %1") : tr("Attention: %1")).arg(message));
        emit modelSettled(false, message);
    });
    connect(player_, &AudioPlayer::message, this, [this](const QString& m) { notify(m, 5000); });
    connect(player_, &AudioPlayer::rateOrLoopChanged, this, &MainWindow::showPlaybackState);
    showPlaybackState();
    connect(stack_, &LaneStack::pointDescribed, readout_, &HoverReadout::setLaneDetail);

    if (Lane* wave = stack_->lane("waveform"))
        wave->setEmptyText(tr("No take open. %1 opens audio files or a take list (.csv); "
                              "you can also drop them on this window.")
                               .arg(QKeySequence(Qt::CTRL | Qt::Key_O).toString(QKeySequence::NativeText)));
    setAcceptDrops(true);
    stack_->restoreLayout(q);
    for (Lane* lane : stack_->lanes())
        if (isModelLane(lane->id()) || lane->id() == QLatin1String("drift")) stack_->setLaneVisible(lane->id(), false);
    if (!restoreGeometry(q.value("window/geometry").toByteArray())) fitToScreen(*this);
    restoreState(q.value("window/state").toByteArray());
    if (!player_->available()) {
        for (QAction* a : playActions_) {
            a->setEnabled(false);
            a->setStatusTip(player_->unavailableReason());
        }
        auto* noAudio = new QLabel(tr("no audio device"), this);
        noAudio->setToolTip(player_->unavailableReason());
        statusBar()->addPermanentWidget(noAudio);
    }
}

MainWindow::~MainWindow() {
    // The undo stack is destroyed after this window's members and clears
    // itself on the way, emitting signals the window must no longer hear.
    undo_->blockSignals(true);
    if (session_) session_->blockSignals(true);
}

void MainWindow::buildLanes() {
    stack_->addLane(new OverviewLane(view_), LaneStack::Placement::Fixed);
    stack_->addLane(new TimeRulerLane(view_), LaneStack::Placement::Fixed);
    stack_->addLane(new WaveformLane(view_), LaneStack::Placement::Resizable, 2);
    spectrogram_ = new SpectrogramLane(view_);
    stack_->addLane(spectrogram_, LaneStack::Placement::Resizable, 4);
    // The model lanes sit under the take's own spectrogram, shown once a prediction is open.
    predictedLane_ = new ModelMelLane(ModelMelPart::Predicted, view_);
    stack_->addLane(predictedLane_, LaneStack::Placement::Resizable, 3);
    differenceLane_ = new ModelMelLane(ModelMelPart::Difference, view_);
    stack_->addLane(differenceLane_, LaneStack::Placement::Resizable, 3);
    connect(spectrogram_, &SpectrogramLane::lookChanged, predictedLane_, &ModelMelLane::setLook);
    attentionLane_ = new AttentionLane(view_);
    stack_->addLane(attentionLane_, LaneStack::Placement::Resizable, 3);
    tokensLane_ = new TierLane(QStringLiteral("tokens"), tr("Tokens"), view_);
    stack_->addLane(tokensLane_, LaneStack::Placement::Resizable, 0);
    pitch_ = new PitchLane(view_);
    stack_->addLane(pitch_, LaneStack::Placement::Resizable, 2);
    stack_->addLane(new EnergyLane(view_), LaneStack::Placement::Resizable, 1);
    // Shown for long takes only (main_window_longform.cpp).
    driftLane_ = new DriftLane(view_);
    stack_->addLane(driftLane_, LaneStack::Placement::Resizable, 3);
    for (const auto& [name, title] : {std::pair{QStringLiteral("words"), tr("Words")}, std::pair{QStringLiteral("phones"), tr("Phones")}}) {
        auto* lane = new TierLane(name, title, view_);
        tierLanes_.push_back(lane);
        stack_->addLane(lane, LaneStack::Placement::Resizable, 0);
        lane->setSnap([this](double t) { return snapTime(t); });
        connect(lane, &TierLane::editRequested, this, &MainWindow::editTier);
        connect(lane, &TierLane::playRequested, this, [this] { play(static_cast<int>(PlayMode::Selection)); });
        connect(lane, &TierLane::activated, this, [this, lane] {
            if (activeTier_ != lane) notify(tr("Tier commands now act on %1").arg(lane->tierName()), 3000);
            activeTier_ = lane;
        });
    }
    activeTier_ = tierLanes_.front();
    suspectLane_ = new SuspectLane(view_);
    stack_->addLane(suspectLane_, LaneStack::Placement::Resizable, 0);
    markLane_ = new MarkLane(view_);
    stack_->addLane(markLane_, LaneStack::Placement::Resizable, 0);
    connect(markLane_, &MarkLane::markSelected, this, [this](qint64 id) {
        selectMark(id ? std::optional<MarkId>(id) : std::nullopt);
    });
    connect(markLane_, &MarkLane::playRequested, this, [this] { play(static_cast<int>(PlayMode::Selection)); });
    connect(markLane_, &MarkLane::spanEdited, this, [this](qint64 id, double start, double end) {
        if (!session_) return;
        const auto m = session_->mark(id);
        if (!m) return;
        MarkDraft d = m->draft();
        d.startSeconds = start;
        d.endSeconds = end;
        d.words.clear();  // the session fills them from the word tier
        d.measures = measuresFor(start, end);
        editMark(id, d);
    });
}

QDockWidget* MainWindow::addPanel(const QString& title, const QString& objectName, QWidget* content,
                                  Qt::DockWidgetArea area) {
    auto* dock = new QDockWidget(title, this);
    dock->setObjectName(objectName);
    dock->setWidget(content);
    dock->setFeatures(QDockWidget::DockWidgetMovable | QDockWidget::DockWidgetClosable);
    addDockWidget(area, dock);
    dock->hide();
    return dock;
}

void MainWindow::buildStatusBar() {
    readout_ = new HoverReadout(view_, this);
    statusBar()->addWidget(readout_);
    message_ = new widgets::ElidedLabel(this);
    message_->setObjectName("statusMessage");
    message_->hide();
    statusBar()->addWidget(message_, 1);
    messageTimer_.setSingleShot(true);
    connect(&messageTimer_, &QTimer::timeout, this, [this] { notify({}); });
    takeInfo_ = new QLabel(this);
    statusBar()->addPermanentWidget(takeInfo_);
    playbackState_ = new QLabel(this);
    playbackState_->setObjectName("playbackState");
    statusBar()->addPermanentWidget(playbackState_);
    progress_ = new QProgressBar(this);
    progress_->setRange(0, 100);
    progress_->setMaximumWidth(160);
    progress_->setFormat(tr("analysing %p%"));
    progress_->hide();
    statusBar()->addPermanentWidget(progress_);
    cancelButton_ = new QToolButton(this);
    cancelButton_->setText(tr("Stop"));
    cancelButton_->setToolTip(tr("Stop the analysis (Ctrl+.)"));
    cancelButton_->hide();
    connect(cancelButton_, &QToolButton::clicked, this, [this] { loader_->cancel(); });
    statusBar()->addPermanentWidget(cancelButton_);
}

void MainWindow::openTakes(const std::vector<TakeEntry>& takes) {
    if (session_) {
        queue_->setDocument(nullptr);
        markList_->setDocument(nullptr);
        session_->deleteLater();
        session_ = nullptr;
        takeIds_.clear();
    }
    undo_->clear();
    takePanel_->setCurrentWidget(takeList_);
    for (const char* panel : {"markDock", "markListDock"})
        if (auto* dock = findChild<QDockWidget*>(panel)) dock->hide();
    currentRow_ = -1;
    takes_ = takes;
    takeList_->clear();
    for (const TakeEntry& t : takes_) {
        auto* item = new QListWidgetItem(takeList_);
        item->setToolTip(t.text.isEmpty() ? t.audio : t.text + "\n" + t.audio);
        auto* label = new QLabel(takeList_);
        label->setTextFormat(Qt::RichText);
        label->setWordWrap(true);
        label->setContentsMargins(6, 4, 6, 4);
        label->setText(QStringLiteral("<b>%1</b>%2").arg(t.id.toHtmlEscaped(),
                                                          t.text.isEmpty() ? QString() : "<br>" + t.text.toHtmlEscaped()));
        label->setAttribute(Qt::WA_TransparentForMouseEvents);
        item->setSizeHint(QSize(200, label->heightForWidth(takeListWidth - 24) + 2));
        takeList_->setItemWidget(item, label);
    }
    if (auto* dock = findChild<QDockWidget*>("takeDock")) dock->setVisible(takes_.size() > 1);
    if (!takes_.empty()) takeList_->setCurrentRow(0);
}

void MainWindow::selectTake(int row) {
    if (row < 0 || row >= static_cast<int>(takes_.size())) return;
    currentRow_ = row;
    currentTake_ = session_ ? std::optional<TakeId>(takeIds_[static_cast<std::size_t>(row)]) : std::nullopt;
    if (!session_) undo_->clear();  // loose timings edits belong to their take
    if (session_) queue_->setCurrentTake(*currentTake_);
    selectedMark_.reset();
    tiers_ = {};
    timingsPath_.clear();
    closeModelLanes();
    evidenceLoader_->cancel();
    clearWordEvidence({});
    clearLongform();
    showTiers();
    showMarks();
    player_->setTake(nullptr);
    // Clear the previous take at once, so a take that fails to load never
    // looks like the one before it.
    audio_.reset();
    tracks_.reset();
    view_->resetForDuration(0.0);
    stack_->setTake(nullptr);
    readout_->setTracks(nullptr);
    showSelectionMeasures();
    updateTakeInfo();
    updateTitle();
    updateSessionActions();
    if (currentTake_ && session_->audioMissing(*currentTake_)) {
        if (Lane* wave = stack_->lane("waveform"))
            wave->setEmptyText(tr("The audio of this take is missing:\n%1\n%2 points the session to where it is now.")
                                   .arg(takes_[static_cast<std::size_t>(row)].audio,
                                        QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_L).toString(QKeySequence::NativeText)));
        emit takeSettled(false, tr("audio missing"));
        return;
    }
    if (Lane* wave = stack_->lane("waveform")) wave->setEmptyText(tr("Loading…"));
    loader_->open(takes_[static_cast<std::size_t>(row)].audio, settings_);
}

void MainWindow::onAudio(quint64, TakeAudioPtr audio) {
    audio_ = audio;
    tracks_.reset();
    view_->resetForDuration(audio->duration());
    if (initialView_) view_->setVisibleRange(*initialView_);
    if (initialSelection_) {
        view_->setSelection(initialSelection_);
        view_->setCursor(initialSelection_->start);
    }
    initialView_.reset();
    const std::optional<TimeRange> asked = std::exchange(initialSelection_, std::nullopt);
    stack_->setTake(audio);
    readout_->setTracks(nullptr);
    player_->setTake(audio);
    if (session_ && currentTake_) tiers_ = session_->tiers(*currentTake_);
    tiers_.durationS = audio->duration();
    if (!initialTimings_.isEmpty()) openTimings(std::exchange(initialTimings_, QString()));
    showTiers();
    showMarks();
    // A selection given on the command line that is a mark's span selects the mark.
    if (asked && session_ && currentTake_)
        for (const Mark& m : session_->marks(*currentTake_))
            if (std::abs(m.startSeconds - asked->start) < 1e-3 && std::abs(m.endSeconds - asked->end) < 1e-3) selectMark(m.id);
    if (pendingMark_) {
        const MarkId id = *pendingMark_;
        pendingMark_.reset();
        goToMark(id, std::exchange(pendingPlay_, false));
    }
    updateTakeInfo();
    updateSessionActions();
    startModelMel();
    startWordEvidence();
    startLongform();
}

void MainWindow::onTracks(quint64, TakeTracksPtr tracks) {
    tracks_ = tracks;
    stack_->setTracks(tracks);
    readout_->setTracks(tracks);
    updateTakeInfo();
    showSelectionMeasures();
    emit takeSettled(true, {});
}

void MainWindow::onFailed(quint64, const QString& message) {
    notify(message);
    if (auto* item = takeList_->currentItem()) item->setForeground(QColor(192, 57, 43));
    emit takeSettled(false, message);
}

void MainWindow::notify(const QString& text, int milliseconds) {
    message_->setText(text);
    message_->setVisible(!text.isEmpty());
    if (milliseconds > 0) messageTimer_.start(milliseconds);
    else messageTimer_.stop();
}

void MainWindow::updateTakeInfo() {
    if (!audio_) {
        takeInfo_->clear();
        return;
    }
    QStringList parts;
    parts << tr("%1 Hz").arg(audio_->signal.sampleRate, 0, 'f', 0);
    parts << tr("%1 s").arg(audio_->duration(), 0, 'f', 2);
    if (tracks_) {
        if (tracks_->loudnessLufs && std::isfinite(*tracks_->loudnessLufs))
            parts << tr("%1 LUFS").arg(*tracks_->loudnessLufs, 0, 'f', 1);
        if (std::isfinite(tracks_->sampleStats.samplePeakDbfs))
            parts << tr("peak %1 dBFS").arg(tracks_->sampleStats.samplePeakDbfs, 0, 'f', 1);
        else
            parts << tr("digital silence");
        if (tracks_->pitchSummary.medianHz) parts << tr("median F0 %1 Hz").arg(*tracks_->pitchSummary.medianHz, 0, 'f', 0);
    }
    takeInfo_->setText(parts.join(QStringLiteral(" · ")));
}

void MainWindow::openDialog() {
    const QStringList files = QFileDialog::getOpenFileNames(
        this, tr("Open takes"), {}, tr("Audio or take lists (*.wav *.flac *.ogg *.aiff *.aif *.csv);;All files (*)"));
    if (files.isEmpty()) return;
    try {
        openTakes(takesFromArguments(files));
    } catch (const std::exception& e) {
        notify(QString::fromStdString(e.what()));
    }
}

void MainWindow::editSettings() {
    SettingsDialog dialog(settings_, this);
    if (dialog.exec() != QDialog::Accepted) return;
    const AnalysisSettings s = dialog.settings();
    if (s == settings_) return;
    settings_ = s;
    QSettings q;
    settings_.save(q);
    loader_->reanalyse(settings_);
}

void MainWindow::exportView() {
    const QString path = QFileDialog::getSaveFileName(this, tr("Export view as image"), {},
                                                      tr("PNG image (*.png);;PDF document (*.pdf)"));
    if (path.isEmpty()) return;
    const QString error = exportWidget(*stack_, path);
    notify(error.isEmpty() ? tr("Saved %1").arg(path) : error, 6000);
}

void MainWindow::play(int mode) { player_->play(static_cast<PlayMode>(mode)); }

void MainWindow::auditionSuspect() {
    const Suspect* s = suspectLane_->suspectFor(view_->selection(), view_->cursor());
    if (!s) {
        notify(tr("No suspect here: click one in the suspects lane first."), 5000);
        return;
    }
    view_->setSelection(TimeRange{s->startSeconds, s->endSeconds});
    notify(tr("Hearing %1 (%2–%3 s) at %4×")
               .arg(QString::fromStdString(s->name))
               .arg(s->startSeconds, 0, 'f', 3)
               .arg(s->endSeconds, 0, 'f', 3)
               .arg(player_->rate()),
           5000);
    player_->play(PlayMode::LoopSelection);
}

void MainWindow::showPlaybackState() {
    playbackState_->setText(tr("speed %1× · %2").arg(player_->rate()).arg(player_->looping() ? tr("repeat") : tr("once")));
    // Bold when playback differs from plain: slowed, sped up or repeating is easy to forget.
    QFont font = playbackState_->font();
    font.setBold(player_->rate() != 1.0 || player_->looping());
    playbackState_->setFont(font);
    playbackState_->setToolTip(tr("Playback speed keeps the pitch. %1 / %2 change it, %3 repeats the selection.")
                                   .arg(QKeySequence(Qt::Key_Down).toString(QKeySequence::NativeText),
                                        QKeySequence(Qt::Key_Up).toString(QKeySequence::NativeText),
                                        QKeySequence(Qt::Key_R).toString(QKeySequence::NativeText)));
    if (loopToggle_ && loopToggle_->isChecked() != player_->looping()) loopToggle_->setChecked(player_->looping());
}

void MainWindow::adjustSpectrogram(double floorStep, double rangeStep) {
    SpectrogramLook l = spectrogram_->look();
    l.floorDb += floorStep;
    l.rangeDb += rangeStep;
    spectrogram_->setLook(l);
    notify(tr("Spectrogram colours: %1 dB to %2 dB re peak")
                                 .arg(spectrogram_->look().floorDb, 0, 'f', 0)
                                 .arg(spectrogram_->look().floorDb + spectrogram_->look().rangeDb, 0, 'f', 0),
                             3000);
}

void MainWindow::dragEnterEvent(QDragEnterEvent* event) {
    if (event->mimeData()->hasUrls()) event->acceptProposedAction();
}

void MainWindow::dropEvent(QDropEvent* event) {
    QStringList files;
    for (const QUrl& url : event->mimeData()->urls())
        if (url.isLocalFile()) files << url.toLocalFile();
    if (files.isEmpty()) return;
    try {
        openTakes(takesFromArguments(files));
        event->acceptProposedAction();
    } catch (const std::exception& e) {
        notify(QString::fromStdString(e.what()));
    }
}

void MainWindow::closeEvent(QCloseEvent* event) {
    player_->stop();
    loader_->cancel();
    evidenceLoader_->cancel();
    longformLoader_->cancel();
    QSettings q;
    stack_->saveLayout(q);
    q.setValue("window/geometry", saveGeometry());
    q.setValue("window/state", saveState());
    QMainWindow::closeEvent(event);
}

}  // namespace earmark::gui
