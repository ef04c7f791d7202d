// The review queue and the mark list on a copy of the demo session: statuses,
// progress, filtering, next/previous, missing audio and relocation, and that
// every change is in the file at once (read back through a second Session).
#include "demo_session.hpp"
#include "earmark/widgets/mark_list.hpp"
#include "earmark/widgets/review_queue.hpp"
#include "earmark/widgets/session_document.hpp"

#include <QComboBox>
#include <QLabel>
#include <QPushButton>
#include <QSignalSpy>
#include <QTableWidget>
#include <QTreeWidget>

#include <gtest/gtest.h>

#include <filesystem>

namespace earmark::widgets {
namespace {

TEST(ReviewQueue, ShowsTheDemoSessionWithStatusesMarksAndProgress) {
    test::DemoSession demo;
    SessionDocument doc(demo.path);
    ReviewQueue queue;
    queue.setDocument(&doc);
    ASSERT_EQ(doc.takes().size(), 12u);
    EXPECT_EQ(queue.shownCount(), 12);
    EXPECT_EQ(queue.progressText(), "12 / 12 reviewed");
    auto* list = queue.findChild<QTreeWidget*>("queueList");
    ASSERT_NE(list, nullptr);
    // Queue order, status and mark count as the session holds them.
    for (int i = 0; i < 12; ++i) {
        const Take& t = doc.takes()[static_cast<std::size_t>(i)];
        QTreeWidgetItem* row = list->topLevelItem(i);
        EXPECT_EQ(row->text(0).toStdString(), t.lineId);
        EXPECT_EQ(row->text(1), statusLabel(t.status));
        EXPECT_EQ(row->text(2), t.markCount ? QString::number(t.markCount) : QString());
    }

    // A status change is written at once and the progress follows.
    const TakeId first = doc.takes().front().id;
    ASSERT_TRUE(doc.setStatus(first, ReviewStatus::InReview));
    EXPECT_EQ(queue.progressText(), "11 / 12 reviewed");
    EXPECT_EQ(Session::open(demo.path.toStdString(), OpenMode::ReadOnly).take(first).status, ReviewStatus::InReview);

    queue.setStatusFilter(ReviewStatus::Clean);
    EXPECT_EQ(queue.shownCount(), 5);
    queue.setStatusFilter(ReviewStatus::InReview);
    EXPECT_EQ(queue.shownCount(), 1);
    queue.setStatusFilter(std::nullopt);
    EXPECT_EQ(queue.shownCount(), 12);
}

TEST(ReviewQueue, StepsToTheNextAndPreviousTake) {
    test::DemoSession demo;
    SessionDocument doc(demo.path);
    ReviewQueue queue;
    queue.setDocument(&doc);
    QSignalSpy chosen(&queue, &ReviewQueue::takeChosen);
    ASSERT_TRUE(queue.step(1));  // nothing current yet: the first take
    EXPECT_EQ(queue.currentTake(), doc.takes()[0].id);
    ASSERT_TRUE(queue.step(1));
    EXPECT_EQ(queue.currentTake(), doc.takes()[1].id);
    ASSERT_TRUE(queue.step(-1));
    EXPECT_EQ(queue.currentTake(), doc.takes()[0].id);
    EXPECT_FALSE(queue.step(-1));  // already at the top
    EXPECT_EQ(chosen.count(), 3);
    EXPECT_EQ(chosen.last().at(0).value<qint64>(), doc.takes()[0].id);
}

TEST(ReviewQueue, MissingAudioOffersLocateAndRelocationFixesIt) {
    test::DemoSession demo;
    namespace fs = std::filesystem;
    fs::rename(demo.dir.path() / "takes" / "ferry-004.wav", demo.dir.path() / "moved-004.wav");
    SessionDocument doc(demo.path);
    ReviewQueue queue;
    queue.setDocument(&doc);
    queue.show();
    const TakeId missing = *Session::open(demo.path.toStdString(), OpenMode::ReadOnly).findTake("ferry-004");
    EXPECT_TRUE(doc.audioMissing(missing));
    queue.setCurrentTake(missing);
    auto* list = queue.findChild<QTreeWidget*>("queueList");
    EXPECT_EQ(list->currentItem()->text(1), "missing audio");
    auto* locate = queue.findChild<QPushButton*>("locateButton");
    ASSERT_NE(locate, nullptr);
    EXPECT_TRUE(locate->isVisible());
    QSignalSpy asked(&queue, &ReviewQueue::locateRequested);
    locate->click();
    ASSERT_EQ(asked.count(), 1);
    EXPECT_EQ(asked.at(0).at(0).value<qint64>(), missing);

    ASSERT_TRUE(doc.relocate(missing, QString::fromStdString((demo.dir.path() / "moved-004.wav").string())));
    EXPECT_FALSE(doc.audioMissing(missing));
    EXPECT_NE(list->currentItem()->text(1), "missing audio");
    EXPECT_FALSE(locate->isVisible());
}

TEST(MarkList, ListsEveryMarkFiltersAndReportsClicks) {
    test::DemoSession demo;
    SessionDocument doc(demo.path);
    MarkList list;
    list.setDocument(&doc);
    EXPECT_EQ(list.shownCount(), 7);
    list.categoryFilter()->setCurrentIndex(list.categoryFilter()->findText("timing"));
    EXPECT_EQ(list.shownCount(), 3);  // ferry-005, -006 and -011
    list.categoryFilter()->setCurrentIndex(0);
    const TakeId t5 = *Session::open(demo.path.toStdString(), OpenMode::ReadOnly).findTake("ferry-005");
    list.takeFilter()->setCurrentIndex(list.takeFilter()->findText("ferry-005"));
    ASSERT_EQ(list.shownCount(), 1);
    const MarkId id = list.markAtRow(0);
    EXPECT_EQ(doc.mark(id)->takeId, t5);
    EXPECT_EQ(list.table()->horizontalHeaderItem(7)->text(), "rater");
    EXPECT_EQ(list.table()->item(0, 7)->text(), QString::fromStdString(doc.mark(id)->rater));
    EXPECT_EQ(list.table()->item(0, 7)->text(), "demo");  // samples/make_session.sh
    QSignalSpy chosen(&list, &MarkList::markChosen);
    emit list.table()->cellClicked(0, 0);
    ASSERT_EQ(chosen.count(), 1);
    EXPECT_EQ(chosen.at(0).at(0).value<qint64>(), id);

    // Sorting by start time orders the rows numerically.
    list.takeFilter()->setCurrentIndex(0);
    list.table()->sortItems(1, Qt::AscendingOrder);
    for (int r = 1; r < list.shownCount(); ++r)
        EXPECT_LE(list.table()->item(r - 1, 1)->data(Qt::DisplayRole).toDouble(),
                  list.table()->item(r, 1)->data(Qt::DisplayRole).toDouble());

    // Severity sorts by weight, not by spelling.
    list.table()->sortItems(5, Qt::DescendingOrder);
    EXPECT_EQ(list.table()->item(0, 5)->text(), "blocker");
    EXPECT_EQ(list.table()->item(list.shownCount() - 1, 5)->text(), "minor");

    // A deleted mark leaves the list at once.
    ASSERT_TRUE(doc.deleteMark(*doc.mark(id)));
    EXPECT_EQ(list.shownCount(), 6);
}

}  // namespace
}  // namespace earmark::widgets
