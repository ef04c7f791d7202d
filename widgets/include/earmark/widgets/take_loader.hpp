// Loads and analyses takes off the UI thread.
//
// open(path) starts one background job (QtConcurrent::run with a QPromise):
// it reads the file and builds the waveform summary (→ audioReady), then runs
// the analysis and both spectrograms (→ tracksReady). reanalyse(settings)
// repeats only the second step on the audio already loaded. Every request gets
// a new id; a new request cancels the previous job, and results of any request
// but the latest are dropped, so the latest request always wins. Results are
// values tagged with their request id. The destructor cancels and waits.
//
// Thread-safety: use from the GUI thread; signals arrive on the GUI thread.
#pragma once

#include "earmark/widgets/analysis_settings.hpp"
#include "earmark/widgets/take_data.hpp"

#include <QFuture>
#include <QFutureWatcher>
#include <QObject>

#include <memory>
#include <vector>

namespace earmark::widgets {

// One value a job produces: the audio, the tracks, or an error message.
struct LoadResult {
    quint64 request = 0;
    TakeAudioPtr audio;
    TakeTracksPtr tracks;
    QString error;  // non-empty for a failure (names the file and the problem)
};

// The two steps, plain functions so they can be tested without threads.
// Both throw earmark::Error subclasses and Cancelled.
TakeAudioPtr loadTake(const QString& path, Progress progress = {});
TakeTracksPtr analyseTake(const TakeAudio& audio, const AnalysisSettings& settings, Progress progress = {});

class TakeLoader : public QObject {
    Q_OBJECT
public:
    explicit TakeLoader(QObject* parent = nullptr);
    ~TakeLoader() override;

    quint64 open(const QString& path, const AnalysisSettings& settings);
    // Re-runs the analysis of the current take; returns 0 if nothing is loaded.
    quint64 reanalyse(const AnalysisSettings& settings);
    void cancel();  // stops the running job (its results are dropped)

    bool busy() const;
    quint64 latestRequest() const { return latest_; }

signals:
    void audioReady(quint64 request, earmark::widgets::TakeAudioPtr audio);
    void tracksReady(quint64 request, earmark::widgets::TakeTracksPtr tracks);
    void failed(quint64 request, const QString& message);
    void progressChanged(quint64 request, double fraction);  // 0…1
    void busyChanged(bool busy);

private:
    void start(QFuture<LoadResult> future);
    void onResult(int index);
    void onFinished();

    quint64 latest_ = 0;
    TakeAudioPtr audio_;  // of the latest opened take
    std::unique_ptr<QFutureWatcher<LoadResult>> watcher_;
    std::vector<QFuture<LoadResult>> abandoned_;  // cancelled jobs still running
};

}  // namespace earmark::widgets
