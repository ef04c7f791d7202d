// The window's size on first start: no saved geometry means most of the
// screen, not the layout's minimum (which squeezes the lanes).
#include "main_window.hpp"

#include <QGuiApplication>
#include <QScreen>
#include <QSettings>

#include <gtest/gtest.h>

namespace earmark::gui {
namespace {

TEST(FirstRun, WithoutSavedGeometryTheWindowTakesMostOfTheScreen) {
    QSettings().remove(QStringLiteral("window/geometry"));
    MainWindow window;
    const QRect area = QGuiApplication::primaryScreen()->availableGeometry();
    EXPECT_GE(window.width(), area.width() * 8 / 10);
    EXPECT_GE(window.height(), area.height() * 8 / 10);
    EXPECT_TRUE(area.contains(window.geometry().center()));
}

TEST(FirstRun, ASavedGeometryIsRestoredInstead) {
    {
        MainWindow window;
        window.resize(640, 480);
        window.close();  // saves the geometry, as on quitting
    }
    MainWindow again;
    EXPECT_EQ(again.size(), QSize(640, 480));
    QSettings().remove(QStringLiteral("window/geometry"));
}

}  // namespace
}  // namespace earmark::gui
