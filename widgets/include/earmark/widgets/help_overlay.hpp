// A translucent sheet over the window listing every menu action with its
// shortcut, read from the menu bar when shown, so it never goes stale. Any key
// or click closes it.
#pragma once

#include <QWidget>

class QMenuBar;

namespace earmark::widgets {

class HelpOverlay : public QWidget {
    Q_OBJECT
public:
    HelpOverlay(QMenuBar* menus, QWidget* parent);
    void toggle();

protected:
    void paintEvent(QPaintEvent* event) override;
    void keyPressEvent(QKeyEvent* event) override;
    void mousePressEvent(QMouseEvent* event) override;
    bool eventFilter(QObject* watched, QEvent* event) override;

private:
    QMenuBar* menus_;
};

}  // namespace earmark::widgets
