// The attention lane: a model's attention matrix (model_attention.hpp) as
// an image over time — decoder frame f at [f·hop, (f+1)·hop) s, input token
// k as row k from the top, weight 0…1 in the "dusk" colours — with the
// monotonic token path drawn over it and the skip/repeat faults marked: a
// skip as a red line at its frame, a repeat as an amber band over its
// frames, each with a short caption; the pointer over a mark shows the
// fault as a tooltip. The token tier itself is shown by a TierLane.
#pragma once

#include "earmark/widgets/lane.hpp"
#include "earmark/widgets/model_attention.hpp"

#include <optional>

namespace earmark::widgets {

class AttentionLane : public Lane {
    Q_OBJECT
public:
    explicit AttentionLane(ViewState* view, QWidget* parent = nullptr);  // id "attention"
    QSize sizeHint() const override { return QSize(400, 180); }

    void setAttention(ModelAttentionPtr attention);  // null: empty
    const ModelAttentionPtr& attention() const { return attention_; }

    // The weight under a point (0…1); empty outside the matrix.
    std::optional<double> weightAt(QPoint pos) const;
    // The faults under a point (a skip within 4 px), one per line; empty when none.
    QString faultTextAt(QPoint pos) const;
    QString describePoint(QPoint pos) const override;

    static const QColor skipColour;    // red
    static const QColor repeatColour;  // amber

protected:
    void drawContent(QPainter& painter) override;
    bool event(QEvent* event) override;

private:
    std::optional<int> tokenAtY(double y) const;
    double yOfToken(double token) const;  // top edge of row `token`

    ModelAttentionPtr attention_;
};

}  // namespace earmark::widgets
