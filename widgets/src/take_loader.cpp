#include "earmark/widgets/take_loader.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"

#include <QPromise>
#include <QtConcurrent/QtConcurrent>

#include <algorithm>

namespace earmark::widgets {

TakeAudioPtr loadTake(const QString& path, Progress progress) {
    auto take = std::make_shared<TakeAudio>();
    take->path = path;
    LoadedAudio loaded = loadAudio(path.toStdString(), {}, {}, progress.sub(0.0, 0.9));
    take->info = loaded.info;
    take->signal = std::move(loaded.signal);
    take->summary = WaveformSummary::build(take->signal.samples);
    progress.report(1.0);
    return take;
}

TakeTracksPtr analyseTake(const TakeAudio& audio, const AnalysisSettings& settings, Progress progress) {
    const double rate = audio.signal.sampleRate;
    const double duration = audio.duration();
    AnalysisParams params = settings.toParams(rate, duration);
    // The mel spectrogram is computed on its own below, so that settings it
    // cannot use (too many bands for the FFT) cost only the mel view.
    params.tracks.mel = false;
    TakeAnalysis analysis = analyseSignal(audio.signal, params, progress.sub(0.0, 0.6), KeepSignal::No);
    auto tracks = std::make_shared<TakeTracks>();
    tracks->pitch = std::move(analysis.pitch);
    tracks->pitchSummary = analysis.pitchSummary;
    tracks->energy = std::move(analysis.energy);
    tracks->loudnessLufs = analysis.loudnessLufs;
    tracks->sampleStats = analysis.sampleStats;
    try {
        tracks->mel = SpectrogramView::make(computeMelSpectrogram(audio.signal, params.mel, progress.sub(0.6, 0.8)));
    } catch (const ParamError& e) {
        tracks->melProblem = QString::fromStdString(e.what());
    }
    progress.report(0.8);
    tracks->linear = SpectrogramView::make(
        computeSpectrogram(audio.signal, settings.linearStft(rate, duration), progress.sub(0.8, 0.98)));
    progress.report(1.0);
    return tracks;
}

namespace {

Progress promiseProgress(QPromise<LoadResult>& promise, double from, double to) {
    return Progress([&promise, from, to](double f) {
        promise.setProgressValue(static_cast<int>(1000.0 * (from + (to - from) * f)));
        return !promise.isCanceled();
    });
}

void runJob(QPromise<LoadResult>& promise, quint64 request, QString path, TakeAudioPtr audio,
            AnalysisSettings settings) {
    promise.setProgressRange(0, 1000);
    const bool loadFirst = !audio;
    try {
        if (loadFirst) {
            audio = loadTake(path, promiseProgress(promise, 0.0, 0.2));
            promise.addResult(LoadResult{request, audio, nullptr, {}});
        }
        auto tracks = analyseTake(*audio, settings, promiseProgress(promise, loadFirst ? 0.2 : 0.0, 1.0));
        promise.addResult(LoadResult{request, nullptr, std::move(tracks), {}});
    } catch (const Cancelled&) {
        // Dropped on purpose: a newer request or the user stopped this one.
    } catch (const std::exception& e) {
        promise.addResult(LoadResult{request, nullptr, nullptr, QString::fromStdString(e.what())});
    }
}

}  // namespace

TakeLoader::TakeLoader(QObject* parent) : QObject(parent) {}

TakeLoader::~TakeLoader() {
    blockSignals(true);  // receivers may be half-destroyed already (a parent window)
    cancel();
    for (auto& f : abandoned_) f.waitForFinished();
}

bool TakeLoader::busy() const { return watcher_ && watcher_->isRunning(); }

quint64 TakeLoader::open(const QString& path, const AnalysisSettings& settings) {
    const quint64 request = ++latest_;
    audio_.reset();
    start(QtConcurrent::run(runJob, request, path, TakeAudioPtr{}, settings));
    return request;
}

quint64 TakeLoader::reanalyse(const AnalysisSettings& settings) {
    if (!audio_) return 0;
    const quint64 request = ++latest_;
    start(QtConcurrent::run(runJob, request, audio_->path, audio_, settings));
    return request;
}

void TakeLoader::cancel() {
    if (!watcher_) return;
    watcher_->disconnect(this);
    QFuture<LoadResult> f = watcher_->future();
    f.cancel();
    watcher_.reset();
    // Forget jobs that have ended; keep the rest to wait for on teardown.
    std::erase_if(abandoned_, [](const QFuture<LoadResult>& a) { return a.isFinished(); });
    if (!f.isFinished()) abandoned_.push_back(f);
    emit busyChanged(false);
}

void TakeLoader::start(QFuture<LoadResult> future) {
    cancel();
    watcher_ = std::make_unique<QFutureWatcher<LoadResult>>();
    connect(watcher_.get(), &QFutureWatcher<LoadResult>::resultReadyAt, this, &TakeLoader::onResult);
    connect(watcher_.get(), &QFutureWatcher<LoadResult>::finished, this, &TakeLoader::onFinished);
    const quint64 request = latest_;
    connect(watcher_.get(), &QFutureWatcher<LoadResult>::progressValueChanged, this,
            [this, request](int value) { emit progressChanged(request, value / 1000.0); });
    watcher_->setFuture(future);
    emit busyChanged(true);
}

void TakeLoader::onResult(int index) {
    if (!watcher_) return;
    const LoadResult r = watcher_->resultAt(index);
    if (r.request != latest_) return;
    if (!r.error.isEmpty()) {
        emit failed(r.request, r.error);
    } else if (r.audio) {
        audio_ = r.audio;
        emit audioReady(r.request, r.audio);
    } else if (r.tracks) {
        emit tracksReady(r.request, r.tracks);
    }
}

void TakeLoader::onFinished() {
    emit busyChanged(false);
}

}  // namespace earmark::widgets
