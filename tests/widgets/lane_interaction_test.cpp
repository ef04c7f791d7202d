// Mouse and keyboard on the lanes and the window: click sets the cursor, drag
// selects, Ctrl+wheel zooms about the pointer, the overview window drags, and
// every action has a shortcut of its own.
#include "earmark/widgets/audio_player.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/overview_lane.hpp"
#include "earmark/widgets/waveform_lane.hpp"
#include "main_window.hpp"
#include "sample_take.hpp"

#include <QAction>
#include <QMenuBar>
#include <QSignalSpy>
#include <QTest>
#include <QWheelEvent>

#include <gtest/gtest.h>

#include <set>

namespace earmark::widgets {
namespace {

struct LaneFixture : ::testing::Test {
    ViewState view;
    WaveformLane lane{&view};
    void SetUp() override {
        view.resetForDuration(10.0);
        lane.resize(Lane::gutterWidth + Lane::rightMargin + 1000, 120);  // 1000 px = 10 s
        lane.show();
    }
    QPoint at(double seconds) const {
        return QPoint(lane.plotRect().left() + static_cast<int>(std::lround(lane.mapping().timeToX(seconds))), 60);
    }
};

TEST_F(LaneFixture, ClickSetsTheCursorAndClearsTheSelection) {
    view.setSelection(TimeRange{1.0, 2.0});
    QTest::mouseClick(&lane, Qt::LeftButton, {}, at(4.0));
    EXPECT_NEAR(view.cursor(), 4.0, 0.011);
    EXPECT_FALSE(view.selection());
}

TEST_F(LaneFixture, DragSelectsEitherWay) {
    QTest::mousePress(&lane, Qt::LeftButton, {}, at(6.0));
    QMouseEvent move(QEvent::MouseMove, at(3.0), lane.mapToGlobal(at(3.0)), Qt::NoButton, Qt::LeftButton, Qt::NoModifier);
    QApplication::sendEvent(&lane, &move);
    QTest::mouseRelease(&lane, Qt::LeftButton, {}, at(3.0));
    ASSERT_TRUE(view.selection());
    EXPECT_NEAR(view.selection()->start, 3.0, 0.011);
    EXPECT_NEAR(view.selection()->end, 6.0, 0.011);
    EXPECT_NEAR(view.cursor(), 3.0, 0.011);
}

TEST_F(LaneFixture, ShiftClickExtendsFromTheCursor) {
    view.setCursor(2.0);
    QTest::mouseClick(&lane, Qt::LeftButton, Qt::ShiftModifier, at(5.0));
    ASSERT_TRUE(view.selection());
    EXPECT_NEAR(view.selection()->start, 2.0, 1e-9);
    EXPECT_NEAR(view.selection()->end, 5.0, 0.011);
}

TEST_F(LaneFixture, CtrlWheelZoomsAboutThePointer) {
    const QPoint p = at(7.5);
    const double before = lane.mapping().xToTime(p.x() - lane.plotRect().left());
    QWheelEvent wheel(p, lane.mapToGlobal(p), {}, QPoint(0, 240), Qt::NoButton, Qt::ControlModifier,
                      Qt::NoScrollPhase, false);
    QApplication::sendEvent(&lane, &wheel);
    EXPECT_NEAR(view.visibleRange().span(), 10.0 / (1.25 * 1.25), 1e-9);
    const double after = lane.mapping().xToTime(p.x() - lane.plotRect().left());
    EXPECT_NEAR(after, before, 1e-9);
}

TEST_F(LaneFixture, PlainWheelScrolls) {
    view.setVisibleRange({2.0, 4.0});
    QWheelEvent wheel(at(3.0), lane.mapToGlobal(at(3.0)), {}, QPoint(0, -120), Qt::NoButton, Qt::NoModifier,
                      Qt::NoScrollPhase, false);
    QApplication::sendEvent(&lane, &wheel);
    EXPECT_NEAR(view.visibleRange().start, 2.2, 1e-9);
    EXPECT_NEAR(view.visibleRange().span(), 2.0, 1e-9);
}

TEST_F(LaneFixture, HoverFollowsThePointerAndLeavesWithIt) {
    QTest::mouseMove(&lane, at(1.5));
    ASSERT_TRUE(view.hoverTime());
    EXPECT_NEAR(*view.hoverTime(), 1.5, 0.011);
    QEvent leave(QEvent::Leave);
    QApplication::sendEvent(&lane, &leave);
    EXPECT_FALSE(view.hoverTime());
}

TEST(OverviewLane, DraggingTheWindowMovesAndItsEdgeResizesTheView) {
    ViewState view;
    view.resetForDuration(10.0);
    OverviewLane lane(&view);
    lane.resize(Lane::gutterWidth + Lane::rightMargin + 1000, 46);
    lane.show();
    view.setVisibleRange({2.0, 4.0});
    auto x = [&](double t) { return lane.plotRect().left() + static_cast<int>(std::lround(t * 100.0)); };
    EXPECT_EQ(lane.gripAt(x(3.0)), OverviewLane::Grip::Move);
    EXPECT_EQ(lane.gripAt(x(2.0)), OverviewLane::Grip::LeftEdge);
    EXPECT_EQ(lane.gripAt(x(4.0)), OverviewLane::Grip::RightEdge);
    EXPECT_EQ(lane.gripAt(x(8.0)), OverviewLane::Grip::None);

    auto drag = [&](int from, int to) {
        QTest::mousePress(&lane, Qt::LeftButton, {}, QPoint(from, 20));
        QMouseEvent move(QEvent::MouseMove, QPoint(to, 20), lane.mapToGlobal(QPoint(to, 20)), Qt::NoButton,
                         Qt::LeftButton, Qt::NoModifier);
        QApplication::sendEvent(&lane, &move);
        QTest::mouseRelease(&lane, Qt::LeftButton, {}, QPoint(to, 20));
    };
    drag(x(3.0), x(6.0));  // move by +3 s
    EXPECT_NEAR(view.visibleRange().start, 5.0, 0.011);
    EXPECT_NEAR(view.visibleRange().span(), 2.0, 1e-9);
    drag(x(7.0), x(9.0));  // right edge out to 9 s
    EXPECT_NEAR(view.visibleRange().start, 5.0, 0.011);
    EXPECT_NEAR(view.visibleRange().end, 9.0, 0.011);
}

TEST(MainWindow, EveryMenuActionHasItsOwnShortcut) {
    gui::MainWindow window;
    std::set<QString> seen;
    int actions = 0;
    for (QAction* menu : window.menuBar()->actions()) {
        ASSERT_TRUE(menu->menu());
        for (QAction* a : menu->menu()->actions()) {
            if (a->isSeparator()) continue;
            ++actions;
            const QString keys = a->shortcut().toString();
            EXPECT_FALSE(keys.isEmpty()) << a->text().toStdString();
            EXPECT_TRUE(seen.insert(keys).second) << "shortcut used twice: " << keys.toStdString();
        }
    }
    EXPECT_GE(actions, 30);
}

TEST(MainWindow, OpensATakeAndTheKeyboardNavigates) {
    const auto& sample = test::sampleTake();
    gui::MainWindow window;
    window.resize(1200, 800);
    window.show();
    QSignalSpy settled(&window, &gui::MainWindow::takeSettled);
    window.openTakes({{"voice", sample.path, {}}});
    ASSERT_TRUE(settled.wait(30000));
    EXPECT_TRUE(settled.at(0).at(0).toBool());
    ViewState* view = window.viewState();
    EXPECT_NEAR(view->duration(), sample.audio->duration(), 1e-9);
    EXPECT_NEAR(view->visibleRange().span(), view->duration(), 1e-9);

    QTest::keyClick(&window, Qt::Key_Equal);  // zoom in about the centre
    EXPECT_NEAR(view->visibleRange().span(), view->duration() / 1.5, 1e-9);
    QTest::keyClick(&window, Qt::Key_Right);
    EXPECT_GT(view->visibleRange().start, 0.0);
    view->setSelection(TimeRange{0.3, 0.5});
    QTest::keyClick(&window, Qt::Key_Z);  // zoom to selection
    EXPECT_NEAR(view->visibleRange().start, 0.3, 1e-9);
    EXPECT_NEAR(view->visibleRange().end, 0.5, 1e-9);
    QTest::keyClick(&window, Qt::Key_X);  // whole take
    EXPECT_NEAR(view->visibleRange().span(), view->duration(), 1e-9);
    QTest::keyClick(&window, Qt::Key_Escape);
    EXPECT_FALSE(view->selection());
    // No audio device in CI: playing must not crash and must leave no playhead.
    QTest::keyClick(&window, Qt::Key_Space);
    EXPECT_FALSE(view->playhead());
}

TEST(MainWindow, PlaybackActionsAreOffWithoutAnAudioDevice) {
    gui::MainWindow window;
    AudioPlayer probe(window.viewState());
    QAction* play = nullptr;
    for (QAction* menu : window.menuBar()->actions())
        for (QAction* a : menu->menu()->actions())
            if (a->shortcut() == QKeySequence(Qt::Key_Space)) play = a;
    ASSERT_NE(play, nullptr);
    EXPECT_EQ(play->isEnabled(), probe.available());
    if (!probe.available()) {
        EXPECT_FALSE(play->statusTip().isEmpty());
        QSignalSpy message(&probe, &AudioPlayer::message);
        EXPECT_FALSE(probe.play(PlayMode::FromCursor));
        ASSERT_EQ(message.count(), 1);
        EXPECT_TRUE(message.at(0).at(0).toString().contains("audio"));
    }
}

}  // namespace
}  // namespace earmark::widgets
