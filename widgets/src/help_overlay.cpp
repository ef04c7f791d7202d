#include "earmark/widgets/help_overlay.hpp"

#include <QAction>
#include <QKeyEvent>
#include <QMenu>
#include <QMenuBar>
#include <QPainter>

namespace earmark::widgets {

HelpOverlay::HelpOverlay(QMenuBar* menus, QWidget* parent) : QWidget(parent), menus_(menus) {
    setFocusPolicy(Qt::StrongFocus);
    hide();
    parent->installEventFilter(this);
}

void HelpOverlay::toggle() {
    if (isVisible()) {
        hide();
        return;
    }
    setGeometry(parentWidget()->rect());
    raise();
    show();
    setFocus();
}

bool HelpOverlay::eventFilter(QObject* watched, QEvent* event) {
    if (watched == parentWidget() && event->type() == QEvent::Resize) setGeometry(parentWidget()->rect());
    return QWidget::eventFilter(watched, event);
}

void HelpOverlay::keyPressEvent(QKeyEvent*) { hide(); }

void HelpOverlay::mousePressEvent(QMouseEvent*) { hide(); }

void HelpOverlay::paintEvent(QPaintEvent*) {
    QPainter p(this);
    p.setRenderHint(QPainter::Antialiasing);
    const QPalette pal = palette();
    QColor shade = pal.color(QPalette::Window);
    shade.setAlpha(238);
    p.fillRect(rect(), shade);

    QFont heading = font();
    heading.setBold(true);
    const QFontMetrics fm(font());
    const int line = fm.height() + 4;
    const int columnWidth = std::max(300, fm.horizontalAdvance(QStringLiteral("M")) * 34);
    const int columns = std::max(1, (width() - 40) / columnWidth);
    int col = 0, x = 24, y = 20;

    p.setFont(heading);
    p.setPen(pal.color(QPalette::Text));
    p.drawText(QPoint(x, y + fm.ascent()), tr("Keyboard — press any key to close"));
    y += 2 * line;
    const int top = y;
    for (QAction* menuAction : menus_->actions()) {
        QMenu* menu = menuAction->menu();
        if (!menu) continue;
        QList<QAction*> items;
        for (QAction* a : menu->actions())
            if (!a->isSeparator() && !a->menu()) items << a;
        if (y + (items.size() + 1) * line > height() - 10 && y > top) {
            col = (col + 1) % columns;
            x = 24 + col * columnWidth;
            y = top;
        }
        p.setFont(heading);
        p.setPen(pal.color(QPalette::Highlight));
        p.drawText(QPoint(x, y + fm.ascent()), menu->title().remove('&'));
        y += line;
        p.setFont(font());
        for (QAction* a : items) {
            p.setPen(a->isEnabled() ? pal.color(QPalette::Text) : pal.color(QPalette::PlaceholderText));
            p.drawText(QPoint(x + 8, y + fm.ascent()), a->text().remove('&'));
            const QString keys = a->shortcut().toString(QKeySequence::NativeText);
            p.drawText(QRect(x, y, columnWidth - 24, line), Qt::AlignRight | Qt::AlignTop, keys);
            y += line;
        }
        y += line / 2;
    }
}

}  // namespace earmark::widgets
