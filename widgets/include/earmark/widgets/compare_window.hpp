// The compare window: two takes of the same text (take_pair.hpp).
//  - Pitch: both F0 contours on A's time axis, each in semitones re its own
//    median; B's frames are carried onto A's axis through the alignment.
//  - Spectrograms of A and of B stacked, each on its own time axis (B is
//    not warped: its own frames, its own seconds).
//  - The per-word table: duration A/B and B/A, F0 mean A/B (Hz), F0 range
//    A/B (st), prominence A/B; cells at or beyond the engine's flag
//    thresholds tinted, the largest difference of each kind in bold.
//  - Play A, Play B and "switch A/B at the same point": the position in
//    the take playing (its playhead, else its cursor) is carried through
//    the alignment and the other take goes on from there.
// Every action is in the Compare menu with a shortcut; F1 lists them.
#pragma once

#include "earmark/widgets/take_pair.hpp"

#include <QFutureWatcher>
#include <QMainWindow>

class QCustomPlot;
class QLabel;
class QTableWidget;

namespace earmark::widgets {

class AudioPlayer;
class HelpOverlay;
class SpectrogramLane;
class ViewState;

class CompareWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit CompareWindow(QWidget* parent = nullptr);
    ~CompareWindow() override;

    // Loads and compares in the background; pairSettled when done.
    void open(const TakePairRequest& request);
    void setPair(TakePairPtr pair);
    const TakePairPtr& pair() const { return pair_; }

    PairSide side() const { return side_; }
    // Moves to the other take at the matching point (playing on when playing).
    void switchSide();
    void play(PairSide side);
    ViewState* view(PairSide side) const { return side == PairSide::A ? viewA_ : viewB_; }
    QTableWidget* wordTable() const { return table_; }
    QCustomPlot* pitchPlot() const { return plot_; }

signals:
    void pairSettled(bool ok, const QString& message);

private:
    void buildActions();
    void fillTable();
    void fillPlot();
    AudioPlayer* player(PairSide side) const { return side == PairSide::A ? playerA_ : playerB_; }

    TakePairPtr pair_;
    PairSide side_ = PairSide::A;
    ViewState* viewA_ = nullptr;
    ViewState* viewB_ = nullptr;
    SpectrogramLane* spectrogramA_ = nullptr;
    SpectrogramLane* spectrogramB_ = nullptr;
    QLabel* captionA_ = nullptr;
    QLabel* captionB_ = nullptr;
    QLabel* summary_ = nullptr;
    QCustomPlot* plot_ = nullptr;
    QTableWidget* table_ = nullptr;
    AudioPlayer* playerA_ = nullptr;
    AudioPlayer* playerB_ = nullptr;
    HelpOverlay* help_ = nullptr;
    QFutureWatcher<TakePairPtr>* watcher_ = nullptr;
    QString error_;
};

}  // namespace earmark::widgets
