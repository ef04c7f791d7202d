#include "earmark/widgets/span_lane.hpp"

#include <QPainter>

namespace earmark::widgets {

void SpanLane::setHint(const QString& text) {
    hint_ = text;
    invalidateContent();
}

bool SpanLane::drawFrame(QPainter& p, bool hasSpans) const {
    const LaneColours c = colours();
    p.setPen(c.faintText);
    p.drawText(QRect(4, 0, gutterWidth - 10, height()), Qt::AlignRight | Qt::AlignVCenter, title());
    if (!take()) return false;
    if (!hasSpans) p.drawText(plotRect().adjusted(8, 0, 0, 0), Qt::AlignLeft | Qt::AlignVCenter, hint_);
    return hasSpans;
}

}  // namespace earmark::widgets
