#include "earmark/widgets/compare_window.hpp"

#include "earmark/widgets/audio_player.hpp"
#include "earmark/widgets/help_overlay.hpp"
#include "earmark/widgets/spectrogram_lane.hpp"
#include "earmark/widgets/view_state.hpp"

#include <QAction>
#include <QFileInfo>
#include <QHeaderView>
#include <QLabel>
#include <QMenuBar>
#include <QSplitter>
#include <QStatusBar>
#include <QTableWidget>
#include <QVBoxLayout>
#include <QtConcurrent/QtConcurrent>

#include <qcustomplot.h>

#include <cmath>

namespace earmark::widgets {

namespace {

const QColor colourA(31, 119, 180);  // A: blue
const QColor colourB(214, 96, 20);   // B: orange

QWidget* captioned(QLabel* caption, QWidget* content, QWidget* parent) {
    auto* box = new QWidget(parent);
    auto* layout = new QVBoxLayout(box);
    layout->setContentsMargins(0, 2, 0, 0);
    layout->setSpacing(2);
    layout->addWidget(caption);
    layout->addWidget(content, 1);
    return box;
}

QString number(const std::optional<double>& v, int decimals) {
    return v ? QString::number(*v, 'f', decimals) : QStringLiteral("–");
}

}  // namespace

CompareWindow::CompareWindow(QWidget* parent) : QMainWindow(parent) {
    setWindowTitle(tr("Earmark — compare two takes"));
    viewA_ = new ViewState(this);
    viewB_ = new ViewState(this);
    playerA_ = new AudioPlayer(viewA_, this);
    playerB_ = new AudioPlayer(viewB_, this);

    plot_ = new QCustomPlot(this);
    plot_->setObjectName("comparePitch");
    plot_->setMinimumHeight(200);
    plot_->xAxis->setLabel(tr("time in take A (s)"));
    plot_->yAxis->setLabel(tr("F0 (st re median)"));
    for (const auto& [name, colour] : {std::pair{tr("A"), colourA}, std::pair{tr("B, carried onto A's time"), colourB}}) {
        QCPGraph* g = plot_->addGraph();
        g->setName(name);
        g->setLineStyle(QCPGraph::lsNone);
        g->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssDisc, colour, colour, 3));
        g->setPen(QPen(colour));
    }
    plot_->legend->setVisible(true);
    plot_->axisRect()->insetLayout()->setInsetAlignment(0, Qt::AlignTop | Qt::AlignRight);

    spectrogramA_ = new SpectrogramLane(viewA_, this);
    spectrogramB_ = new SpectrogramLane(viewB_, this);
    captionA_ = new QLabel(tr("A"), this);
    captionB_ = new QLabel(tr("B"), this);
    for (QLabel* l : {captionA_, captionB_}) l->setStyleSheet(QStringLiteral("font-weight: bold; padding-left: 4px"));
    summary_ = new QLabel(this);
    summary_->setWordWrap(true);
    summary_->setStyleSheet(QStringLiteral("padding: 2px 4px"));

    table_ = new QTableWidget(this);
    table_->setObjectName("compareWords");
    table_->setEditTriggers(QAbstractItemView::NoEditTriggers);
    table_->setSelectionBehavior(QAbstractItemView::SelectRows);
    table_->verticalHeader()->setVisible(false);
    table_->verticalHeader()->setDefaultSectionSize(fontMetrics().height() + 6);
    table_->horizontalHeader()->setStretchLastSection(true);

    auto* split = new QSplitter(Qt::Vertical, this);
    split->addWidget(captioned(summary_, plot_, split));
    split->addWidget(captioned(captionA_, spectrogramA_, split));
    split->addWidget(captioned(captionB_, spectrogramB_, split));
    split->addWidget(table_);
    split->setSizes({260, 220, 220, 360});
    setCentralWidget(split);
    buildActions();
    help_ = new HelpOverlay(menuBar(), this);
    statusBar()->showMessage(tr("No pair open"));
}

CompareWindow::~CompareWindow() {
    if (watcher_) watcher_->waitForFinished();
}

void CompareWindow::buildActions() {
    QMenu* menu = menuBar()->addMenu(tr("&Compare"));
    auto add = [this](QMenu* m, const QString& text, const QKeySequence& key, auto slot) {
        auto* a = new QAction(text, this);
        a->setShortcut(key);
        m->addAction(a);
        addAction(a);
        connect(a, &QAction::triggered, this, slot);
        return a;
    };
    add(menu, tr("Play A from its cursor"), QKeySequence(Qt::Key_A), [this] { play(PairSide::A); });
    add(menu, tr("Play B from its cursor"), QKeySequence(Qt::Key_B), [this] { play(PairSide::B); });
    add(menu, tr("Switch A/B at the same point"), QKeySequence(Qt::Key_Tab), [this] { switchSide(); });
    add(menu, tr("Stop"), QKeySequence(Qt::Key_Period), [this] {
        playerA_->stop();
        playerB_->stop();
    });
    menu->addSeparator();
    add(menu, tr("Close"), QKeySequence(Qt::CTRL | Qt::Key_W), [this] { close(); });
    QMenu* help = menuBar()->addMenu(tr("&Help"));
    add(help, tr("Keyboard overview"), QKeySequence(Qt::Key_F1), [this] { help_->toggle(); });
}

void CompareWindow::open(const TakePairRequest& request) {
    statusBar()->showMessage(tr("Comparing %1 with %2…").arg(QFileInfo(request.pathA).fileName(), QFileInfo(request.pathB).fileName()));
    if (watcher_) watcher_->waitForFinished();
    delete watcher_;
    watcher_ = new QFutureWatcher<TakePairPtr>(this);
    connect(watcher_, &QFutureWatcher<TakePairPtr>::finished, this, [this] {
        const TakePairPtr p = watcher_->result();
        if (!p) {
            statusBar()->showMessage(error_);
            emit pairSettled(false, error_);
            return;
        }
        setPair(p);
        emit pairSettled(true, {});
    });
    watcher_->setFuture(QtConcurrent::run([this, request]() -> TakePairPtr {
        try {
            return loadTakePair(request);
        } catch (const std::exception& e) {
            error_ = QString::fromLocal8Bit(e.what());  // read only after the job ends
            return nullptr;
        }
    }));
}

void CompareWindow::setPair(TakePairPtr pair) {
    pair_ = std::move(pair);
    const TakeComparison& c = pair_->comparison;
    viewA_->resetForDuration(pair_->a->duration());
    viewB_->resetForDuration(pair_->b->duration());
    spectrogramA_->setTake(pair_->a);
    spectrogramA_->setTracks(pair_->tracksA);
    spectrogramB_->setTake(pair_->b);
    spectrogramB_->setTracks(pair_->tracksB);
    playerA_->setTake(pair_->a);
    playerB_->setTake(pair_->b);
    captionA_->setText(tr("A: %1 — %2 s").arg(QFileInfo(pair_->request.pathA).fileName()).arg(pair_->a->duration(), 0, 'f', 2));
    captionB_->setText(tr("B: %1 — %2 s, on its own time axis (not warped)")
                           .arg(QFileInfo(pair_->request.pathB).fileName())
                           .arg(pair_->b->duration(), 0, 'f', 2));
    const OverallFigures& o = c.overall;
    summary_->setText(tr("Pitch, both on A's time axis · B/A duration %1 · B − A F0 %2 st · MCD %3 dB · words: A %4, B %5")
                          .arg(o.durationRatio, 0, 'f', 2)
                          .arg(number(o.f0MeanDiffSt, 2))
                          .arg(o.mcdDb, 0, 'f', 2)
                          .arg(QString::fromUtf8(wordSourceName(c.a.wordSource)), QString::fromUtf8(wordSourceName(c.b.wordSource))));
    fillPlot();
    fillTable();
    QStringList notes;
    for (const auto& n : c.notes) notes << QString::fromStdString(n);
    statusBar()->showMessage(notes.join(QStringLiteral("; ")));
}

void CompareWindow::fillPlot() {
    const TakeComparison& c = pair_->comparison;
    for (PairSide side : {PairSide::A, PairSide::B}) {
        QVector<double> x, y;
        for (const ContourPoint& p : relativeContour(c, side, true)) {
            x << p.seconds;
            y << p.semitones;
        }
        plot_->graph(side == PairSide::A ? 0 : 1)->setData(x, y);
    }
    plot_->xAxis->setRange(0.0, pair_->a->duration());
    plot_->yAxis->rescale();
    plot_->yAxis->scaleRange(1.15);
    plot_->replot();
}

void CompareWindow::fillTable() {
    const TakeComparison& c = pair_->comparison;
    const QStringList headers{tr("word"), tr("dur A (s)"), tr("dur B (s)"), tr("B/A"), tr("F0 A (Hz)"), tr("F0 B (Hz)"),
                              tr("range A (st)"), tr("range B (st)"), tr("prom. A"), tr("prom. B")};
    table_->clear();
    table_->setColumnCount(headers.size());
    table_->setHorizontalHeaderLabels(headers);
    if (!c.words) {
        table_->setRowCount(0);
        return;
    }
    const auto& words = c.words->words;
    table_->setRowCount(static_cast<int>(words.size()));
    // Columns of each difference kind (WordDifference order).
    const std::array<std::vector<int>, kWordDifferenceCount> columns{{{1, 2, 3}, {4, 5}, {6, 7}, {8, 9}}};
    for (std::size_t r = 0; r < words.size(); ++r) {
        const WordComparison& w = words[r];
        // Take A's own label (as in its timings), else the engine's word.
        const auto& labelsA = c.a.words.intervals;
        const std::string& text = labelsA.size() == words.size() ? labelsA[r].label : w.text;
        const QStringList cells{QString::fromStdString(text),
                                QString::number(w.a.durationS, 'f', 3),
                                QString::number(w.b.durationS, 'f', 3),
                                QString::number(w.durationRatio, 'f', 2),
                                number(w.a.f0MeanHz, 0),
                                number(w.b.f0MeanHz, 0),
                                number(w.a.f0RangeSt, 1),
                                number(w.b.f0RangeSt, 1),
                                QString::number(w.a.prominence, 'f', 2),
                                QString::number(w.b.prominence, 'f', 2)};
        for (int col = 0; col < cells.size(); ++col) {
            auto* item = new QTableWidgetItem(cells[col]);
            item->setTextAlignment(col == 0 ? Qt::AlignLeft | Qt::AlignVCenter : Qt::AlignRight | Qt::AlignVCenter);
            table_->setItem(static_cast<int>(r), col, item);
        }
        for (WordDifference d : w.flags) {
            const auto k = static_cast<std::size_t>(d);
            const bool largest = c.words->largest[k] == r;
            for (int col : columns[k]) {
                QTableWidgetItem* item = table_->item(static_cast<int>(r), col);
                item->setBackground(largest ? QColor(255, 196, 120) : QColor(255, 232, 190));
                item->setToolTip(largest ? tr("largest %1 difference").arg(QString::fromUtf8(wordDifferenceName(d)))
                                         : tr("%1 differs").arg(QString::fromUtf8(wordDifferenceName(d))));
                if (largest) {
                    QFont f = item->font();
                    f.setBold(true);
                    item->setFont(f);
                }
            }
        }
    }
    table_->resizeColumnsToContents();
}

void CompareWindow::play(PairSide side) {
    player(otherSide(side))->stop();
    side_ = side;
    player(side)->play(PlayMode::FromCursor);
}

void CompareWindow::switchSide() {
    if (!pair_) return;
    ViewState* from = view(side_);
    const bool playing = player(side_)->playing();
    const double t = playing && from->playhead() ? *from->playhead() : from->cursor();
    const PairSide to = otherSide(side_);
    view(to)->setCursor(mapToOtherSide(pair_->comparison, side_, t));
    if (playing) play(to);
    else side_ = to;
    statusBar()->showMessage(tr("Now on %1 at %2 s").arg(to == PairSide::A ? "A" : "B").arg(view(to)->cursor(), 0, 'f', 3), 3000);
}

}  // namespace earmark::widgets
