// Reviews a long take (earmark/longform/long_take_review.hpp: series,
// findings, and tiers from its text) off the UI thread. Each start() cancels
// the review before; only the latest one is reported. cancel() stops it; the
// destructor cancels and waits.
//
// Thread-safety: use from the GUI thread; signals arrive on the GUI thread.
#pragma once

#include "earmark/longform/long_take_review.hpp"
#include "earmark/widgets/latest_job.hpp"
#include "earmark/widgets/take_data.hpp"

#include <QObject>

namespace earmark::widgets {

using LongTakeReviewPtr = std::shared_ptr<const LongTakeReview>;

class LongformLoader : public QObject {
    Q_OBJECT
public:
    explicit LongformLoader(QObject* parent = nullptr);
    ~LongformLoader() override;

    // `text` empty: measures and findings only. The text, read in `voice`, is aligned with the
    // acoustic model where it covers the voice, else with the espeak-ng reference (resolveAlignMethod).
    void start(TakeAudioPtr audio, const QString& text, const QString& voice = QStringLiteral("en-us"));
    void cancel();
    bool busy() const { return job_.busy(); }

signals:
    void ready(earmark::widgets::LongTakeReviewPtr review);
    void failed(const QString& message);
    void progressChanged(double fraction);  // 0…1
    void busyChanged(bool busy);

private:
    LatestJob<LongTakeReview> job_;
};

}  // namespace earmark::widgets

Q_DECLARE_METATYPE(earmark::widgets::LongTakeReviewPtr)
