// The Earmark window: menus and shortcuts, the take list, the lane stack and
// the status bar. It wires the pieces from earmark_widgets together and keeps
// no data of its own beyond what is shown.
#pragma once

#include "earmark/widgets/analysis_settings.hpp"
#include "earmark/widgets/take_data.hpp"
#include "earmark/widgets/take_list.hpp"
#include "earmark/widgets/time_mapping.hpp"

#include <QMainWindow>
#include <QTimer>

#include <optional>
#include <vector>

class QAction;
class QLabel;
class QListWidget;
class QMenu;
class QProgressBar;
class QToolButton;

namespace earmark::widgets {
class AudioPlayer;
class HelpOverlay;
class HoverReadout;
class LaneStack;
class PitchLane;
class SpectrogramLane;
class TakeLoader;
class ViewState;
}  // namespace earmark::widgets

namespace earmark::gui {

class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(QWidget* parent = nullptr);
    ~MainWindow() override;

    void openTakes(const std::vector<widgets::TakeEntry>& takes);
    // Applied once, when the next take's audio arrives (for --view, --select).
    void setInitialView(std::optional<widgets::TimeRange> range, std::optional<widgets::TimeRange> selection) {
        initialView_ = range;
        initialSelection_ = selection;
    }
    widgets::LaneStack* laneStack() const { return stack_; }
    widgets::ViewState* viewState() const { return view_; }

signals:
    // The current take is fully shown (tracks arrived) or failed to load.
    void takeSettled(bool ok, const QString& message);

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
    void onAudio(quint64 request, widgets::TakeAudioPtr audio);
    void onTracks(quint64 request, widgets::TakeTracksPtr tracks);
    void onFailed(quint64 request, const QString& message);
    void openDialog();
    void editSettings();
    void exportView();
    void play(int mode);
    void adjustSpectrogram(double floorStep, double rangeStep);
    void updateTakeInfo();
    // A message in the status bar, cleared after `milliseconds` (0: kept).
    void notify(const QString& text, int milliseconds = 0);

    widgets::ViewState* view_ = nullptr;
    widgets::TakeLoader* loader_ = nullptr;
    widgets::LaneStack* stack_ = nullptr;
    widgets::SpectrogramLane* spectrogram_ = nullptr;
    widgets::PitchLane* pitch_ = nullptr;
    widgets::HoverReadout* readout_ = nullptr;
    widgets::AudioPlayer* player_ = nullptr;
    widgets::HelpOverlay* help_ = nullptr;
    QListWidget* takeList_ = nullptr;
    QProgressBar* progress_ = nullptr;
    QToolButton* cancelButton_ = nullptr;
    QLabel* takeInfo_ = nullptr;
    QLabel* message_ = nullptr;
    QTimer messageTimer_;
    std::vector<QAction*> playActions_;

    std::vector<widgets::TakeEntry> takes_;
    widgets::AnalysisSettings settings_;
    widgets::TakeAudioPtr audio_;
    widgets::TakeTracksPtr tracks_;
    std::optional<widgets::TimeRange> initialView_;
    std::optional<widgets::TimeRange> initialSelection_;
};

}  // namespace earmark::gui
