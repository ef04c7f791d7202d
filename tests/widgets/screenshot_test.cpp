// The built `earmark` binary's --screenshot mode, run as a user would.
#include "sample_take.hpp"

#include <QImage>
#include <QSet>
#include <QProcess>
#include <QProcessEnvironment>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

int runEarmark(const QStringList& args, QString* errors = nullptr) {
    QProcess p;
    QProcessEnvironment env = QProcessEnvironment::systemEnvironment();
    env.insert("QT_QPA_PLATFORM", "offscreen");
    p.setProcessEnvironment(env);
    p.start(QStringLiteral(EARMARK_GUI_PATH), args);
    if (!p.waitForFinished(60000)) {
        p.kill();
        p.waitForFinished();
        return -1;
    }
    if (errors) *errors = QString::fromLocal8Bit(p.readAllStandardError());
    return p.exitStatus() == QProcess::NormalExit ? p.exitCode() : -2;
}

TEST(Screenshot, WritesAPngOfTheRequestedSize) {
    const auto& sample = test::sampleTake();
    const QString png = QString::fromStdString(sample.dir.file("window.png"));
    ASSERT_EQ(runEarmark({sample.path, "--screenshot", png, "--size", "1024x640", "--view", "0.1:1.2"}), 0);
    const QImage image(png);
    ASSERT_FALSE(image.isNull());
    EXPECT_EQ(image.width(), 1024);
    EXPECT_EQ(image.height(), 640);
    // Not a blank window: the lanes put many colours on it.
    QSet<QRgb> colours;
    for (int y = 0; y < image.height(); y += 2)
        for (int x = 0; x < image.width(); x += 2) colours.insert(image.pixel(x, y));
    EXPECT_GT(colours.size(), 200);
}

TEST(Screenshot, TheTerminalStaysClean) {
    // No sound server, no XDG runtime folder, offscreen platform: Qt's notices
    // about these are not for the user (the window says "no audio device").
    const auto& sample = test::sampleTake();
    const QString png = QString::fromStdString(sample.dir.file("quiet.png"));
    QString errors = QStringLiteral("not run");
    ASSERT_EQ(runEarmark({sample.path, "--screenshot", png, "--size", "800x500"}, &errors), 0);
    EXPECT_EQ(errors, QString());
}

TEST(Screenshot, BadArgumentsExitWithTwo) {
    const auto& sample = test::sampleTake();
    const QString png = QString::fromStdString(sample.dir.file("bad.png"));
    QString errors;
    EXPECT_EQ(runEarmark({sample.path, "--screenshot", png, "--size", "wide"}, &errors), 2);
    EXPECT_TRUE(errors.contains("--size"));
    EXPECT_EQ(runEarmark({sample.path, "--screenshot", png, "--view", "2:1"}, &errors), 2);
    EXPECT_TRUE(errors.contains("--view"));
}

TEST(Screenshot, AnUnreadableTakeExitsWithOneAndNamesIt) {
    const auto& sample = test::sampleTake();
    const QString png = QString::fromStdString(sample.dir.file("missing.png"));
    QString errors;
    EXPECT_EQ(runEarmark({"/nonexistent/earmark-missing.wav", "--screenshot", png}, &errors), 1);
    EXPECT_TRUE(errors.contains("earmark-missing.wav"));
}

}  // namespace
}  // namespace earmark::widgets
