// What the short lanes of labelled spans share (tiers, marks, suspects): the
// lane's name in the gutter instead of a title chip (a chip would cover the
// first label), a hint when the take has no spans, and the x of a time.
#pragma once

#include "earmark/widgets/lane.hpp"

namespace earmark::widgets {

class SpanLane : public Lane {
    Q_OBJECT
public:
    using Lane::Lane;
    // Text shown when the take has no spans (e.g. why there can be none).
    void setHint(const QString& text);
    const QString& hint() const { return hint_; }
    // The x (widget coordinates) of a time.
    double xOf(double seconds) const { return plotRect().left() + mapping().timeToX(seconds); }

protected:
    // Draws the name and, without spans, the hint. Returns whether there are
    // spans to draw (a take is loaded and `hasSpans`).
    bool drawFrame(QPainter& painter, bool hasSpans) const;

private:
    QString hint_;
};

}  // namespace earmark::widgets
