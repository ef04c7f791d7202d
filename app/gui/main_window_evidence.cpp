// The window's word evidence: for a take with text in a voice the acoustic
// model covers, evidence is gathered in the background once its audio is in
// (the latest take wins), then the word tier shows each word's score, the
// word inspector its phones, and the suspect lane its coverage findings.
// Every decision is the engine's (earmark/acoustic/evidence_review.hpp).
#include "main_window.hpp"

#include "earmark/acoustic/evidence_review.hpp"
#include "earmark/acoustic/evidence_trust.hpp"
#include "earmark/widgets/suspect_lane.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "earmark/widgets/view_state.hpp"
#include "earmark/widgets/word_evidence_panel.hpp"

#include <QDockWidget>
#include <QProgressBar>
#include <QStatusBar>
#include <QToolButton>

#include <tuple>

namespace earmark::gui {

using namespace earmark::widgets;

void MainWindow::buildEvidence() {
    evidenceLoader_ = new WordEvidenceLoader(this);
    wordPanel_ = new WordEvidencePanel(this);
    addPanel(tr("Word"), "wordDock", wordPanel_, Qt::RightDockWidgetArea);
    std::tie(evidenceProgress_, evidenceStop_) = addJobIndicator(tr("word evidence %p%"), tr("Stop gathering word evidence"));
    connect(evidenceStop_, &QToolButton::clicked, this, [this] {
        evidenceLoader_->cancel();
        clearWordEvidence(tr("Word evidence stopped."));
    });
    connect(evidenceLoader_, &WordEvidenceLoader::busyChanged, this, [this](bool busy) {
        evidenceProgress_->setVisible(busy);
        evidenceStop_->setVisible(busy);
        if (busy) evidenceProgress_->setValue(0);
    });
    connect(evidenceLoader_, &WordEvidenceLoader::progressChanged, this,
            [this](double f) { evidenceProgress_->setValue(static_cast<int>(f * 100)); });
    connect(evidenceLoader_, &WordEvidenceLoader::ready, this, &MainWindow::onWordEvidence);
    connect(evidenceLoader_, &WordEvidenceLoader::failed, this, [this](quint64, const QString& message) {
        clearWordEvidence(tr("Word evidence: %1").arg(message));
        notify(tr("Word evidence: %1").arg(message), 8000);
        emit evidenceSettled(false, message);
    });
    connect(view_, &ViewState::cursorChanged, this, [this](double t) {
        if (evidence_) wordPanel_->showWord(wordAt(*evidence_, t));
    });
}

void MainWindow::clearWordEvidence(const QString& why) {
    const bool had = evidence_ != nullptr;
    evidence_.reset();
    wordPanel_->setEvidence(nullptr, why);
    if (TierLane* words = tierLane(QStringLiteral("words"))) words->setScoreMarks({});
    if (had) showMarks();
}

void MainWindow::startWordEvidence() {
    evidenceLoader_->cancel();
    const QString text = currentRow_ >= 0 ? takes_[static_cast<std::size_t>(currentRow_)].text.trimmed() : QString();
    if (!audio_ || text.isEmpty()) {
        clearWordEvidence(tr("Word evidence needs the take's text."));
        emit evidenceSettled(false, tr("no text"));
        return;
    }
    if (isLongTake()) {  // an hour is not a line: the long-take review aligns its text instead
        clearWordEvidence(tr("Word evidence is for single lines; this is a long take (see the long-take panel)."));
        emit evidenceSettled(false, tr("long take"));
        return;
    }
    if (!modelCoversVoice(voice_.toStdString())) {
        const QString why = tr("Word evidence: the acoustic model does not cover the voice %1.").arg(voice_);
        clearWordEvidence(why);
        notify(why, 6000);
        emit evidenceSettled(false, why);
        return;
    }
    wordPanel_->setEvidence(nullptr, tr("Gathering word evidence…"));
    evidenceLoader_->start(audio_, text, voice_);
}

void MainWindow::onWordEvidence(quint64, WordEvidencePtr evidence) {
    if (const std::string doubt = evidenceDoubt(*evidence); !doubt.empty()) {
        const QString why = tr("Word evidence: %1.").arg(QString::fromStdString(doubt));
        clearWordEvidence(why);
        if (TierLane* words = tierLane(QStringLiteral("words")); words && words->tier().intervals.empty())
            words->setHint(tr("no words: %1").arg(QString::fromStdString(doubt)));
        notify(why, 8000);
        emit evidenceSettled(false, why);
        return;
    }
    evidence_ = std::move(evidence);
    // A take without a word tier gets the model's tiers to look at.
    if (!tiers_.find(kWordsTier)) {
        const std::optional<double> duration = tiers_.durationS;
        tiers_ = evidence_->tiers;
        tiers_.durationS = duration;
        showTiers();
    }
    std::vector<WordScoreMark> marks;
    for (const WordScoreSpan& s : wordScoreSpans(*evidence_)) {
        const WordEvidence& w = evidence_->words[s.index];
        QString detail = w.substituted
                             ? tr("“%1” not said as written").arg(QString::fromStdString(w.label))
                             : tr("score %1 nats/frame (%2)").arg(w.score, 0, 'f', 2).arg(QString::fromLatin1(wordScoreClassName(s.cls)));
        if (w.guessed) detail += tr(", phones guessed");
        marks.push_back({s.startS, s.endS, s.cls, w.guessed, QString::fromStdString(w.label), detail});
    }
    if (TierLane* words = tierLane(QStringLiteral("words"))) words->setScoreMarks(std::move(marks));
    wordPanel_->setEvidence(evidence_);
    wordPanel_->showWord(wordAt(*evidence_, view_->cursor()));
    if (auto* dock = findChild<QDockWidget*>("wordDock")) dock->show();
    showMarks();
    notify(tr("Word evidence: mean confidence %1, %2 coverage finding(s)%3")
               .arg(evidence_->meanConfidence, 0, 'f', 2)
               .arg(evidence_->coverage.size())
               .arg(evidence_->guessedWords.empty() ? QString() : tr(", %1 word(s) guessed").arg(evidence_->guessedWords.size())),
           6000);
    emit evidenceSettled(true, {});
}

std::vector<Suspect> MainWindow::evidenceSuspectsShown() const {
    return evidence_ ? evidenceSuspects(*evidence_) : std::vector<Suspect>{};
}

}  // namespace earmark::gui
