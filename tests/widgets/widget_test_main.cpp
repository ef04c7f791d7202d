// GoogleTest main for widget tests: one QApplication for the whole run, on
// Qt's offscreen platform unless the environment chose another one.
#include <QApplication>
#include <QStandardPaths>

#include <gtest/gtest.h>

int main(int argc, char** argv) {
    if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", "offscreen");
    QStandardPaths::setTestModeEnabled(true);  // QSettings go to a test location
    QApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("EarmarkTests"));
    QApplication::setApplicationName(QStringLiteral("earmark_widgets_tests"));
    ::testing::InitGoogleTest(&argc, argv);
    return RUN_ALL_TESTS();
}
