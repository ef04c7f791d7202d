// The window's model lanes: a predicted mel spectrogram of the current take
// and its difference from the take's own mel (widgets/model_mel_lane.hpp);
// an attention matrix with its token tier and faults (attention_lane.hpp).
#include "main_window.hpp"

#include "earmark/widgets/attention_lane.hpp"
#include "earmark/widgets/compare_window.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/model_loader.hpp"
#include "earmark/widgets/model_loader.hpp"
#include "earmark/widgets/model_mel_lane.hpp"
#include "earmark/widgets/spectrogram_lane.hpp"
#include "earmark/widgets/tier_lane.hpp"

#include <QAction>
#include <QFileDialog>
#include <QFileInfo>
#include <QInputDialog>

namespace earmark::gui {

using namespace earmark::widgets;

void MainWindow::openPredictedMel(const QString& path) {
    modelMelPath_ = path;
    // Compared under the take's own mel spectrogram, so show that one.
    if (melToggle_ && !melToggle_->isChecked()) melToggle_->setChecked(true);
    startModelMel();
}

void MainWindow::openPredictedMelDialog() {
    const QString start = !modelMelPath_.isEmpty() ? QFileInfo(modelMelPath_).absolutePath()
                          : audio_                 ? QFileInfo(audio_->path).absolutePath()
                                                   : QString();
    const QString path = QFileDialog::getOpenFileName(this, tr("Open predicted mel"), start,
                                                      tr("NumPy arrays (*.npy);;All files (*)"));
    if (!path.isEmpty()) openPredictedMel(path);
}

void MainWindow::openCompareDialog() {
    const QString start = audio_ ? QFileInfo(audio_->path).absolutePath() : QString();
    TakePairRequest request;
    request.pathA = audio_ ? audio_->path : QString();
    if (request.pathA.isEmpty())
        request.pathA = QFileDialog::getOpenFileName(this, tr("Take A"), start, tr("Audio (*.wav *.flac *.ogg);;All files (*)"));
    if (request.pathA.isEmpty()) return;
    request.pathB = QFileDialog::getOpenFileName(this, tr("Compare %1 with take B").arg(QFileInfo(request.pathA).fileName()),
                                                 start, tr("Audio (*.wav *.flac *.ogg);;All files (*)"));
    if (request.pathB.isEmpty()) return;
    bool ok = false;
    request.text = QInputDialog::getText(this, tr("Compare two takes"),
                                         tr("The script, to align words from (empty: frame by frame only):"),
                                         QLineEdit::Normal, {}, &ok);
    if (!ok) return;
    auto* window = new CompareWindow(this);
    window->setAttribute(Qt::WA_DeleteOnClose);
    window->setWindowFlag(Qt::Window);
    window->resize(1400, 1000);
    window->show();
    window->open(request);
}

bool MainWindow::isModelLane(const QString& id) const {
    return id == predictedLane_->id() || id == differenceLane_->id() || id == attentionLane_->id() ||
           id == tokensLane_->id();
}

void MainWindow::closeModelLanes() {
    modelMelPath_.clear();
    modelLoader_->forget(ModelJob::Mel);
    modelLoader_->forget(ModelJob::Attention);
    for (ModelMelLane* lane : {predictedLane_, differenceLane_}) lane->setModelMel(nullptr);
    attentionLane_->setAttention(nullptr);
    tokensLane_->setTier(Tier{"tokens", {}});
    for (Lane* lane : stack_->lanes())
        if (isModelLane(lane->id())) stack_->setLaneVisible(lane->id(), false);
}

void MainWindow::openAttention(const QString& npyPath, const QString& tokensPath) {
    notify(tr("Reading the attention matrix %1…").arg(QFileInfo(npyPath).fileName()));
    modelLoader_->openAttention(npyPath, tokensPath);
}

void MainWindow::openAttentionDialog() {
    const QString start = audio_ ? QFileInfo(audio_->path).absolutePath() : QString();
    const QString npy = QFileDialog::getOpenFileName(this, tr("Open attention matrix"), start,
                                                     tr("NumPy arrays (*.npy);;All files (*)"));
    if (npy.isEmpty()) return;
    const QString tokens = QFileDialog::getOpenFileName(this, tr("Open the matrix's input tokens"), QFileInfo(npy).absolutePath(),
                                                        tr("Token lists (*.txt *.json);;All files (*)"));
    if (!tokens.isEmpty()) openAttention(npy, tokens);
}

void MainWindow::onAttention(ModelAttentionPtr attention) {
    attentionLane_->setAttention(attention);
    tokensLane_->setTier(attention->alignment.tokens);
    for (Lane* lane : {static_cast<Lane*>(attentionLane_), static_cast<Lane*>(tokensLane_)})
        stack_->setLaneVisible(lane->id(), true);
    QStringList faults;
    for (const AttentionEvent& e : attention->alignment.faults) faults << attention->describe(e);
    notify(tr("%1: %2 tokens over %3 frames; %4")
               .arg(QFileInfo(attention->path).fileName())
               .arg(attention->tokens)
               .arg(attention->frames)
               .arg(faults.isEmpty() ? tr("no skips or repeats") : faults.join(QStringLiteral("; "))));
    emit modelSettled(true, {});
}

void MainWindow::startModelMel() {
    if (modelMelPath_.isEmpty() || !audio_) return;  // onAudio starts it
    notify(tr("Comparing %1 with the take's mel…").arg(QFileInfo(modelMelPath_).fileName()));
    modelLoader_->openMel(modelMelPath_, audio_);
}

void MainWindow::onModelMel(ModelMelPtr mel) {
    predictedLane_->setLook(spectrogram_->look());
    for (ModelMelLane* lane : {predictedLane_, differenceLane_}) {
        lane->setModelMel(mel);
        stack_->setLaneVisible(lane->id(), true);
    }
    QString text = tr("Predicted mel: mean |Δ| %1 dB, largest %2 dB at %3 s, %4 Hz; %5 region(s) ≥ 6 dB")
                       .arg(mel->meanAbsDb, 0, 'f', 1)
                       .arg(mel->maxAbsDb, 0, 'f', 1)
                       .arg(mel->maxTimeS, 0, 'f', 2)
                       .arg(mel->maxHz, 0, 'f', 0)
                       .arg(mel->regions);
    if (!mel->warnings.isEmpty()) text += tr(" — warnings: %1").arg(mel->warnings.join(QStringLiteral("; ")));
    notify(text);
    emit modelSettled(true, {});
}

}  // namespace earmark::gui
