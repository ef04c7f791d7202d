// The drift lane: the per-window measures of a long take (speech level, F0
// median, F0 range, articulation rate, timbre distance) as small stacked
// traces on the shared time axis, each scaled to its own range over the
// take (the gutter gives the range), with the long-form findings over them
// as hatched spans (a seam: a line) named on the trace they were read on.
// Clicking a finding selects its span, ready to be played and marked.
// It draws what the engine computed (earmark/longform/navigation.hpp).
#pragma once

#include "earmark/longform/navigation.hpp"
#include "earmark/widgets/lane.hpp"

#include <memory>

namespace earmark {
struct LongTakeReview;
}

namespace earmark::widgets {

class DriftLane : public Lane {
    Q_OBJECT
public:
    explicit DriftLane(ViewState* view, QWidget* parent = nullptr);
    QSize sizeHint() const override { return QSize(400, 150); }
    QString describePoint(QPoint pos) const override;

    // The review to show (null: none, with `why` in the lane).
    void setReview(std::shared_ptr<const LongTakeReview> review, const QString& why = {});
    const std::vector<DriftTrace>& traces() const { return traces_; }
    // Index of the finding drawn under a point (widget coordinates), or -1:
    // a seam on any trace, another finding on its own trace.
    int findingAt(QPointF pos) const;

signals:
    void findingClicked(int index);

protected:
    void drawContent(QPainter& painter) override;
    void mouseReleaseEvent(QMouseEvent* event) override;

private:
    QRectF rowRect(std::size_t row) const;
    int rowAt(double y) const;
    int rowOf(const Finding& f) const;  // -1 for a seam

    std::shared_ptr<const LongTakeReview> review_;
    std::vector<DriftTrace> traces_;
    QString why_;
};

}  // namespace earmark::widgets
