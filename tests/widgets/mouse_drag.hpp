// A left-button drag as the lanes see it: press, one move with the button
// held, release.
#pragma once

#include <QApplication>
#include <QMouseEvent>
#include <QTest>

namespace earmark::test {

inline void dragMouse(QWidget* widget, QPoint from, QPoint to) {
    QTest::mousePress(widget, Qt::LeftButton, {}, from);
    QMouseEvent move(QEvent::MouseMove, to, widget->mapToGlobal(to), Qt::NoButton, Qt::LeftButton, Qt::NoModifier);
    QApplication::sendEvent(widget, &move);
    QTest::mouseRelease(widget, Qt::LeftButton, {}, to);
}

}  // namespace earmark::test
