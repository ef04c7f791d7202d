#include "earmark/widgets/word_evidence_loader.hpp"

#include "earmark/core/error.hpp"

#include <QPromise>
#include <QtConcurrent/QtConcurrent>

namespace earmark::widgets {

namespace {

template <class R>
void gather(QPromise<R>& promise, quint64 request, TakeAudioPtr audio, std::string text, std::string voice) {
    promise.setProgressRange(0, 1000);
    R r;
    r.request = request;
    try {
        WordEvidenceParams params;
        params.voice = voice;
        Progress progress([&promise](double f) {
            promise.setProgressValue(static_cast<int>(1000.0 * f));
            return !promise.isCanceled();
        });
        r.evidence = std::make_shared<const WordEvidenceResult>(gatherWordEvidence(audio->signal, text, params, progress));
    } catch (const Cancelled&) {
        r.cancelled = true;
    } catch (const std::exception& e) {
        r.error = QString::fromStdString(e.what());
    }
    promise.addResult(std::move(r));
}

}  // namespace

WordEvidenceLoader::WordEvidenceLoader(QObject* parent) : QObject(parent) {}

WordEvidenceLoader::~WordEvidenceLoader() {
    blockSignals(true);  // receivers may be half-destroyed already (a parent window)
    cancel();
    for (auto& f : abandoned_) f.waitForFinished();
}

bool WordEvidenceLoader::busy() const { return watcher_ && watcher_->isRunning(); }

quint64 WordEvidenceLoader::start(TakeAudioPtr audio, const QString& text, const QString& voice) {
    cancel();
    const quint64 request = ++latest_;
    watcher_ = std::make_unique<QFutureWatcher<Result>>();
    connect(watcher_.get(), &QFutureWatcher<Result>::finished, this, &WordEvidenceLoader::onFinished);
    connect(watcher_.get(), &QFutureWatcher<Result>::progressValueChanged, this,
            [this](int value) { emit progressChanged(value / 1000.0); });
    watcher_->setFuture(QtConcurrent::run(gather<Result>, request, std::move(audio), text.toStdString(), voice.toStdString()));
    emit busyChanged(true);
    return request;
}

void WordEvidenceLoader::cancel() {
    if (!watcher_) return;
    watcher_->disconnect(this);
    QFuture<Result> f = watcher_->future();
    f.cancel();
    watcher_.reset();
    std::erase_if(abandoned_, [](const QFuture<Result>& a) { return a.isFinished(); });
    if (!f.isFinished()) abandoned_.push_back(f);
    emit busyChanged(false);
}

void WordEvidenceLoader::onFinished() {
    if (!watcher_) return;
    const QFuture<Result> f = watcher_->future();
    watcher_.release()->deleteLater();  // it is the sender of this call
    emit busyChanged(false);
    if (f.resultCount() == 0) return;
    const Result r = f.result();
    if (r.request != latest_ || r.cancelled) return;
    if (r.evidence) emit ready(r.request, r.evidence);
    else emit failed(r.request, r.error);
}

}  // namespace earmark::widgets
