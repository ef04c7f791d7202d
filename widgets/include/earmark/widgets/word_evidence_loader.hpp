// Gathers a take's word evidence (earmark/acoustic/word_evidence.hpp) off the
// UI thread. Each start() is a new request that cancels the one before; only
// the latest request's result or error is reported, tagged with its id.
// cancel() stops the running job; the destructor cancels and waits.
//
// Thread-safety: use from the GUI thread; signals arrive on the GUI thread.
#pragma once

#include "earmark/acoustic/word_evidence.hpp"
#include "earmark/widgets/take_data.hpp"

#include <QFuture>
#include <QFutureWatcher>
#include <QObject>

#include <memory>
#include <vector>

namespace earmark::widgets {

using WordEvidencePtr = std::shared_ptr<const WordEvidenceResult>;

class WordEvidenceLoader : public QObject {
    Q_OBJECT
public:
    explicit WordEvidenceLoader(QObject* parent = nullptr);
    ~WordEvidenceLoader() override;

    quint64 start(TakeAudioPtr audio, const QString& text, const QString& voice);
    void cancel();
    bool busy() const;
    quint64 latestRequest() const { return latest_; }

signals:
    void ready(quint64 request, earmark::widgets::WordEvidencePtr evidence);
    void failed(quint64 request, const QString& message);
    void progressChanged(double fraction);  // 0…1 of the latest request
    void busyChanged(bool busy);

private:
    struct Result {
        quint64 request = 0;
        WordEvidencePtr evidence;
        QString error;
        bool cancelled = false;
    };
    void onFinished();

    quint64 latest_ = 0;
    std::unique_ptr<QFutureWatcher<Result>> watcher_;
    std::vector<QFuture<Result>> abandoned_;  // cancelled jobs still running
};

}  // namespace earmark::widgets

Q_DECLARE_METATYPE(earmark::widgets::WordEvidencePtr)
