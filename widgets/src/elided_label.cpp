#include "earmark/widgets/elided_label.hpp"

#include <QPainter>

namespace earmark::widgets {

ElidedLabel::ElidedLabel(QWidget* parent) : QFrame(parent) {
    setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Preferred);
}

void ElidedLabel::setText(const QString& text) {
    if (text == text_) return;
    text_ = text;
    setToolTip(text);
    updateGeometry();
    update();
}

QString ElidedLabel::shownText() const {
    return fontMetrics().elidedText(text_, Qt::ElideRight, contentsRect().width());
}

QSize ElidedLabel::sizeHint() const {
    const QFontMetrics m = fontMetrics();
    return {m.horizontalAdvance(text_) + 4, m.height()};
}

QSize ElidedLabel::minimumSizeHint() const {
    // Room for a few characters and the ellipsis: the rest is in the tooltip.
    const QFontMetrics m = fontMetrics();
    return {m.horizontalAdvance(QStringLiteral("0")) * 12, m.height()};
}

void ElidedLabel::paintEvent(QPaintEvent* event) {
    QFrame::paintEvent(event);
    QPainter p(this);
    p.drawText(contentsRect(), Qt::AlignLeft | Qt::AlignVCenter, shownText());
}

}  // namespace earmark::widgets
