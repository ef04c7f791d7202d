#include "earmark/widgets/longform_loader.hpp"

namespace earmark::widgets {

LongformLoader::LongformLoader(QObject* parent) : QObject(parent) {}

LongformLoader::~LongformLoader() {
    blockSignals(true);  // receivers may be half-destroyed already (a parent window)
}

void LongformLoader::start(TakeAudioPtr audio, const QString& text) {
    job_.start(
        this,
        [audio, text = text.toStdString()](Progress progress) {
            return reviewLongTake(audio->signal, text, LongformRules{}, referenceWarpingAligner(), progress);
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
