// A timings file opened beside a plain audio file: its tiers show in the
// lanes, an edit marks the take's timings unsaved until File > Save timings
// writes them, and undo walks back to the saved state.
#include "earmark/tiers/timings_file.hpp"
#include "earmark/widgets/mark_lane.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "earmark/widgets/view_state.hpp"
#include "main_window.hpp"
#include "support/temp_dir.hpp"

#include <QAction>
#include <QMenuBar>
#include <QSignalSpy>
#include <QTest>
#include <QUndoStack>

#include <gtest/gtest.h>

#include <filesystem>

namespace earmark::widgets {
namespace {

TEST(LooseTimings, OpenEditSaveAndTheUnsavedIndicator) {
    namespace fs = std::filesystem;
    earmark::test::TempDir dir;
    const fs::path samples = fs::path(EARMARK_SOURCE_DIR) / "samples";
    fs::copy_file(samples / "takes" / "ferry-002.wav", dir.path() / "ferry-002.wav");
    fs::copy_file(samples / "timings" / "ferry-002.json", dir.path() / "ferry-002.json");
    const QString timings = QString::fromStdString(dir.file("ferry-002.json"));

    gui::MainWindow window;
    window.resize(1200, 800);
    window.show();
    window.activateWindow();
    ASSERT_TRUE(QTest::qWaitForWindowActive(&window));
    QSignalSpy settled(&window, &gui::MainWindow::takeSettled);
    window.openTakes({{"ferry-002", QString::fromStdString(dir.file("ferry-002.wav")), {}}});
    ASSERT_TRUE(settled.wait(30000));
    EXPECT_TRUE(window.markLane()->isVisible());

    ASSERT_TRUE(window.openTimings(timings));
    const Tier original = *window.currentTiers().find(kWordsTier);
    TierLane* lane = window.tierLane("words");
    EXPECT_EQ(lane->tier().intervals.size(), original.intervals.size());
    EXPECT_FALSE(window.tiersUnsaved());
    EXPECT_FALSE(window.windowTitle().contains("not saved"));

    // Split the first word at its middle: unsaved until saved.
    const double middle = 0.5 * (original.intervals[0].startS + original.intervals[0].endS);
    window.viewState()->setCursor(middle);
    QTest::keyClick(&window, Qt::Key_S);
    EXPECT_EQ(lane->tier().intervals.size(), original.intervals.size() + 1);
    EXPECT_TRUE(window.tiersUnsaved());
    EXPECT_TRUE(window.windowTitle().contains("not saved"));
    QTest::keyClick(&window, Qt::Key_Z, Qt::ControlModifier);  // back to what the file holds
    EXPECT_FALSE(window.tiersUnsaved());
    QTest::keyClick(&window, Qt::Key_Z, Qt::ControlModifier | Qt::ShiftModifier);
    EXPECT_TRUE(window.tiersUnsaved());

    QTest::keyClick(&window, Qt::Key_S, Qt::ControlModifier);  // save to the same file
    EXPECT_FALSE(window.tiersUnsaved());
    EXPECT_FALSE(window.windowTitle().contains("not saved"));
    const LoadedTimings back = loadTimings(timings.toStdString());
    ASSERT_NE(back.tiers.find(kWordsTier), nullptr);
    EXPECT_EQ(back.tiers.find(kWordsTier)->intervals.size(), original.intervals.size() + 1);
    EXPECT_NEAR(back.tiers.find(kWordsTier)->intervals[0].endS, middle, 0.0005);
}

}  // namespace
}  // namespace earmark::widgets
