// The window's menus and keyboard shortcuts. Every action lives in a menu
// (so the help overlay lists it) and has a shortcut chosen for Earmark.
#include "main_window.hpp"

#include "earmark/widgets/audio_player.hpp"
#include "earmark/widgets/help_overlay.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/mark_inspector.hpp"
#include "earmark/widgets/mark_lane.hpp"
#include "earmark/widgets/review_queue.hpp"
#include "earmark/widgets/session_document.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "earmark/widgets/pitch_lane.hpp"
#include "earmark/widgets/spectrogram_lane.hpp"
#include "earmark/widgets/take_loader.hpp"
#include "earmark/widgets/view_state.hpp"

#include <QAction>
#include <QDockWidget>
#include <QUndoStack>
#include <QListWidget>
#include <QMenuBar>

namespace earmark::gui {

using namespace earmark::widgets;

template <typename Slot>
static QAction* makeAction(QMainWindow* w, QMenu* menu, const QString& text, const QKeySequence& key, Slot slot) {
    auto* a = new QAction(text, w);
    a->setShortcut(key);
    a->setShortcutContext(Qt::WindowShortcut);
    menu->addAction(a);
    w->addAction(a);
    QObject::connect(a, &QAction::triggered, w, slot);
    return a;
}

QAction* MainWindow::addAction(QMenu* menu, const QString& text, const QKeySequence& key, auto slot) {
    return makeAction(this, menu, text, key, slot);
}

QAction* MainWindow::addToggle(QMenu* menu, const QString& text, const QKeySequence& key, bool on, auto slot) {
    auto* a = new QAction(text, this);
    a->setShortcut(key);
    a->setCheckable(true);
    a->setChecked(on);
    menu->addAction(a);
    QMainWindow::addAction(a);
    connect(a, &QAction::toggled, this, slot);
    return a;
}

void MainWindow::buildActions() {
    QMenu* file = menuBar()->addMenu(tr("&File"));
    addAction(file, tr("Open takes…"), QKeySequence(Qt::CTRL | Qt::Key_O), [this] { openDialog(); });
    addAction(file, tr("Open session…"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_O), [this] { openSessionDialog(); });
    tierActions_.push_back(addAction(file, tr("Open timings for this take…"), QKeySequence(Qt::CTRL | Qt::Key_T),
                                     [this] { openTimingsDialog(); }));
    saveTimingsAction_ = addAction(file, tr("Save timings"), QKeySequence(Qt::CTRL | Qt::Key_S),
                                   [this] { saveTimings(); });
    tierActions_.push_back(addAction(file, tr("Open predicted mel for this take…"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_P),
                                     [this] { openPredictedMelDialog(); }));
    tierActions_.push_back(addAction(file, tr("Open attention matrix for this take…"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_J),
                                     [this] { openAttentionDialog(); }));
    addAction(file, tr("Compare with another take…"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_D), [this] { openCompareDialog(); });
    addAction(file, tr("Close model lanes"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_K), [this] { closeModelLanes(); });
    addAction(file, tr("Export view as image…"), QKeySequence(Qt::CTRL | Qt::Key_E), [this] { exportView(); });
    file->addSeparator();
    addAction(file, tr("Quit"), QKeySequence(Qt::CTRL | Qt::Key_Q), [this] { close(); });

    QMenu* edit = menuBar()->addMenu(tr("&Edit"));
    QAction* undo = undo_->createUndoAction(this, tr("Undo"));
    undo->setShortcut(QKeySequence(Qt::CTRL | Qt::Key_Z));
    edit->addAction(undo);
    QMainWindow::addAction(undo);
    QAction* redo = undo_->createRedoAction(this, tr("Redo"));
    redo->setShortcut(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_Z));
    edit->addAction(redo);
    QMainWindow::addAction(redo);

    QMenu* take = menuBar()->addMenu(tr("&Take"));
    addAction(take, tr("Next take"), QKeySequence(Qt::ALT | Qt::Key_Down), [this] {
        if (session_) queue_->step(1);
        else if (takeList_->currentRow() + 1 < takeList_->count()) takeList_->setCurrentRow(takeList_->currentRow() + 1);
    });
    addAction(take, tr("Previous take"), QKeySequence(Qt::ALT | Qt::Key_Up), [this] {
        if (session_) queue_->step(-1);
        else if (takeList_->currentRow() > 0) takeList_->setCurrentRow(takeList_->currentRow() - 1);
    });
    take->addSeparator();
    const std::pair<ReviewStatus, Qt::Key> statuses[] = {{ReviewStatus::Clean, Qt::Key_C},
                                                         {ReviewStatus::HasMarks, Qt::Key_M},
                                                         {ReviewStatus::Skipped, Qt::Key_S},
                                                         {ReviewStatus::InReview, Qt::Key_R},
                                                         {ReviewStatus::Unreviewed, Qt::Key_U}};
    for (const auto& [status, key] : statuses)
        sessionActions_.push_back(addAction(take, tr("Status: %1").arg(statusLabel(status)), QKeySequence(Qt::SHIFT | key),
                                            [this, status] { setTakeStatus(status); }));
    sessionActions_.push_back(addAction(take, tr("Locate missing audio…"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_L),
                                        [this] { locateAudio(); }));
    take->addSeparator();
    addAction(take, tr("Analysis settings…"), QKeySequence(Qt::CTRL | Qt::Key_Comma), [this] { editSettings(); });
    addAction(take, tr("Analyse again"), QKeySequence(Qt::Key_F5), [this] { loader_->reanalyse(settings_); });
    addAction(take, tr("Stop analysis"), QKeySequence(Qt::CTRL | Qt::Key_Period), [this] {
        loader_->cancel();
        notify(tr("Analysis stopped. %1 analyses again.").arg(QKeySequence(Qt::Key_F5).toString(QKeySequence::NativeText)), 6000);
    });

    QMenu* nav = menuBar()->addMenu(tr("&Navigate"));
    addAction(nav, tr("Zoom in"), QKeySequence(Qt::Key_Equal), [this] { view_->zoomAtPointer(1.5); });
    addAction(nav, tr("Zoom out"), QKeySequence(Qt::Key_Minus), [this] { view_->zoomAtPointer(1.0 / 1.5); });
    addAction(nav, tr("Zoom to selection"), QKeySequence(Qt::Key_Z), [this] { view_->zoomToSelection(); });
    addAction(nav, tr("Show whole take"), QKeySequence(Qt::Key_X), [this] { view_->showAll(); });
    nav->addSeparator();
    addAction(nav, tr("Scroll earlier"), QKeySequence(Qt::Key_Left), [this] { view_->scrollPages(-0.2); });
    addAction(nav, tr("Scroll later"), QKeySequence(Qt::Key_Right), [this] { view_->scrollPages(0.2); });
    addAction(nav, tr("Page earlier"), QKeySequence(Qt::SHIFT | Qt::Key_Left), [this] { view_->scrollPages(-0.9); });
    addAction(nav, tr("Page later"), QKeySequence(Qt::SHIFT | Qt::Key_Right), [this] { view_->scrollPages(0.9); });
    addAction(nav, tr("Cursor to start"), QKeySequence(Qt::Key_Home), [this] {
        view_->setCursor(0.0);
        view_->scroll(-view_->visibleRange().start);
    });
    addAction(nav, tr("Cursor to end"), QKeySequence(Qt::Key_End), [this] {
        view_->setCursor(view_->duration());
        view_->scroll(view_->duration() - view_->visibleRange().end);
    });
    addAction(nav, tr("Select visible range"), QKeySequence(Qt::SHIFT | Qt::Key_A),
              [this] { view_->setSelection(view_->visibleRange()); });
    addAction(nav, tr("Clear selection"), QKeySequence(Qt::Key_Escape), [this] { view_->setSelection(std::nullopt); });
    nav->addSeparator();
    addAction(nav, tr("Next sentence"), QKeySequence(Qt::ALT | Qt::Key_Right), [this] { step(LongformStep::Sentence, 1); });
    addAction(nav, tr("Previous sentence"), QKeySequence(Qt::ALT | Qt::Key_Left), [this] { step(LongformStep::Sentence, -1); });
    addAction(nav, tr("Next paragraph"), QKeySequence(Qt::ALT | Qt::SHIFT | Qt::Key_Right),
              [this] { step(LongformStep::Paragraph, 1); });
    addAction(nav, tr("Previous paragraph"), QKeySequence(Qt::ALT | Qt::SHIFT | Qt::Key_Left),
              [this] { step(LongformStep::Paragraph, -1); });
    addAction(nav, tr("Next long-take finding"), QKeySequence(Qt::ALT | Qt::Key_Period), [this] { step(LongformStep::Finding, 1); });
    addAction(nav, tr("Previous long-take finding"), QKeySequence(Qt::ALT | Qt::Key_Comma),
              [this] { step(LongformStep::Finding, -1); });
    addAction(nav, tr("Show the long-take panel"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_F), [this] {
        if (auto* dock = findChild<QDockWidget*>("longformDock")) dock->setVisible(!dock->isVisible());
    });

    QMenu* play = menuBar()->addMenu(tr("&Play"));
    playActions_.push_back(addAction(play, tr("Play from cursor / stop"), QKeySequence(Qt::Key_Space), [this] {
        if (player_->playing()) player_->stop();
        else this->play(static_cast<int>(PlayMode::FromCursor));
    }));
    playActions_.push_back(addAction(play, tr("Play selection"), QKeySequence(Qt::Key_P),
                                     [this] { this->play(static_cast<int>(PlayMode::Selection)); }));
    playActions_.push_back(addAction(play, tr("Play visible range"), QKeySequence(Qt::Key_V),
                                     [this] { this->play(static_cast<int>(PlayMode::VisibleRange)); }));
    playActions_.push_back(addAction(play, tr("Loop selection"), QKeySequence(Qt::Key_L),
                                     [this] { this->play(static_cast<int>(PlayMode::LoopSelection)); }));
    playActions_.push_back(addAction(play, tr("Stop"), QKeySequence(Qt::Key_Period), [this] { player_->stop(); }));
    play->addSeparator();
    // Speed and loop are settings, not playback: they work without a device.
    addAction(play, tr("Slower"), QKeySequence(Qt::Key_Down), [this] { player_->setRate(stepPlaybackRate(player_->rate(), -1)); });
    addAction(play, tr("Faster"), QKeySequence(Qt::Key_Up), [this] { player_->setRate(stepPlaybackRate(player_->rate(), 1)); });
    addAction(play, tr("Speed as recorded (1×)"), QKeySequence(Qt::Key_1), [this] { player_->setRate(1.0); });
    loopToggle_ = addToggle(play, tr("Repeat the selection when playing it"), QKeySequence(Qt::Key_R), false,
                            [this](bool on) { player_->setLooping(on); });
    addAction(play, tr("Hear the suspect, looped at the chosen speed"), QKeySequence(Qt::Key_H), [this] { auditionSuspect(); });

    QMenu* lanes = menuBar()->addMenu(tr("&Lanes"));
    int n = 1;
    for (Lane* lane : stack_->lanes()) {
        // The model lanes come and go with a predicted mel (File menu).
        // The drift lane comes and goes with long takes.
        if (lane->id() == "ruler" || isModelLane(lane->id()) || lane->id() == QLatin1String("drift")) continue;
        const QString id = lane->id();
        QAction* a = addToggle(lanes, tr("Show %1").arg(lane->title().toLower()),
                               QKeySequence(Qt::CTRL | static_cast<Qt::Key>(Qt::Key_0 + n++)), true,
                               [this, id](bool on) { stack_->setLaneVisible(id, on); });
        connect(stack_, &LaneStack::laneVisibilityChanged, a, [a, id](const QString& which, bool on) {
            if (which == id) a->setChecked(on);
        });
    }
    lanes->addSeparator();
    melToggle_ = addToggle(lanes, tr("Mel spectrogram"), QKeySequence(Qt::Key_M), false, [this](bool on) {
        SpectrogramLook l = spectrogram_->look();
        l.kind = on ? SpectrogramKind::Mel : SpectrogramKind::Linear;
        spectrogram_->setLook(l);
    });
    addToggle(lanes, tr("F0 over the spectrogram"), QKeySequence(Qt::Key_O), false, [this](bool on) {
        SpectrogramLook l = spectrogram_->look();
        l.f0Overlay = on;
        spectrogram_->setLook(l);
    });
    addAction(lanes, tr("Spectrogram top frequency: 2, 4, 8 kHz or all"), QKeySequence(Qt::Key_F), [this] {
        SpectrogramLook l = spectrogram_->look();
        const double steps[] = {2000.0, 4000.0, 8000.0, 96000.0};
        double next = steps[0];
        for (double s : steps)
            if (s > l.topHz + 1.0) {
                next = s;
                break;
            }
        l.topHz = next;
        spectrogram_->setLook(l);
        notify(next > 50000 ? tr("Spectrogram up to half the sample rate")
                            : tr("Spectrogram up to %1 kHz").arg(next / 1000.0, 0, 'f', 0),
               3000);
    });
    addAction(lanes, tr("Spectrogram floor down"), QKeySequence(Qt::Key_BracketLeft), [this] { adjustSpectrogram(-5, 0); });
    addAction(lanes, tr("Spectrogram floor up"), QKeySequence(Qt::Key_BracketRight), [this] { adjustSpectrogram(5, 0); });
    addAction(lanes, tr("Spectrogram range narrower"), QKeySequence(Qt::CTRL | Qt::Key_BracketLeft),
              [this] { adjustSpectrogram(0, -10); });
    addAction(lanes, tr("Spectrogram range wider"), QKeySequence(Qt::CTRL | Qt::Key_BracketRight),
              [this] { adjustSpectrogram(0, 10); });
    addToggle(lanes, tr("Pitch in semitones"), QKeySequence(Qt::Key_U), false, [this](bool on) {
        PitchLook l = pitch_->look();
        l.unit = on ? PitchUnit::Semitones : PitchUnit::Hertz;
        pitch_->setLook(l);
    });
    addToggle(lanes, tr("Pitch confidence shading"), QKeySequence(Qt::Key_C), true, [this](bool on) {
        PitchLook l = pitch_->look();
        l.confidence = on;
        pitch_->setLook(l);
    });

    buildSessionActions();

    QMenu* help = menuBar()->addMenu(tr("&Help"));
    addAction(help, tr("Keyboard overview"), QKeySequence(Qt::Key_F1), [this] { help_->toggle(); });
}

void MainWindow::buildSessionActions() {
    QMenu* marks = menuBar()->addMenu(tr("&Marks"));
    markActions_.push_back(addAction(marks, tr("New mark on the selection or word…"), QKeySequence(Qt::Key_N),
                                     [this] { openMarkPalette(); }));
    markActions_.push_back(addAction(marks, tr("Delete the selected mark"), QKeySequence(Qt::Key_Delete),
                                     [this] { deleteSelectedMark(); }));
    markActions_.push_back(addAction(marks, tr("Write a note on the selected mark"), QKeySequence(Qt::SHIFT | Qt::Key_N), [this] {
        if (auto* dock = findChild<QDockWidget*>("markDock")) dock->show();
        inspector_->focusNote();
    }));
    auto stepMark = [this](int delta) {
        const auto& all = markLane_->marks();
        if (all.empty()) return;
        int i = -1;
        for (std::size_t k = 0; k < all.size(); ++k)
            if (selectedMark_ && all[k].id == *selectedMark_) i = static_cast<int>(k);
        i = i < 0 ? (delta > 0 ? 0 : static_cast<int>(all.size()) - 1) : std::clamp(i + delta, 0, static_cast<int>(all.size()) - 1);
        goToMark(all[static_cast<std::size_t>(i)].id, false);
    };
    markActions_.push_back(addAction(marks, tr("Next mark in the take"), QKeySequence(Qt::CTRL | Qt::Key_Right),
                                     [stepMark] { stepMark(1); }));
    markActions_.push_back(addAction(marks, tr("Previous mark in the take"), QKeySequence(Qt::CTRL | Qt::Key_Left),
                                     [stepMark] { stepMark(-1); }));
    marks->addSeparator();
    sessionActions_.push_back(addAction(marks, tr("Show the session's mark list"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_M), [this] {
        if (auto* dock = findChild<QDockWidget*>("markListDock")) dock->setVisible(!dock->isVisible());
    }));
    sessionActions_.push_back(addAction(marks, tr("Show the mark inspector"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_I), [this] {
        if (auto* dock = findChild<QDockWidget*>("markDock")) dock->setVisible(!dock->isVisible());
    }));

    QMenu* tiers = menuBar()->addMenu(tr("T&iers"));
    tierActions_.push_back(addAction(tiers, tr("Tier commands act on words / phones"), QKeySequence(Qt::Key_W), [this] {
        activeTier_ = activeTier() == tierLanes_.front() ? tierLanes_.back() : tierLanes_.front();
        notify(tr("Tier commands now act on %1").arg(activeTier_->tierName()), 3000);
    }));
    tierActions_.push_back(addAction(tiers, tr("Split the interval at the cursor"), QKeySequence(Qt::Key_S), [this] { splitAtCursor(); }));
    tierActions_.push_back(addAction(tiers, tr("Merge with the next interval"), QKeySequence(Qt::Key_J),
                                     [this] { mergeWithNext(); }));
    tierActions_.push_back(addAction(tiers, tr("Edit the label at the cursor"), QKeySequence(Qt::Key_E), [this] { editLabelAtCursor(); }));
    tierActions_.push_back(addAction(tiers, tr("Insert an interval over the selection"), QKeySequence(Qt::SHIFT | Qt::Key_I),
                                     [this] { insertIntervalOverSelection(); }));
    tierActions_.push_back(addAction(tiers, tr("Delete the interval at the cursor"), QKeySequence(Qt::SHIFT | Qt::Key_Delete),
                                     [this] { deleteIntervalAtCursor(); }));
    tiers->addSeparator();
    tierActions_.push_back(addAction(tiers, tr("Align words from text…"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_A),
                                     [this] { openAlignDialog(); }));
    addToggle(tiers, tr("Snap dragged boundaries to zero crossings"), QKeySequence(Qt::Key_G), false,
              [this](bool on) { snapToZero_ = on; });
    updateSessionActions();
}

}  // namespace earmark::gui
