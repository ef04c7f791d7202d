#include "earmark/widgets/rating_window.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/store/listening_store.hpp"
#include "earmark/widgets/level_matched_player.hpp"

#include <QButtonGroup>
#include <QGridLayout>
#include <QHBoxLayout>
#include <QKeyEvent>
#include <QLabel>
#include <QLineEdit>
#include <QProgressBar>
#include <QPushButton>
#include <QSlider>
#include <QStackedWidget>
#include <QVBoxLayout>

#include <algorithm>
#include <cmath>

namespace earmark::widgets {
namespace {

using namespace earmark::listening;

QString qs(const std::string& s) { return QString::fromStdString(s); }

QFont sized(QFont f, double scale, bool bold = false) {
    f.setPointSizeF(f.pointSizeF() * scale);
    f.setBold(bold);
    return f;
}

QPushButton* bigButton(const QString& text, QWidget* parent) {
    auto* b = new QPushButton(text, parent);
    b->setFont(sized(b->font(), 1.4, true));
    b->setMinimumSize(96, 64);
    b->setFocusPolicy(Qt::NoFocus);  // keys belong to the window
    return b;
}

// CMOS values carry their sign, so +1 and −1 read as "better" and "worse".
QString valueText(TestKind kind, double v) {
    return kind == TestKind::Cmos && v > 0 ? QStringLiteral("+%1").arg(v) : QString::number(v);
}

// The scale's values in the order shown (and keyed 1, 2, …): A/B reads
// "first, none, second" left to right.
std::vector<std::pair<double, std::string>> shownScale(TestKind kind) {
    auto labels = scaleOf(kind).labels;
    if (kind == TestKind::Ab) std::reverse(labels.begin(), labels.end());
    return labels;
}

}  // namespace

RatingWindow::RatingWindow(const QString& sessionPath, const QString& test, QWidget* parent) : QWidget(parent) {
    session_ = std::make_unique<Session>(Session::open(sessionPath.toStdString()));
    store_ = std::make_unique<ListeningStore>(*session_);
    test_ = test.toStdString();
    design_ = store_->design(test_);
    plan_ = store_->plan(test_);
    player_ = new LevelMatchedPlayer(this);
    connect(player_, &LevelMatchedPlayer::message, this, [this](const QString& m) { setStatus(m, true); });
    setWindowTitle(tr("Listening test: %1").arg(test));
    setFocusPolicy(Qt::StrongFocus);

    auto* layout = new QVBoxLayout(this);
    layout->setContentsMargins(48, 32, 48, 24);
    pages_ = new QStackedWidget(this);
    layout->addWidget(pages_, 1);
    status_ = new QLabel(this);
    status_->setWordWrap(true);
    layout->addWidget(status_);
    buildStartPage();

    auto* trial = new QWidget(pages_);
    auto* tl = new QVBoxLayout(trial);
    progressLabel_ = new QLabel(trial);
    progressLabel_->setFont(sized(progressLabel_->font(), 1.3, true));
    progress_ = new QProgressBar(trial);
    progress_->setTextVisible(false);
    progress_->setMaximumHeight(10);
    auto* instructions = new QLabel(qs(design_.instructions), trial);
    instructions->setWordWrap(true);
    instructions->setFont(sized(instructions->font(), 1.15));
    trialBody_ = new QWidget(trial);
    nextButton_ = bigButton(tr("Next  ⏎"), trial);
    connect(nextButton_, &QPushButton::clicked, this, [this] { next(); });
    tl->addWidget(progressLabel_);
    tl->addWidget(progress_);
    tl->addSpacing(12);
    tl->addWidget(instructions);
    tl->addSpacing(12);
    tl->addWidget(trialBody_, 1);
    tl->addWidget(nextButton_, 0, Qt::AlignRight);
    pages_->addWidget(trial);

    auto* done = new QLabel(tr("Thank you. Every trial is rated and saved; you can close this window."), pages_);
    done->setAlignment(Qt::AlignCenter);
    done->setFont(sized(done->font(), 1.6, true));
    pages_->addWidget(done);
}

RatingWindow::~RatingWindow() = default;

void RatingWindow::buildStartPage() {
    auto* page = new QWidget(pages_);
    auto* l = new QVBoxLayout(page);
    auto* title = new QLabel(tr("Listening test"), page);
    title->setFont(sized(title->font(), 2.0, true));
    auto* caution = new QLabel(
        tr("Turn your volume down before the first take. Takes in this test may be loud, clipped or broken, "
           "and headphones make that worse. Start low, then raise the level to a comfortable one. Takes within a "
           "trial are matched in loudness, so you should not need to change it again."),
        page);
    caution->setWordWrap(true);
    caution->setFont(sized(caution->font(), 1.25, true));
    caution->setStyleSheet(QStringLiteral("QLabel { background: #fbecd0; color: #5a3a00; padding: 14px; border-radius: 6px; }"));
    auto* instructions = new QLabel(qs(design_.instructions), page);
    instructions->setWordWrap(true);
    instructions->setFont(sized(instructions->font(), 1.15));
    auto* nameLabel = new QLabel(tr("Your name (as the organiser gave it to you):"), page);
    raterEdit_ = new QLineEdit(page);
    raterEdit_->setFont(sized(raterEdit_->font(), 1.3));
    auto* start = bigButton(tr("Start"), page);
    start->setEnabled(false);
    connect(raterEdit_, &QLineEdit::textChanged, start, [start](const QString& t) { start->setEnabled(!t.trimmed().isEmpty()); });
    connect(start, &QPushButton::clicked, this, [this] { begin(raterEdit_->text().trimmed()); });
    connect(raterEdit_, &QLineEdit::returnPressed, this, [this] {
        if (!raterEdit_->text().trimmed().isEmpty()) begin(raterEdit_->text().trimmed());
    });
    l->addWidget(title);
    l->addSpacing(16);
    l->addWidget(caution);
    l->addSpacing(16);
    l->addWidget(instructions);
    l->addStretch(1);
    l->addWidget(nameLabel);
    l->addWidget(raterEdit_);
    l->addWidget(start, 0, Qt::AlignRight);
    pages_->addWidget(page);
}

bool RatingWindow::begin(const QString& rater) {
    try {
        rater_ = rater.toStdString();
        raterEdit_->setText(rater);
        slot_ = store_->joinRater(test_, rater_);
        open_ = store_->openTrials(test_, rater_);
    } catch (const std::exception& e) {
        setStatus(QString::fromLocal8Bit(e.what()), true);
        return false;
    }
    setStatus({}, false);
    showTrial();
    setFocus();
    return true;
}

int RatingWindow::trialsTotal() const {
    return slot_ < 0 ? 0 : static_cast<int>(plan_.raters[static_cast<std::size_t>(slot_)].trials.size());
}
int RatingWindow::trialsDone() const { return slot_ < 0 ? 0 : trialsTotal() - static_cast<int>(open_.size()); }
QString RatingWindow::statusText() const { return status_->text(); }

bool RatingWindow::oneScale() const { return design_.kind != TestKind::Mushra; }

void RatingWindow::setStatus(const QString& text, bool problem) {
    status_->setText(text);
    status_->setStyleSheet(problem ? QStringLiteral("color: #a02020;") : QString());
}

void RatingWindow::showTrial() {
    player_->stop();
    if (open_.empty()) {
        position_ = -1;
        pages_->setCurrentIndex(2);
        emit allDone();
        return;
    }
    position_ = open_.front();
    const Trial& trial = plan_.raters[static_cast<std::size_t>(slot_)].trials[static_cast<std::size_t>(position_)];
    ratings_.assign(oneScale() ? 1 : trial.stimuli.size(), std::nullopt);
    nextToPlay_ = 0;
    progressLabel_->setText(tr("Trial %1 of %2").arg(trialsDone() + 1).arg(trialsTotal()));
    progress_->setRange(0, trialsTotal());
    progress_->setValue(trialsDone());

    std::vector<std::string> paths;
    const Line& line = design_.lines[static_cast<std::size_t>(trial.line)];
    for (const Stimulus& s : trial.stimuli) paths.push_back(line.audio[static_cast<std::size_t>(s.system)]);
    if (design_.kind == TestKind::Mushra) paths.push_back(line.audio[static_cast<std::size_t>(design_.referenceIndex())]);
    try {
        levels_ = measureTrialLoudness(paths);
    } catch (const std::exception&) {
        // Never show the error's text here: it names the file, and the file may name the system.
        levels_.assign(paths.size(), {});
        setStatus(tr("A take of this trial cannot be read; tell the organiser (trial %1).").arg(position_ + 1), true);
    }

    // The previous trial's widgets: take a copy of the list, deleting changes it.
    delete trialBody_->layout();
    const QObjectList previous = trialBody_->children();
    qDeleteAll(previous);
    scaleButtons_.clear();
    sliderValues_.clear();
    auto* body = new QVBoxLayout(trialBody_);
    if (oneScale()) {
        auto* row = new QHBoxLayout;
        row->addStretch(1);
        for (std::size_t k = 0; k < trial.stimuli.size(); ++k) {
            auto* b = bigButton(tr("▶  %1").arg(qs(trial.stimuli[k].label)), trialBody_);
            b->setMinimumSize(180, 96);
            connect(b, &QPushButton::clicked, this, [this, k] { play(static_cast<int>(k)); });
            row->addWidget(b);
        }
        row->addStretch(1);
        body->addLayout(row);
        body->addSpacing(24);
        buildScale(body);
    } else {
        auto* grid = new QGridLayout;
        auto* ref = bigButton(tr("▶  Reference  (R)"), trialBody_);
        connect(ref, &QPushButton::clicked, this, [this] { play(-1); });
        grid->addWidget(ref, 0, 0, 1, static_cast<int>(trial.stimuli.size()) + 1);
        const Scale scale = scaleOf(TestKind::Mushra);
        auto* labels = new QVBoxLayout;
        for (auto it = scale.labels.rbegin(); it != scale.labels.rend(); ++it) {
            labels->addWidget(new QLabel(qs(it->second), trialBody_), 1);
        }
        grid->addLayout(labels, 2, 0);
        for (std::size_t k = 0; k < trial.stimuli.size(); ++k) {
            const int col = static_cast<int>(k) + 1;
            auto* b = bigButton(tr("▶ %1").arg(qs(trial.stimuli[k].label)), trialBody_);
            connect(b, &QPushButton::clicked, this, [this, k] { play(static_cast<int>(k)); });
            auto* slider = new QSlider(Qt::Vertical, trialBody_);
            slider->setRange(0, 100);
            slider->setMinimumHeight(260);
            slider->setTickPosition(QSlider::TicksBothSides);
            slider->setTickInterval(20);
            auto* value = new QLabel(tr("–"), trialBody_);
            value->setAlignment(Qt::AlignCenter);
            value->setFont(sized(value->font(), 1.3, true));
            sliderValues_.push_back(value);
            connect(slider, &QSlider::valueChanged, this, [this, k](int v) { rate(static_cast<int>(k), v); });
            // Releasing the handle counts as a rating even where it started (0 is a valid score).
            connect(slider, &QSlider::sliderReleased, this, [this, k, slider] { rate(static_cast<int>(k), slider->value()); });
            grid->addWidget(b, 1, col, Qt::AlignHCenter);
            grid->addWidget(slider, 2, col, Qt::AlignHCenter);
            grid->addWidget(value, 3, col, Qt::AlignHCenter);
        }
        body->addLayout(grid);
    }
    body->addStretch(1);
    nextButton_->setEnabled(false);
    pages_->setCurrentIndex(1);
}

void RatingWindow::buildScale(QVBoxLayout* into) {
    const auto scale = shownScale(design_.kind);
    auto* row = new QHBoxLayout;
    auto* group = new QButtonGroup(trialBody_);
    for (std::size_t i = 0; i < scale.size(); ++i) {
        const auto& [value, label] = scale[i];
        auto* b = new QPushButton(tr("%1\n%2\nkey %3").arg(valueText(design_.kind, value), qs(label)).arg(i + 1), trialBody_);
        b->setCheckable(true);
        b->setMinimumSize(120, 96);
        b->setFont(sized(b->font(), 1.2));
        b->setFocusPolicy(Qt::NoFocus);
        group->addButton(b);
        scaleButtons_.push_back(b);
        connect(b, &QPushButton::clicked, this, [this, v = value] { rate(0, v); });
        row->addWidget(b);
    }
    into->addLayout(row);
    if (design_.kind == TestKind::Cmos)
        into->addWidget(new QLabel(tr("How does B compare with A?"), trialBody_), 0, Qt::AlignHCenter);
}

void RatingWindow::rate(int stimulus, double value) {
    if (position_ < 0) return;
    const std::size_t k = oneScale() ? 0 : static_cast<std::size_t>(stimulus);
    if (k >= ratings_.size()) return;
    ratings_[k] = value;
    if (oneScale()) {
        const auto scale = shownScale(design_.kind);
        for (std::size_t i = 0; i < scale.size() && i < scaleButtons_.size(); ++i)
            scaleButtons_[i]->setChecked(scale[i].first == value);
    } else if (k < sliderValues_.size()) {
        sliderValues_[k]->setText(QString::number(value));
    }
    bool complete = true;
    for (const auto& r : ratings_) complete = complete && r.has_value();
    nextButton_->setEnabled(complete);
}

bool RatingWindow::next() {
    if (position_ < 0) return false;
    std::vector<double> values;
    for (const auto& r : ratings_) {
        if (!r) {
            setStatus(tr("Rate every take of this trial first."), true);
            return false;
        }
        values.push_back(*r);
    }
    try {
        store_->recordTrial(test_, rater_, position_, values);
    } catch (const std::exception& e) {
        setStatus(tr("Not saved: %1").arg(QString::fromLocal8Bit(e.what())), true);
        return false;
    }
    const int done = position_;
    open_.erase(open_.begin());
    setStatus(tr("Saved."), false);
    emit committed(done);
    showTrial();
    return true;
}

void RatingWindow::play(int stimulus) {
    if (position_ < 0) return;
    const Trial& trial = plan_.raters[static_cast<std::size_t>(slot_)].trials[static_cast<std::size_t>(position_)];
    const Line& line = design_.lines[static_cast<std::size_t>(trial.line)];
    std::size_t level = 0;
    std::string path;
    if (stimulus < 0) {
        if (design_.kind != TestKind::Mushra) return;
        path = line.audio[static_cast<std::size_t>(design_.referenceIndex())];
        level = trial.stimuli.size();
    } else {
        if (static_cast<std::size_t>(stimulus) >= trial.stimuli.size()) return;
        path = line.audio[static_cast<std::size_t>(trial.stimuli[static_cast<std::size_t>(stimulus)].system)];
        level = static_cast<std::size_t>(stimulus);
    }
    try {
        LoadedAudio audio = loadAudio(path);
        const double gain = level < levels_.size() ? std::pow(10.0, levels_[level].gainDb / 20.0) : 1.0;
        for (float& x : audio.signal.samples) x = static_cast<float>(x * gain);
        player_->play(std::move(audio.signal.samples), audio.signal.sampleRate);
    } catch (const std::exception&) {
        // Never show the file name: it may name the system.
        setStatus(tr("This take cannot be played; tell the organiser (trial %1).").arg(position_ + 1), true);
    }
}

void RatingWindow::keyPressEvent(QKeyEvent* event) {
    if (pages_->currentIndex() != 1) return QWidget::keyPressEvent(event);
    const Trial& trial = plan_.raters[static_cast<std::size_t>(slot_)].trials[static_cast<std::size_t>(position_)];
    const int key = event->key();
    if (key == Qt::Key_Return || key == Qt::Key_Enter) {
        next();
    } else if (key == Qt::Key_Space) {
        play(nextToPlay_);
        nextToPlay_ = (nextToPlay_ + 1) % static_cast<int>(trial.stimuli.size());
    } else if (key == Qt::Key_R && design_.kind == TestKind::Mushra) {
        play(-1);
    } else if (key >= Qt::Key_A && key <= Qt::Key_Z && key - Qt::Key_A < static_cast<int>(trial.stimuli.size())) {
        play(key - Qt::Key_A);
    } else if (oneScale() && key >= Qt::Key_1 && key <= Qt::Key_9) {
        const auto scale = shownScale(design_.kind);
        const auto i = static_cast<std::size_t>(key - Qt::Key_1);
        if (i < scale.size()) rate(0, scale[i].first);
    } else {
        QWidget::keyPressEvent(event);
    }
}

}  // namespace earmark::widgets
