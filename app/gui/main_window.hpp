// The Earmark window: menus and shortcuts, the take list, the lane stack and
// the status bar. It wires the pieces from earmark_widgets together and keeps
// no data of its own beyond what is shown.
#pragma once

#include "earmark/align/text_aligner.hpp"
#include "earmark/marks/mark.hpp"
#include "earmark/store/suspect.hpp"
#include "earmark/store/take.hpp"
#include "earmark/tiers/tier.hpp"
#include "earmark/widgets/analysis_settings.hpp"
#include "earmark/widgets/longform_loader.hpp"
#include "earmark/widgets/model_attention.hpp"
#include "earmark/widgets/model_mel.hpp"
#include "earmark/widgets/take_data.hpp"
#include "earmark/widgets/take_list.hpp"
#include "earmark/widgets/time_mapping.hpp"
#include "earmark/widgets/word_evidence_loader.hpp"

#include <QMainWindow>
#include <QTimer>

#include <optional>
#include <utility>
#include <vector>

class QAction;
class QDockWidget;
class QLabel;
class QListWidget;
class QMenu;
class QProgressBar;
class QStackedWidget;
class QToolButton;
class QUndoStack;

namespace earmark::widgets {
class AlignDialog;
class AudioPlayer;
class HelpOverlay;
class ElidedLabel;
class HoverReadout;
class LaneStack;
class ModelMelLane;
class ModelLoader;
class AttentionLane;
class DriftLane;
class LongformPanel;
class MarkInspector;
class MarkLane;
class MarkList;
class MarkPalette;
struct MarkChoice;
class ReviewQueue;
class SessionDocument;
class SuspectLane;
class TierLane;
class PitchLane;
class SpectrogramLane;
class TakeLoader;
class ViewState;
class WordEvidencePanel;
}  // namespace earmark::widgets

namespace earmark::gui {

class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(QWidget* parent = nullptr);
    ~MainWindow() override;

    void openTakes(const std::vector<widgets::TakeEntry>& takes);
    // Opens a `.earmark` session: its queue replaces the take list. Returns
    // false (and says why in the status bar) when it cannot be opened.
    bool openSession(const QString& path);
    // Shows a take of the open session (by id, line id or file name); false when unknown.
    bool showSessionTake(const QString& key);
    // Shows a model's predicted mel spectrogram (.npy) of the current take,
    // and its difference from the take's own mel, once computed in the
    // background (modelSettled then). Waits for the take's audio when it
    // is still loading. Another take drops it.
    void openPredictedMel(const QString& path);
    widgets::ModelMelLane* predictedMelLane() const { return predictedLane_; }
    widgets::ModelMelLane* melDifferenceLane() const { return differenceLane_; }
    // Shows a model's attention matrix of the current take (decoder frames
    // by the default hop, 256 samples at 22 050 Hz), its token tier and its
    // skip/repeat faults; modelSettled when done. Another take drops it.
    void openAttention(const QString& npyPath, const QString& tokensPath);
    widgets::AttentionLane* attentionLane() const { return attentionLane_; }
    widgets::TierLane* tokensLane() const { return tokensLane_; }
    // The espeak-ng voice the takes' texts are read in (default "en-us"):
    // word evidence is gathered when the acoustic model covers it.
    void setVoice(const QString& voice) { voice_ = voice; }
    widgets::WordEvidencePanel* wordPanel() const { return wordPanel_; }
    const widgets::WordEvidencePtr& wordEvidence() const { return evidence_; }
    widgets::DriftLane* driftLane() const { return driftLane_; }
    widgets::LongformPanel* longformPanel() const { return longformPanel_; }
    const widgets::LongTakeReviewPtr& longTakeReview() const { return longform_; }
    // Steps the cursor to the next (direction > 0) or previous sentence,
    // paragraph or long-take finding, selecting it and showing it.
    enum class LongformStep { Sentence, Paragraph, Finding };
    void step(LongformStep what, int direction);
    // Selects [start, end], puts the cursor at its start and scrolls it into view.
    void jumpTo(double start, double end);
    // Reads a timings file as the current take's tiers (undoable).
    bool openTimings(const QString& path);
    // Applied once, when the next take's audio arrives (for --view, --select).
    void setInitialView(std::optional<widgets::TimeRange> range, std::optional<widgets::TimeRange> selection) {
        initialView_ = range;
        initialSelection_ = selection;
    }
    // Opened as the tiers of the next take whose audio arrives (for --timings).
    void setInitialTimings(const QString& path) { initialTimings_ = path; }
    widgets::LaneStack* laneStack() const { return stack_; }
    widgets::ViewState* viewState() const { return view_; }
    widgets::AudioPlayer* player() const { return player_; }
    widgets::SessionDocument* session() const { return session_; }
    widgets::ReviewQueue* reviewQueue() const { return queue_; }
    widgets::MarkPalette* markPalette() const { return palette_; }
    widgets::AlignDialog* alignDialog() const { return align_; }
    widgets::MarkInspector* markInspector() const { return inspector_; }
    widgets::MarkList* markList() const { return markList_; }
    widgets::MarkLane* markLane() const { return markLane_; }
    widgets::SuspectLane* suspectLane() const { return suspectLane_; }
    widgets::TierLane* tierLane(const QString& tierName) const;
    QUndoStack* undoStack() const { return undo_; }
    std::optional<TakeId> currentTakeId() const { return currentTake_; }
    const TierSet& currentTiers() const { return tiers_; }
    // Loose timings edited since they were opened or saved (a session stores each edit at once).
    bool tiersUnsaved() const;

signals:
    // The current take is fully shown (tracks arrived) or failed to load.
    void takeSettled(bool ok, const QString& message);
    // The predicted mel asked for is shown (ok) or could not be read or compared.
    void modelSettled(bool ok, const QString& message);
    // The current take's word evidence is shown (ok) or cannot be had (why).
    void evidenceSettled(bool ok, const QString& message);
    // A long take's review is shown (ok), failed (why), or the take is not long (ok).
    void longformSettled(bool ok, const QString& message);

protected:
    void closeEvent(QCloseEvent* event) override;
    void dragEnterEvent(QDragEnterEvent* event) override;
    void dropEvent(QDropEvent* event) override;

private:
    void buildLanes();
    void buildActions();
    void buildStatusBar();
    QAction* addAction(QMenu* menu, const QString& text, const QKeySequence& key, auto slot);
    QAction* addToggle(QMenu* menu, const QString& text, const QKeySequence& key, bool on, auto slot);
    void selectTake(int row);
    void buildSessionPanels();
    // A closable, movable side panel holding `content`, hidden until shown.
    QDockWidget* addPanel(const QString& title, const QString& objectName, QWidget* content, Qt::DockWidgetArea area);
    void buildSessionActions();
    void showTiers();
    void showMarks();
    void selectMark(std::optional<MarkId> id);
    void openMarkPalette();
    void createMark(const widgets::MarkChoice& choice);
    void editMark(MarkId id, const MarkDraft& draft);
    void deleteSelectedMark();
    // The mark as this window shows it (inspector, else lane), the base of an edit.
    std::optional<Mark> shownMark(MarkId id) const;
    // Copies the session's queue into takes_/takeIds_, keeping the current take.
    void syncTakesFromSession();
    // Another window, command line or rater changed the current take's tiers.
    void showTiersChangedElsewhere(TakeId take);
    void goToMark(MarkId id, bool play);
    void setTakeStatus(ReviewStatus status);
    void locateAudio();
    // Replaces one tier of the current take through the undo stack.
    void editTier(const QString& description, const Tier& after);
    void editTiers(const QString& description, const TierSet& after);
    void storeTiers(std::optional<TakeId> take, const TierSet& tiers);
    widgets::TierLane* activeTier() const;
    void splitAtCursor();
    void mergeWithNext();
    void editLabelAtCursor();
    void insertIntervalOverSelection();
    void deleteIntervalAtCursor();
    void openTimingsDialog();
    void saveTimings();
    void openSessionDialog();
    void openAlignDialog();
    void onAligned(const QString& audioPath, const AlignResult& result);
    double snapTime(double t) const;
    void updateTitle();
    void updateSessionActions();
    MeasureSnapshot measuresFor(double start, double end) const;
    void showSelectionMeasures();  // the inspector's measures while no mark is selected
    void onAudio(quint64 request, widgets::TakeAudioPtr audio);
    void onTracks(quint64 request, widgets::TakeTracksPtr tracks);
    void onFailed(quint64 request, const QString& message);
    void openDialog();
    void editSettings();
    void exportView();
    void play(int mode);
    // Selects the suspect under the selection (or the cursor) and loops its span at the chosen rate.
    void auditionSuspect();
    void showPlaybackState();
    void adjustSpectrogram(double floorStep, double rangeStep);
    void updateTakeInfo();
    void openPredictedMelDialog();
    void openAttentionDialog();
    // Take A is the current take (else asked for), then take B and the script.
    void openCompareDialog();
    void closeModelLanes();
    void startModelMel();
    void onModelMel(widgets::ModelMelPtr mel);
    void onAttention(widgets::ModelAttentionPtr attention);
    // Lanes that come and go with a model's output (not in the Lanes menu).
    bool isModelLane(const QString& id) const;
    // Word evidence of the current take (main_window_evidence.cpp).
    void buildEvidence();
    void startWordEvidence();
    void onWordEvidence(quint64 request, widgets::WordEvidencePtr evidence);
    void clearWordEvidence(const QString& why);
    std::vector<Suspect> evidenceSuspectsShown() const;
    // Long takes (main_window_longform.cpp).
    void buildLongform();
    bool isLongTake() const;
    void startLongform();
    void clearLongform();
    void onLongform(widgets::LongTakeReviewPtr review);
    void showOutline();
    // A progress bar and a Stop button in the status bar for a background job, both hidden.
    std::pair<QProgressBar*, QToolButton*> addJobIndicator(const QString& format, const QString& stopTip);
    // A message in the status bar, cleared after `milliseconds` (0: kept).
    void notify(const QString& text, int milliseconds = 0);

    widgets::ViewState* view_ = nullptr;
    widgets::TakeLoader* loader_ = nullptr;
    widgets::LaneStack* stack_ = nullptr;
    widgets::SpectrogramLane* spectrogram_ = nullptr;
    widgets::PitchLane* pitch_ = nullptr;
    widgets::ModelMelLane* predictedLane_ = nullptr;
    widgets::ModelMelLane* differenceLane_ = nullptr;
    widgets::AttentionLane* attentionLane_ = nullptr;
    widgets::TierLane* tokensLane_ = nullptr;
    widgets::ModelLoader* modelLoader_ = nullptr;
    QString modelMelPath_;  // the predicted mel of the current take ("" = none)
    QAction* melToggle_ = nullptr;
    widgets::HoverReadout* readout_ = nullptr;
    widgets::AudioPlayer* player_ = nullptr;
    widgets::HelpOverlay* help_ = nullptr;
    QListWidget* takeList_ = nullptr;
    QProgressBar* progress_ = nullptr;
    QToolButton* cancelButton_ = nullptr;
    QLabel* takeInfo_ = nullptr;
    QLabel* playbackState_ = nullptr;  // rate and loop, always visible
    QAction* loopToggle_ = nullptr;
    widgets::ElidedLabel* message_ = nullptr;  // gives way to the figures beside it when long
    QTimer messageTimer_;
    std::vector<QAction*> playActions_;
    std::vector<QAction*> sessionActions_;  // need an open session
    std::vector<QAction*> markActions_;     // need a session and a loaded take
    std::vector<QAction*> tierActions_;     // need a loaded take
    QAction* saveTimingsAction_ = nullptr;

    widgets::SessionDocument* session_ = nullptr;
    QUndoStack* undo_ = nullptr;
    QStackedWidget* takePanel_ = nullptr;
    widgets::ReviewQueue* queue_ = nullptr;
    widgets::MarkPalette* palette_ = nullptr;
    widgets::AlignDialog* align_ = nullptr;
    widgets::MarkInspector* inspector_ = nullptr;
    widgets::MarkList* markList_ = nullptr;
    widgets::MarkLane* markLane_ = nullptr;
    widgets::SuspectLane* suspectLane_ = nullptr;
    std::vector<widgets::TierLane*> tierLanes_;
    widgets::TierLane* activeTier_ = nullptr;
    std::vector<TakeId> takeIds_;  // parallel to takes_ when a session is open
    std::optional<TakeId> currentTake_;
    int currentRow_ = -1;
    std::optional<MarkId> selectedMark_;
    std::optional<MarkId> pendingMark_;  // select once its take has loaded
    bool pendingPlay_ = false;
    TierSet tiers_;                 // of the current take, with confidences when known
    QString timingsPath_;           // loose timings file of the current take ("" = none)
    bool snapToZero_ = false;

    std::vector<widgets::TakeEntry> takes_;
    widgets::AnalysisSettings settings_;
    widgets::TakeAudioPtr audio_;
    widgets::TakeTracksPtr tracks_;
    std::optional<widgets::TimeRange> initialView_;
    std::optional<widgets::TimeRange> initialSelection_;
    QString initialTimings_;

    widgets::WordEvidenceLoader* evidenceLoader_ = nullptr;
    widgets::WordEvidencePanel* wordPanel_ = nullptr;
    widgets::WordEvidencePtr evidence_;  // of the current take
    QString voice_ = QStringLiteral("en-us");
    QProgressBar* evidenceProgress_ = nullptr;
    QToolButton* evidenceStop_ = nullptr;

    widgets::DriftLane* driftLane_ = nullptr;
    widgets::LongformLoader* longformLoader_ = nullptr;
    widgets::LongformPanel* longformPanel_ = nullptr;
    widgets::LongTakeReviewPtr longform_;  // of the current take
    QProgressBar* longformProgress_ = nullptr;
};

}  // namespace earmark::gui
