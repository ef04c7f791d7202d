// Runs the model comparisons of a take in the background (QtConcurrent):
// a predicted mel (model_mel.hpp) and an attention matrix
// (model_attention.hpp). Each kind has its own latest request: a new one, or
// forget(), drops the result of the one before. The destructor waits for
// running jobs.
//
// Thread-safety: use from the GUI thread; signals arrive on the GUI thread.
#pragma once

#include "earmark/widgets/model_attention.hpp"
#include "earmark/widgets/model_mel.hpp"

#include <QFutureWatcher>
#include <QObject>

#include <functional>
#include <memory>
#include <vector>

namespace earmark::widgets {

enum class ModelJob { Mel, Attention };

class ModelLoader : public QObject {
    Q_OBJECT
public:
    explicit ModelLoader(QObject* parent = nullptr);
    ~ModelLoader() override;

    void openMel(const QString& npyPath, TakeAudioPtr audio);
    void openAttention(const QString& npyPath, const QString& tokensPath);
    void forget(ModelJob job);
    bool busy() const;

signals:
    void melReady(earmark::widgets::ModelMelPtr mel);
    void attentionReady(earmark::widgets::ModelAttentionPtr attention);
    void failed(earmark::widgets::ModelJob job, const QString& message);

private:
    struct Result {
        std::shared_ptr<const void> value;  // ModelMel or ModelAttention
        QString error;
    };
    void run(ModelJob job, std::function<std::shared_ptr<const void>()> work);

    quint64 latest_[2] = {0, 0};
    std::vector<QFuture<Result>> running_;  // to wait for on teardown
};

}  // namespace earmark::widgets
