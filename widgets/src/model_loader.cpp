#include "earmark/widgets/model_loader.hpp"

#include <QtConcurrent/QtConcurrent>

#include <algorithm>

namespace earmark::widgets {

ModelLoader::ModelLoader(QObject* parent) : QObject(parent) {}

ModelLoader::~ModelLoader() {
    blockSignals(true);  // receivers may be half-destroyed already (a parent window)
    for (auto& f : running_) f.waitForFinished();
}

bool ModelLoader::busy() const {
    return std::any_of(running_.begin(), running_.end(), [](const auto& f) { return !f.isFinished(); });
}

void ModelLoader::forget(ModelJob job) { ++latest_[static_cast<int>(job)]; }

void ModelLoader::openMel(const QString& npyPath, TakeAudioPtr audio) {
    run(ModelJob::Mel, [npyPath, audio] { return std::shared_ptr<const void>(loadModelMel(npyPath, *audio)); });
}

void ModelLoader::openAttention(const QString& npyPath, const QString& tokensPath) {
    run(ModelJob::Attention,
        [npyPath, tokensPath] { return std::shared_ptr<const void>(loadModelAttention(npyPath, tokensPath)); });
}

void ModelLoader::run(ModelJob job, std::function<std::shared_ptr<const void>()> work) {
    const quint64 request = ++latest_[static_cast<int>(job)];
    std::erase_if(running_, [](const QFuture<Result>& f) { return f.isFinished(); });
    // The watcher lives until its own finished signal has been handled (a
    // finished future may not have told its watcher yet).
    auto* w = new QFutureWatcher<Result>(this);
    connect(w, &QFutureWatcher<Result>::finished, this, [this, w, job, request] {
        w->deleteLater();
        const Result r = w->result();
        if (request != latest_[static_cast<int>(job)]) return;
        if (!r.value) emit failed(job, r.error);
        else if (job == ModelJob::Mel) emit melReady(std::static_pointer_cast<const ModelMel>(r.value));
        else emit attentionReady(std::static_pointer_cast<const ModelAttention>(r.value));
    });
    QFuture<Result> future = QtConcurrent::run([work = std::move(work)]() -> Result {
        try {
            return {work(), {}};
        } catch (const std::exception& e) {
            return {nullptr, QString::fromLocal8Bit(e.what())};
        }
    });
    running_.push_back(future);
    w->setFuture(future);
}

}  // namespace earmark::widgets
