// The window on a copy of the demo session: the queue replaces the take list,
// keys move through it and set statuses, a mark made with two keys lands in
// the session file, marks and tiers are undone and redone through one stack,
// and the mark list opens another take at its mark. Each check reads the file
// back through a separate Session, as another program would.
#include "demo_session.hpp"
#include "mouse_drag.hpp"
#include "earmark/widgets/align_dialog.hpp"
#include "earmark/widgets/audio_player.hpp"
#include "earmark/store/tier_rows.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/mark_inspector.hpp"
#include "earmark/widgets/mark_lane.hpp"
#include "earmark/widgets/mark_list.hpp"
#include "earmark/widgets/mark_palette.hpp"
#include "earmark/widgets/review_queue.hpp"
#include "earmark/widgets/session_document.hpp"
#include "earmark/widgets/suspect_lane.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "earmark/widgets/view_state.hpp"
#include "main_window.hpp"

#include <QApplication>
#include <QComboBox>
#include <QLabel>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <QSignalSpy>
#include <QTest>
#include <QPushButton>
#include <QUndoStack>

#include <filesystem>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

struct SessionWindow : ::testing::Test {
    test::DemoSession demo;
    gui::MainWindow window;

    void SetUp() override {
        window.resize(1400, 900);
        window.show();
        window.activateWindow();
        ASSERT_TRUE(QTest::qWaitForWindowActive(&window));
    }
    Session reader() const { return Session::open(demo.path.toStdString(), OpenMode::ReadOnly); }
    // Runs `step` and waits until the take it opens is shown.
    bool settles(const std::function<void()>& step) {
        QSignalSpy settled(&window, &gui::MainWindow::takeSettled);
        step();
        return settled.wait(30000) && settled.last().at(0).toBool();
    }
    void key(int k, Qt::KeyboardModifiers mods = {}) {
        window.activateWindow();
        QTest::keyClick(&window, static_cast<Qt::Key>(k), mods);
    }
};

TEST_F(SessionWindow, TheQueueNavigatesAndStatusKeysWriteTheSession) {
    ASSERT_TRUE(settles([&] { ASSERT_TRUE(window.openSession(demo.path)); }));
    const auto takes = reader().takes();
    EXPECT_EQ(window.currentTakeId(), takes[0].id);
    EXPECT_EQ(window.reviewQueue()->currentTake(), takes[0].id);
    EXPECT_TRUE(window.reviewQueue()->isVisible());

    ASSERT_TRUE(settles([&] { key(Qt::Key_Down, Qt::AltModifier); }));
    EXPECT_EQ(window.currentTakeId(), takes[1].id);
    ASSERT_TRUE(settles([&] { key(Qt::Key_Up, Qt::AltModifier); }));
    EXPECT_EQ(window.currentTakeId(), takes[0].id);

    key(Qt::Key_U, Qt::ShiftModifier);  // back to unreviewed
    EXPECT_EQ(reader().take(takes[0].id).status, ReviewStatus::Unreviewed);
    EXPECT_EQ(window.reviewQueue()->progressText(), "11 / 12 reviewed");
    key(Qt::Key_S, Qt::ShiftModifier);
    EXPECT_EQ(reader().take(takes[0].id).status, ReviewStatus::Skipped);
    EXPECT_EQ(window.reviewQueue()->progressText(), "12 / 12 reviewed");
}

// With no mark selected, the inspector measures the selection; the mark made from it then shows
// the same figures (the measures do not depend on whether a span is marked yet).
TEST_F(SessionWindow, TheSelectionIsMeasuredBeforeItIsMarked) {
    ASSERT_TRUE(settles([&] { ASSERT_TRUE(window.openSession(demo.path)); }));
    MarkInspector* inspector = window.markInspector();
    EXPECT_FALSE(inspector->mark());
    EXPECT_EQ(inspector->measuresTitle(), "Measures of the span");
    EXPECT_TRUE(inspector->measuresText().contains("duration: —"));
    window.viewState()->setSelection(TimeRange{0.5, 0.9});
    EXPECT_EQ(inspector->measuresTitle(), "Measures of the selection, 0.500–0.900 s");
    const QString ofSelection = inspector->measuresText();
    EXPECT_TRUE(ofSelection.contains("duration: 0.400 s")) << ofSelection.toStdString();
    EXPECT_FALSE(ofSelection.contains("F0 mean: —")) << ofSelection.toStdString();  // the demo takes are voiced there
    key(Qt::Key_N);
    QTest::keyClick(window.markPalette()->filterEdit(), Qt::Key_2);
    QTest::keyClick(window.markPalette()->filterEdit(), Qt::Key_Return);
    ASSERT_TRUE(inspector->mark());
    EXPECT_EQ(inspector->measuresTitle(), "Measures of the mark");
    EXPECT_EQ(inspector->measuresText(), ofSelection);
}

TEST_F(SessionWindow, AMarkMadeWithTwoKeysIsStoredAndUndoable) {
    ASSERT_TRUE(settles([&] { ASSERT_TRUE(window.openSession(demo.path)); }));
    const TakeId take = *window.currentTakeId();
    const std::size_t before = reader().marks(take).size();

    window.viewState()->setSelection(TimeRange{0.5, 0.9});
    key(Qt::Key_N);
    MarkPalette* palette = window.markPalette();
    ASSERT_TRUE(palette->isVisible());
    QTest::keyClick(palette->filterEdit(), Qt::Key_2);  // intonation
    QTest::keyClick(palette->filterEdit(), Qt::Key_Return);
    EXPECT_FALSE(palette->isVisible());

    auto marks = reader().marks(take);
    ASSERT_EQ(marks.size(), before + 1);
    const auto made = std::find_if(marks.begin(), marks.end(), [](const Mark& m) { return m.startSeconds == 0.5; });
    ASSERT_NE(made, marks.end());
    const MarkId id = made->id;
    EXPECT_EQ(made->category, MarkCategory::Intonation);
    EXPECT_EQ(made->severity, Severity::Minor);
    EXPECT_FALSE(made->rater.empty());  // $EARMARK_RATER, the setting or the user name
    EXPECT_DOUBLE_EQ(made->endSeconds, 0.9);
    ASSERT_TRUE(made->measures.count("duration_s"));
    EXPECT_NEAR(made->measures.at("duration_s"), 0.4, 1e-6);
    EXPECT_TRUE(made->measures.count("energy_mean_db"));
    EXPECT_EQ(window.markLane()->selectedMark(), id);
    EXPECT_EQ(window.markInspector()->mark()->id, id);
    EXPECT_TRUE(window.markInspector()->measuresText().contains("duration: 0.400 s"));
    EXPECT_EQ(window.undoStack()->undoText(), "add intonation mark");

    key(Qt::Key_Z, Qt::ControlModifier);
    EXPECT_EQ(reader().marks(take).size(), before);
    key(Qt::Key_Z, Qt::ControlModifier | Qt::ShiftModifier);
    ASSERT_EQ(reader().marks(take).size(), before + 1);
    EXPECT_EQ(reader().mark(id).category, MarkCategory::Intonation);

    // Redo selects the mark again; edit it in the inspector: one undoable step per change.
    EXPECT_EQ(window.markLane()->selectedMark(), id);
    ASSERT_TRUE(window.markInspector()->mark());
    EXPECT_EQ(window.markInspector()->mark()->id, id);
    QComboBox* severity = window.markInspector()->severityBox();
    severity->setCurrentIndex(severity->findText("major"));
    EXPECT_EQ(reader().mark(id).severity, Severity::Major);
    EXPECT_EQ(window.undoStack()->undoText(), "edit intonation mark");
    key(Qt::Key_Z, Qt::ControlModifier);
    EXPECT_EQ(reader().mark(id).severity, Severity::Minor);
    EXPECT_EQ(severity->currentText(), "minor");  // the inspector follows the session

    // Delete, then undo the delete: the mark comes back with the same id.
    key(Qt::Key_Delete);
    EXPECT_EQ(reader().marks(take).size(), before);
    EXPECT_EQ(window.undoStack()->undoText(), "delete intonation mark");
    key(Qt::Key_Z, Qt::ControlModifier);
    ASSERT_EQ(reader().marks(take).size(), before + 1);
    EXPECT_EQ(reader().mark(id).startSeconds, 0.5);
}

TEST_F(SessionWindow, DraggingAMarkEdgeMovesTheStoredMark) {
    ASSERT_TRUE(settles([&] {
        ASSERT_TRUE(window.openSession(demo.path));
        ASSERT_TRUE(window.showSessionTake("ferry-005"));
    }));
    MarkLane* lane = window.markLane();
    ASSERT_EQ(lane->marks().size(), 1u);
    const Mark m = lane->marks().front();
    const QPoint from(static_cast<int>(std::lround(lane->xOf(m.endSeconds))), lane->height() / 2);
    const QPoint to(static_cast<int>(std::lround(lane->xOf(m.endSeconds + 0.3))), lane->height() / 2);
    test::dragMouse(lane, from, to);
    const Mark moved = reader().mark(m.id);
    EXPECT_NEAR(moved.endSeconds, m.endSeconds + 0.3, 2.0 * window.viewState()->duration() / lane->plotRect().width());
    EXPECT_NEAR(moved.measures.at("duration_s"), moved.endSeconds - moved.startSeconds, 1e-6);
    EXPECT_EQ(window.undoStack()->undoText(), "move timing mark");
    key(Qt::Key_Z, Qt::ControlModifier);
    EXPECT_DOUBLE_EQ(reader().mark(m.id).endSeconds, m.endSeconds);
}

TEST_F(SessionWindow, TierEditsAreWrittenAndUndone) {
    ASSERT_TRUE(settles([&] {
        ASSERT_TRUE(window.openSession(demo.path));
        ASSERT_TRUE(window.showSessionTake("ferry-005"));
    }));
    const TakeId take = *window.currentTakeId();
    const auto original = reader().tiers(take);
    auto wordsIn = [](const std::vector<TierRow>& rows) {
        std::vector<TierRow> w;
        for (const TierRow& r : rows)
            if (r.tier == "words") w.push_back(r);
        return w;
    };
    const auto words = wordsIn(original);
    ASSERT_GE(words.size(), 3u);
    TierLane* lane = window.tierLane("words");
    ASSERT_NE(lane, nullptr);
    ASSERT_EQ(lane->tier().intervals.size(), words.size());

    // Drag the end of the first word 20 ms later (it touches the second word or a gap).
    const double edge = words[0].endSeconds;
    const QPoint from(static_cast<int>(std::lround(lane->xOf(edge))), lane->height() / 2);
    const QPoint to(static_cast<int>(std::lround(lane->xOf(edge + 0.02))), lane->height() / 2);
    test::dragMouse(lane, from, to);
    const double pixel = window.viewState()->duration() / lane->plotRect().width();
    EXPECT_NEAR(wordsIn(reader().tiers(take))[0].endSeconds, edge + 0.02, 1.5 * pixel);
    EXPECT_EQ(window.undoStack()->undoText(), "move word boundary");
    key(Qt::Key_Z, Qt::ControlModifier);
    EXPECT_EQ(reader().tiers(take), original);

    // Split the third word at its middle, then merge it back; undo both.
    const double middle = 0.5 * (words[2].startSeconds + words[2].endSeconds);
    window.viewState()->setCursor(middle);
    key(Qt::Key_S);
    auto split = wordsIn(reader().tiers(take));
    ASSERT_EQ(split.size(), words.size() + 1);
    EXPECT_DOUBLE_EQ(split[2].endSeconds, middle);
    EXPECT_EQ(split[2].label, words[2].label);
    window.viewState()->setCursor(middle - 0.01);  // in the left part: it merges with the right one
    key(Qt::Key_J);
    EXPECT_EQ(wordsIn(reader().tiers(take)), words);
    key(Qt::Key_Z, Qt::ControlModifier);
    EXPECT_EQ(wordsIn(reader().tiers(take)).size(), words.size() + 1);
    key(Qt::Key_Z, Qt::ControlModifier);
    EXPECT_EQ(reader().tiers(take), original);
    EXPECT_EQ(lane->tier().intervals.size(), words.size());
}

TEST_F(SessionWindow, TheMarkListOpensTheTakeOfAMarkWithItsSuspects) {
    ASSERT_TRUE(settles([&] { ASSERT_TRUE(window.openSession(demo.path)); }));
    const Session r = reader();
    const TakeId t5 = *r.findTake("ferry-005");
    const Mark target = r.marks(t5).front();
    ASSERT_NE(window.currentTakeId(), t5);
    ASSERT_TRUE(settles([&] { emit window.markList()->markChosen(target.id); }));
    EXPECT_EQ(window.currentTakeId(), t5);
    ASSERT_TRUE(window.viewState()->selection());
    EXPECT_DOUBLE_EQ(window.viewState()->selection()->start, target.startSeconds);
    EXPECT_DOUBLE_EQ(window.viewState()->selection()->end, target.endSeconds);
    EXPECT_EQ(window.markLane()->selectedMark(), target.id);
    EXPECT_EQ(window.markInspector()->mark()->id, target.id);
    EXPECT_EQ(window.suspectLane()->suspects().size(), r.suspects(t5).size());
    EXPECT_FALSE(window.suspectLane()->suspects().empty());
}

TEST_F(SessionWindow, AlignFromTextRunsInTheBackgroundAndGivesTiers) {
    ASSERT_TRUE(settles([&] {
        ASSERT_TRUE(window.openSession(demo.path));
        ASSERT_TRUE(window.showSessionTake("ferry-007"));
    }));
    const TakeId take = *window.currentTakeId();
    key(Qt::Key_A, Qt::ControlModifier | Qt::ShiftModifier);
    AlignDialog* dialog = window.alignDialog();
    ASSERT_TRUE(dialog->isVisible());
    EXPECT_EQ(dialog->textEdit()->toPlainText().toStdString(), reader().take(take).text);  // prefilled
    QSignalSpy aligned(dialog, &AlignDialog::aligned);
    dialog->start();
    EXPECT_TRUE(dialog->running());  // returned at once: the work is on another thread
    ASSERT_TRUE(aligned.wait(60000));
    const Tier* words = window.currentTiers().find(kWordsTier);
    ASSERT_NE(words, nullptr);
    EXPECT_GE(words->intervals.size(), 8u);
    for (const Interval& w : words->intervals) EXPECT_TRUE(w.confidence.has_value());
    EXPECT_NE(window.currentTiers().find(kPhonesTier), nullptr);
    EXPECT_EQ(window.tierLane("words")->tier().intervals.size(), words->intervals.size());
    EXPECT_EQ(window.undoStack()->undoText(), "align words from text");
    // Stored in the session (without confidences: the store keeps none).
    std::size_t stored = 0;
    for (const TierRow& r : reader().tiers(take)) stored += r.tier == "words";
    EXPECT_EQ(stored, words->intervals.size());
}

TEST_F(SessionWindow, ATakeWithMissingAudioSaysSoAndOffersToLocateIt) {
    std::filesystem::rename(demo.dir.path() / "takes" / "ferry-004.wav", demo.dir.path() / "elsewhere.wav");
    ASSERT_TRUE(settles([&] { ASSERT_TRUE(window.openSession(demo.path)); }));
    QSignalSpy settled(&window, &gui::MainWindow::takeSettled);
    ASSERT_TRUE(window.showSessionTake("ferry-004"));
    ASSERT_EQ(settled.count(), 1);  // at once: there is nothing to load
    EXPECT_FALSE(settled.at(0).at(0).toBool());
    EXPECT_EQ(window.viewState()->duration(), 0.0);
    auto* locate = window.reviewQueue()->findChild<QPushButton*>("locateButton");
    ASSERT_NE(locate, nullptr);
    EXPECT_TRUE(locate->isVisible());
    // The next take still opens normally.
    ASSERT_TRUE(settles([&] { key(Qt::Key_Down, Qt::AltModifier); }));
    EXPECT_GT(window.viewState()->duration(), 0.0);
    EXPECT_FALSE(locate->isVisible());
}

}  // namespace
}  // namespace earmark::widgets

namespace earmark::widgets {
namespace {

// Close listening without a sound card: speed and repeat are settings shown in
// the status bar; hearing a suspect selects its span and degrades to a message.
TEST_F(SessionWindow, SpeedRepeatAndHearingASuspectWorkWithoutADevice) {
    ASSERT_TRUE(settles([&] {
        ASSERT_TRUE(window.openSession(demo.path));
        ASSERT_TRUE(window.showSessionTake("ferry-005"));
    }));
    auto* state = window.findChild<QLabel*>("playbackState");
    ASSERT_NE(state, nullptr);
    EXPECT_TRUE(state->text().contains(QString::fromUtf8("1×")));
    key(Qt::Key_Down);
    key(Qt::Key_Down);
    EXPECT_TRUE(state->text().contains(QString::fromUtf8("0.7×"))) << state->text().toStdString();
    for (int i = 0; i < 12; ++i) key(Qt::Key_Down);
    EXPECT_TRUE(state->text().contains(QString::fromUtf8("0.25×")));  // the ladder's foot
    for (int i = 0; i < 12; ++i) key(Qt::Key_Up);
    EXPECT_TRUE(state->text().contains(QString::fromUtf8("2×")));
    key(Qt::Key_1);
    EXPECT_TRUE(state->text().contains(QString::fromUtf8("1×")));
    key(Qt::Key_Down);
    key(Qt::Key_Down);
    key(Qt::Key_Down);  // 0.5×
    EXPECT_TRUE(state->text().contains("once"));
    key(Qt::Key_R);
    EXPECT_TRUE(state->text().contains("repeat"));

    const auto& suspects = window.suspectLane()->suspects();
    ASSERT_FALSE(suspects.empty());
    window.viewState()->setSelection(std::nullopt);
    window.viewState()->setCursor(suspects.back().startSeconds + 1e-4);
    key(Qt::Key_H);
    ASSERT_TRUE(window.viewState()->selection());
    const Suspect* heard = window.suspectLane()->suspectFor(std::nullopt, suspects.back().startSeconds + 1e-4);
    ASSERT_NE(heard, nullptr);
    EXPECT_DOUBLE_EQ(window.viewState()->selection()->start, heard->startSeconds);
    EXPECT_DOUBLE_EQ(window.viewState()->selection()->end, heard->endSeconds);
    EXPECT_FALSE(window.player()->playing());  // no device here: a message instead, and no crash
    EXPECT_TRUE(state->text().contains(QString::fromUtf8("0.5×")));
}

}  // namespace
}  // namespace earmark::widgets
