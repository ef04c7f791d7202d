// The window's long takes: a take at least as long as the scan's long-form
// threshold is reviewed in the background once its audio is in (the latest
// take wins): the drift lane plots its per-window measures with the
// findings, the long-take panel lists the findings and the take's outline
// (paragraphs and sentences, from its tiers or aligned from its text), and
// the Navigate menu steps by sentence, paragraph and finding. Every number
// and every step is the engine's (earmark/longform/).
#include "main_window.hpp"

#include "earmark/longform/navigation.hpp"
#include "earmark/widgets/drift_lane.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/longform_panel.hpp"
#include "earmark/widgets/view_state.hpp"

#include <QDockWidget>
#include <QProgressBar>
#include <QStatusBar>
#include <QToolButton>

namespace earmark::gui {

using namespace earmark::widgets;

std::pair<QProgressBar*, QToolButton*> MainWindow::addJobIndicator(const QString& format, const QString& stopTip) {
    auto* bar = new QProgressBar(this);
    bar->setRange(0, 100);
    bar->setMaximumWidth(160);
    bar->setFormat(format);
    bar->hide();
    statusBar()->addPermanentWidget(bar);
    auto* stop = new QToolButton(this);
    stop->setText(tr("Stop"));
    stop->setToolTip(stopTip);
    stop->hide();
    statusBar()->addPermanentWidget(stop);
    return {bar, stop};
}

void MainWindow::buildLongform() {
    longformLoader_ = new LongformLoader(this);
    longformPanel_ = new LongformPanel(this);
    addPanel(tr("Long take"), "longformDock", longformPanel_, Qt::RightDockWidgetArea);
    auto [bar, stop] = addJobIndicator(tr("long take %p%"), tr("Stop the long-take review"));
    longformProgress_ = bar;
    connect(stop, &QToolButton::clicked, this, [this] {
        longformLoader_->cancel();
        driftLane_->setReview(nullptr, tr("long-take review stopped"));
        longformPanel_->setNote(tr("The long-take review was stopped."));
    });
    connect(longformLoader_, &LongformLoader::busyChanged, this, [this, stop](bool busy) {
        longformProgress_->setVisible(busy);
        stop->setVisible(busy);
        if (busy) longformProgress_->setValue(0);
    });
    connect(longformLoader_, &LongformLoader::progressChanged, this,
            [this](double f) { longformProgress_->setValue(static_cast<int>(f * 100)); });
    connect(longformLoader_, &LongformLoader::ready, this, &MainWindow::onLongform);
    connect(longformLoader_, &LongformLoader::failed, this, [this](const QString& message) {
        driftLane_->setReview(nullptr, message);
        longformPanel_->setNote(tr("Long take: %1").arg(message));
        notify(tr("Long take: %1").arg(message), 8000);
        emit longformSettled(false, message);
    });
    connect(longformPanel_, &LongformPanel::spanChosen, this, [this](double start, double end) { jumpTo(start, end); });
    connect(driftLane_, &DriftLane::findingClicked, this, [this](int i) {
        const Finding& f = longform_->findings[static_cast<std::size_t>(i)];
        longformPanel_->showCurrent(f.startS, f.endS);
    });
}

bool MainWindow::isLongTake() const { return audio_ && audio_->duration() >= LongformRules{}.scanMinTakeSeconds; }

void MainWindow::clearLongform() {
    longformLoader_->cancel();
    longform_.reset();
    driftLane_->setReview(nullptr);
    stack_->setLaneVisible(driftLane_->id(), false);
    longformPanel_->setFindings({});
    longformPanel_->setNote(tr("Takes of %1 s or more are reviewed as long takes.").arg(LongformRules{}.scanMinTakeSeconds, 0, 'f', 0));
}

void MainWindow::startLongform() {
    clearLongform();
    if (!isLongTake()) {
        emit longformSettled(true, {});
        return;
    }
    // Text is aligned only when the take has no sentence tier yet.
    const QString text = currentRow_ >= 0 && !tiers_.find(kSentencesTier) ? takes_[static_cast<std::size_t>(currentRow_)].text : QString();
    stack_->setLaneVisible(driftLane_->id(), true);
    driftLane_->setReview(nullptr, tr("measuring the take over time…"));
    longformPanel_->setNote(text.trimmed().isEmpty() ? tr("Measuring the take over time…")
                                                     : tr("Measuring the take over time and aligning its text…"));
    longformLoader_->start(audio_, text, voice_);
}

void MainWindow::onLongform(LongTakeReviewPtr review) {
    longform_ = std::move(review);
    driftLane_->setReview(longform_);
    longformPanel_->setFindings(longform_->findings);
    QString note = tr("%n finding(s) over %1 windows.", nullptr, static_cast<int>(longform_->findings.size()))
                       .arg(longform_->series.windows.size());
    if (longform_->textTiers) {
        // The text's tiers join the take's to look at (the take had no sentences).
        for (const Tier& t : longform_->textTiers->tiers)
            if (!tiers_.find(t.name)) tiers_.getOrAdd(t.name) = t;
        showTiers();
        note += " " + tr("Text aligned in %1 chunk(s), mean word confidence %2.")
                          .arg(longform_->textChunks)
                          .arg(longform_->meanWordConfidence, 0, 'f', 2);
    } else if (!longform_->textProblem.empty()) {
        note += " " + tr("The text was not aligned: %1.").arg(QString::fromStdString(longform_->textProblem));
    }
    longformPanel_->setNote(note);
    if (auto* dock = findChild<QDockWidget*>("longformDock")) dock->show();
    notify(tr("Long take: %1").arg(note), 6000);
    emit longformSettled(true, {});
}

void MainWindow::showOutline() {
    longformPanel_->setOutline(tiers_.find(kParagraphsTier), tiers_.find(kSentencesTier));
}

void MainWindow::jumpTo(double start, double end) {
    if (!audio_) return;
    if (end > start) view_->setSelection(TimeRange{start, end});
    view_->setCursor(start);
    const TimeRange v = view_->visibleRange();
    const ViewSpan shown = revealSpan({v.start, v.end}, {start, end}, view_->duration());
    if (shown.startS != v.start || shown.endS != v.end) view_->setVisibleRange({shown.startS, shown.endS});
    longformPanel_->showCurrent(start, end);
}

void MainWindow::step(LongformStep what, int direction) {
    std::vector<NavSpan> spans;
    QString name;
    if (what == LongformStep::Finding) {
        if (longform_) spans = spansOf(longform_->findings);
        name = tr("long-take finding");
    } else {
        const std::string_view tier = what == LongformStep::Sentence ? kSentencesTier : kParagraphsTier;
        if (const Tier* t = tiers_.find(tier)) spans = spansOf(*t);
        name = what == LongformStep::Sentence ? tr("sentence") : tr("paragraph");
    }
    if (spans.empty()) {
        notify(what == LongformStep::Finding ? tr("No long-take findings on this take.")
                                             : tr("No %1 tier: a long take gets one from its text.").arg(name),
               5000);
        return;
    }
    const auto i = stepSpan(spans, view_->cursor(), direction);
    if (!i) {
        notify(direction > 0 ? tr("No %1 after the cursor.").arg(name) : tr("No %1 before the cursor.").arg(name), 3000);
        return;
    }
    jumpTo(spans[*i].startS, spans[*i].endS);
    notify(QString::fromStdString(spans[*i].label), 4000);
}

}  // namespace earmark::gui
