// One background computation at a time, of which only the latest counts:
// start() cancels the job before (a cancelled job still running is kept
// until it ends, so the destructor can wait for it) and runs `work` on the
// thread pool with a Progress that stops it when cancelled. `done` is called
// on the owner's thread with the latest job's value or error (never for a
// cancelled one); `progress` with 0…1.
//
// Thread-safety: use from the owner's (GUI) thread.
#pragma once

#include "earmark/core/error.hpp"
#include "earmark/core/progress.hpp"

#include <QFuture>
#include <QFutureWatcher>
#include <QObject>
#include <QPromise>
#include <QString>
#include <QtConcurrent/QtConcurrent>

#include <functional>
#include <memory>
#include <vector>

namespace earmark::widgets {

template <class T>
class LatestJob {
public:
    using Ptr = std::shared_ptr<const T>;
    using Work = std::function<T(Progress)>;
    // value set on success, else error (one line).
    using Done = std::function<void(Ptr value, const QString& error)>;

    ~LatestJob() {
        cancel();
        for (auto& f : abandoned_) f.waitForFinished();
    }

    void start(QObject* owner, Work work, std::function<void(double)> progress, Done done) {
        cancel();
        watcher_ = std::make_unique<QFutureWatcher<Result>>();
        QFutureWatcher<Result>* w = watcher_.get();
        QObject::connect(w, &QFutureWatcher<Result>::progressValueChanged, owner,
                         [progress](int value) { progress(value / 1000.0); });
        QObject::connect(w, &QFutureWatcher<Result>::finished, owner, [this, w, done] {
            if (watcher_.get() != w) return;
            const QFuture<Result> f = w->future();
            watcher_.release()->deleteLater();  // it is the sender of this call
            if (f.resultCount() == 0) return done(nullptr, QString());
            const Result r = f.result();
            if (!r.cancelled) done(r.value, r.error);
        });
        watcher_->setFuture(QtConcurrent::run(&LatestJob::run, std::move(work)));
    }

    // Stops the running job; true when there was one.
    bool cancel() {
        if (!watcher_) return false;
        watcher_->disconnect();
        QFuture<Result> f = watcher_->future();
        f.cancel();
        watcher_.reset();
        std::erase_if(abandoned_, [](const QFuture<Result>& a) { return a.isFinished(); });
        if (!f.isFinished()) abandoned_.push_back(f);
        return true;
    }

    bool busy() const { return watcher_ && watcher_->isRunning(); }

private:
    struct Result {
        Ptr value;
        QString error;
        bool cancelled = false;
    };

    static void run(QPromise<Result>& promise, Work work) {
        promise.setProgressRange(0, 1000);
        Result r;
        try {
            Progress progress([&promise](double f) {
                promise.setProgressValue(static_cast<int>(1000.0 * f));
                return !promise.isCanceled();
            });
            r.value = std::make_shared<const T>(work(progress));
        } catch (const Cancelled&) {
            r.cancelled = true;
        } catch (const std::exception& e) {
            r.error = QString::fromStdString(e.what());
        }
        promise.addResult(std::move(r));
    }

    std::unique_ptr<QFutureWatcher<Result>> watcher_;
    std::vector<QFuture<Result>> abandoned_;
};

}  // namespace earmark::widgets
