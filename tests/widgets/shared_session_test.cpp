// Two raters on one session: the window shows what another program or rater
// changes (marks, statuses, tiers) within a few polls, and an edit based on a
// mark someone changed since the window read it is refused, not written over
// theirs. The other rater is a second Session on the same file, as another
// window or earmark-cli would be.
#include "demo_session.hpp"
#include "earmark/store/tier_rows.hpp"
#include "earmark/widgets/mark_inspector.hpp"
#include "earmark/widgets/mark_lane.hpp"
#include "earmark/widgets/review_queue.hpp"
#include "earmark/widgets/session_document.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "main_window.hpp"

#include <QComboBox>
#include <QSignalSpy>
#include <QTest>
#include <QUndoStack>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

struct SharedSession : ::testing::Test {
    test::DemoSession demo;
    gui::MainWindow window;
    Session ben = Session::open(demo.path.toStdString());
    TakeId take = 0;

    void SetUp() override {
        ben.setRater("ben");
        window.resize(1400, 900);
        window.show();
        QSignalSpy settled(&window, &gui::MainWindow::takeSettled);
        ASSERT_TRUE(window.openSession(demo.path));
        ASSERT_TRUE(window.showSessionTake("ferry-005"));
        ASSERT_TRUE(settled.wait(30000));
        take = *window.currentTakeId();
    }
};

TEST_F(SharedSession, MarksStatusesAndTiersChangedElsewhereAreShownWithinAFewSeconds) {
    // The window's own poll, at its shipped interval (2 s): a change shows within a few seconds.
    ASSERT_EQ(window.markLane()->marks().size(), 1u);
    QSignalSpy said(window.session(), &SessionDocument::changedElsewhere);
    MarkDraft d;
    d.category = MarkCategory::Emphasis;
    d.startSeconds = 0.1;
    d.endSeconds = 0.3;
    ben.addMark(take, d);
    EXPECT_TRUE(QTest::qWaitFor([&] { return said.count() == 1; }, 5000));  // said in the window's message line
    EXPECT_EQ(window.markLane()->marks().size(), 2u);
    EXPECT_EQ(said.first().at(0).toString(), "ben changed ferry-005");

    // A status set elsewhere reaches the queue.
    const std::string before = window.reviewQueue()->progressText().toStdString();
    ben.setStatus(ben.takes().front().id, ReviewStatus::Unreviewed);
    EXPECT_TRUE(QTest::qWaitFor(
        [&] { return window.reviewQueue()->progressText().toStdString() != before; }, 5000));

    // Tiers rewritten elsewhere replace the shown ones; undoing an older edit would overwrite them.
    std::vector<TierRow> rows = ben.tiers(take);
    std::vector<TierRow> words;
    for (const TierRow& r : rows)
        if (r.tier == "words") words.push_back(r);
    ASSERT_GE(words.size(), 2u);
    words.front().label = "changed";
    ben.setTiers(take, words);
    EXPECT_TRUE(QTest::qWaitFor(
        [&] {
            const Tier& shown = window.tierLane("words")->tier();
            return !shown.intervals.empty() && shown.intervals.front().label == "changed";
        },
        5000));
    EXPECT_EQ(window.undoStack()->count(), 0);
}

TEST_F(SharedSession, AnEditBasedOnAMarkChangedElsewhereIsRefused) {
    window.session()->setWatchInterval(0);  // ben's change lands while the window still shows the old mark
    const Mark shown = window.markLane()->marks().front();
    window.markLane()->setSelectedMark(shown.id);
    emit window.markLane()->markSelected(shown.id);
    ASSERT_TRUE(window.markInspector()->mark());
    MarkDraft bens = shown.draft();
    bens.note = "ben's note";
    ben.updateMark(shown.id, bens);

    QSignalSpy problems(window.session(), &SessionDocument::problem);
    QComboBox* severity = window.markInspector()->severityBox();
    const QString other = severity->currentText() == "minor" ? "major" : "minor";
    severity->setCurrentIndex(severity->findText(other));
    const Mark stored = ben.mark(shown.id);
    EXPECT_EQ(stored.note, "ben's note");         // ben's change stands
    EXPECT_EQ(stored.severity, shown.severity);   // the stale edit was not written
    ASSERT_EQ(problems.count(), 1);  // shown in the window's message line
    EXPECT_TRUE(problems.first().at(0).toString().contains("was changed by ben at"));
    EXPECT_EQ(window.undoStack()->count(), 0);    // nothing to undo
    EXPECT_EQ(window.markInspector()->mark()->note, "ben's note");  // the window shows the mark as it is now

    // Based on what is shown now, the edit goes through.
    severity->setCurrentIndex(severity->findText(other));
    EXPECT_EQ(severityName(ben.mark(shown.id).severity), other.toStdString());
}

}  // namespace
}  // namespace earmark::widgets
