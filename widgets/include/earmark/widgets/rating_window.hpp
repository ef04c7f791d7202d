// The rating mode: one full window a rater works through, trial by trial, on
// a listening test stored in a session (earmark/store/listening_store.hpp).
//
// First page: the loud-playback caution, the test's instructions and the
// rater's name; a rater who comes back resumes at their first open trial.
// Trial pages: progress, big play buttons labelled only by blind letters
// (never a system or file name), the scale of the test's kind with its
// labels, and Next. Keys: A–Z play that take (R the MUSHRA reference),
// Space plays the next take, 1–9 pick a scale value, Return goes on.
// Playback is level-matched inside each trial (the quietest take's BS.1770
// loudness). Every trial's answers are committed to the session file the
// moment Next is pressed; a crash loses nothing already answered.
//
// Errors: the constructor throws earmark::Error (InputError for a missing
// session or test); later failures (a locked file, an unreadable take) are
// shown in the window's status line and nothing is lost.
#pragma once

#include "earmark/listening/loudness_match.hpp"
#include "earmark/listening/plan.hpp"

#include <QWidget>

#include <memory>
#include <optional>
#include <vector>

class QLabel;
class QLineEdit;
class QProgressBar;
class QPushButton;
class QStackedWidget;
class QVBoxLayout;

namespace earmark {
class Session;
class ListeningStore;
}  // namespace earmark

namespace earmark::widgets {

class LevelMatchedPlayer;

class RatingWindow : public QWidget {
    Q_OBJECT
public:
    RatingWindow(const QString& sessionPath, const QString& test, QWidget* parent = nullptr);
    ~RatingWindow() override;

    // Joins (or rejoins) the test as `rater` and shows their first open
    // trial. False, with the reason in the status line, when it cannot.
    bool begin(const QString& rater);

    // Sets the rating of take `stimulus` (0-based, in the order shown) or,
    // for one-scale kinds, the trial's answer (stimulus ignored).
    void rate(int stimulus, double value);
    // Commits the current trial; false (status line says why) when a rating
    // is missing or the store refused.
    bool next();

    int trialsDone() const;
    int trialsTotal() const;
    QString statusText() const;

signals:
    void committed(int position);
    void allDone();

protected:
    void keyPressEvent(QKeyEvent* event) override;

private:
    void buildStartPage();
    void showTrial();
    void buildScale(QVBoxLayout* into);
    void play(int stimulus);  // −1 = the MUSHRA open reference
    void setStatus(const QString& text, bool problem);
    bool oneScale() const;

    std::unique_ptr<Session> session_;
    std::unique_ptr<ListeningStore> store_;
    std::string test_;
    listening::TestDesign design_;
    listening::Plan plan_;
    std::string rater_;
    int slot_ = -1;
    std::vector<int> open_;
    int position_ = -1;
    std::vector<std::optional<double>> ratings_;
    std::vector<listening::MatchedTake> levels_;  // stimuli, then the reference (MUSHRA)
    int nextToPlay_ = 0;

    QStackedWidget* pages_ = nullptr;
    QLineEdit* raterEdit_ = nullptr;
    QLabel* progressLabel_ = nullptr;
    QProgressBar* progress_ = nullptr;
    QWidget* trialBody_ = nullptr;
    QPushButton* nextButton_ = nullptr;
    QLabel* status_ = nullptr;
    std::vector<QPushButton*> scaleButtons_;
    std::vector<QLabel*> sliderValues_;
    LevelMatchedPlayer* player_ = nullptr;
};

}  // namespace earmark::widgets
