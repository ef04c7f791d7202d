#include "earmark/widgets/longform_loader.hpp"

#include "earmark/acoustic/model_aligner.hpp"

namespace earmark::widgets {

LongformLoader::LongformLoader(QObject* parent) : QObject(parent) {}

LongformLoader::~LongformLoader() {
    blockSignals(true);  // receivers may be half-destroyed already (a parent window)
}

void LongformLoader::start(TakeAudioPtr audio, const QString& text, const QString& voice) {
    job_.start(
        this,
        [audio, text = text.toStdString(), voice = voice.toStdString()](Progress progress) {
            const ChunkAligner aligner = chunkAlignerFor(resolveAlignMethod("auto", voice), voice);
            return reviewLongTake(audio->signal, text, LongformRules{}, aligner, progress);
        },
        [this](double f) { emit progressChanged(f); },
        [this](LongTakeReviewPtr review, const QString& error) {
            emit busyChanged(false);
            if (review) emit ready(review);
            else emit failed(error.isEmpty() ? tr("the long-form review ended without a result") : error);
        });
    emit busyChanged(true);
}

void LongformLoader::cancel() {
    if (job_.cancel()) emit busyChanged(false);
}

}  // namespace earmark::widgets
