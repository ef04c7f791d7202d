// A long take in the window: a built read of ≈ 2.5 minutes (support/long_read.hpp,
// espeak-ng sentences joined with pauses) with a +4 dB level step planted
// at a join. The review runs in the background; the drift lane and the
// long-take panel show the seam where it was planted (±0.5 s, as the issue's
// tests ask); sentence steps go in time order; choosing a finding or a
// sentence selects its span, and a mark can be made on it as on a short take.
#include "earmark/io/audio_file.hpp"
#include "earmark/longform/long_take_review.hpp"
#include "earmark/widgets/drift_lane.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/longform_panel.hpp"
#include "earmark/widgets/view_state.hpp"
#include "main_window.hpp"
#include "support/long_read.hpp"
#include "support/temp_dir.hpp"

#include <QSignalSpy>
#include <QTest>
#include <QTreeWidget>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

struct Planted {
    test::LongRead read;
    double join = 0.0;  // where the level steps
    std::string wav;
};

const Planted& planted() {
    static test::TempDir dir;
    static const Planted p = [] {
        Planted out;
        test::LongReadPlan plan;
        plan.sentences = 30;
        const test::LongRead clean = test::makeLongRead(plan);
        out.join = clean.joins[15];
        plan.gainDb = [join = out.join](double t) { return t >= join ? 4.0 : 0.0; };
        out.read = test::makeLongRead(plan);
        out.wav = dir.file("long-read.wav");
        writeWav(out.wav, out.read.audio, WavEncoding::Float32);
        return out;
    }();
    return p;
}

struct LongTakeWindow : ::testing::Test {
    gui::MainWindow window;

    void SetUp() override {
        window.resize(1400, 900);
        window.show();
    }
    bool open(const QString& text) {
        QSignalSpy settled(&window, &gui::MainWindow::longformSettled);
        window.openTakes({TakeEntry{"long-read", QString::fromStdString(planted().wav), text}});
        return settled.wait(120000) && settled.last().at(0).toBool() && window.longTakeReview();
    }
    const Finding* levelSeam() const {
        for (const Finding& f : window.longTakeReview()->findings)
            if (f.measure == "level_step_db") return &f;
        return nullptr;
    }
};

TEST_F(LongTakeWindow, ReviewShowsTheSeamInTheLaneAndThePanel) {
    ASSERT_GE(planted().read.audio.durationSeconds(), 120.0);
    ASSERT_TRUE(open(QString::fromStdString(planted().read.text)));
    EXPECT_TRUE(window.laneStack()->isLaneVisible("drift"));
    const Finding* seam = levelSeam();
    ASSERT_NE(seam, nullptr);
    EXPECT_NEAR(0.5 * (seam->startS + seam->endS), planted().join, 0.5);
    EXPECT_EQ(window.driftLane()->traces().size(), 5u);
    // The panel lists every finding and the outline: 30 sentences in 5 paragraphs.
    QTreeWidget* tree = window.longformPanel()->tree();
    ASSERT_EQ(tree->topLevelItemCount(), 2);
    EXPECT_EQ(tree->topLevelItem(0)->childCount(), static_cast<int>(window.longTakeReview()->findings.size()));
    EXPECT_EQ(tree->topLevelItem(1)->childCount(), 5);
    ASSERT_NE(window.currentTiers().find(kSentencesTier), nullptr);
    EXPECT_EQ(window.currentTiers().find(kSentencesTier)->intervals.size(), 30u);
}

TEST_F(LongTakeWindow, SentenceStepsGoInTimeOrderAndSelectTheSentence) {
    ASSERT_TRUE(open(QString::fromStdString(planted().read.text)));
    const Tier* sentences = window.currentTiers().find(kSentencesTier);
    ASSERT_NE(sentences, nullptr);
    ViewState* view = window.viewState();
    view->setCursor(0.0);
    for (std::size_t i = 0; i < sentences->intervals.size(); ++i) {
        window.step(gui::MainWindow::LongformStep::Sentence, 1);
        ASSERT_TRUE(view->selection());
        EXPECT_DOUBLE_EQ(view->selection()->start, sentences->intervals[i].startS) << i;
        EXPECT_DOUBLE_EQ(view->selection()->end, sentences->intervals[i].endS) << i;
        EXPECT_TRUE(view->visibleRange().contains(sentences->intervals[i].startS));
    }
    // Back from the middle of sentence 3 goes to its start, then to sentence 2's.
    view->setCursor(0.5 * (sentences->intervals[3].startS + sentences->intervals[3].endS));
    window.step(gui::MainWindow::LongformStep::Sentence, -1);
    EXPECT_DOUBLE_EQ(view->cursor(), sentences->intervals[3].startS);
    window.step(gui::MainWindow::LongformStep::Sentence, -1);
    EXPECT_DOUBLE_EQ(view->cursor(), sentences->intervals[2].startS);
    // Paragraphs: the second starts with sentence 6.
    view->setCursor(0.0);
    window.step(gui::MainWindow::LongformStep::Paragraph, 1);
    window.step(gui::MainWindow::LongformStep::Paragraph, 1);
    EXPECT_NEAR(view->cursor(), sentences->intervals[6].startS, 1e-9);
}

TEST_F(LongTakeWindow, ChoosingAFindingSelectsItsSpan) {
    ASSERT_TRUE(open(QString()));  // no text: findings, no outline
    EXPECT_EQ(window.longformPanel()->tree()->topLevelItem(1)->childCount(), 0);
    const Finding* seam = levelSeam();
    ASSERT_NE(seam, nullptr);
    ViewState* view = window.viewState();
    view->setVisibleRange({0.0, 10.0});

    // From the panel.
    QTreeWidget* tree = window.longformPanel()->tree();
    QTreeWidgetItem* item = nullptr;
    for (int i = 0; i < tree->topLevelItem(0)->childCount(); ++i)
        if (tree->topLevelItem(0)->child(i)->toolTip(1).toStdString() == seam->reason) item = tree->topLevelItem(0)->child(i);
    ASSERT_NE(item, nullptr);
    emit tree->itemClicked(item, 1);
    ASSERT_TRUE(view->selection());
    EXPECT_DOUBLE_EQ(view->selection()->start, seam->startS);
    EXPECT_DOUBLE_EQ(view->selection()->end, seam->endS);
    EXPECT_TRUE(view->visibleRange().contains(seam->startS) && view->visibleRange().contains(seam->endS));

    // From the lane: a click on the finding.
    view->setSelection(std::nullopt);
    DriftLane* lane = window.driftLane();
    QSignalSpy clicked(lane, &DriftLane::findingClicked);
    const double x = lane->plotRect().left() + lane->mapping().timeToX(0.5 * (seam->startS + seam->endS));
    QTest::mouseClick(lane, Qt::LeftButton, {}, QPoint(static_cast<int>(x), lane->height() / 2));
    ASSERT_EQ(clicked.count(), 1);
    ASSERT_TRUE(view->selection());
    EXPECT_NEAR(view->selection()->start, window.longTakeReview()->findings[static_cast<std::size_t>(clicked.first().at(0).toInt())].startS, 1e-9);

    // Next finding from the start of the take is the first one.
    view->setCursor(0.0);
    window.step(gui::MainWindow::LongformStep::Finding, 1);
    EXPECT_DOUBLE_EQ(view->cursor(), window.longTakeReview()->findings.front().startS);
}

TEST_F(LongTakeWindow, ShortTakeIsNotReviewed) {
    QSignalSpy settled(&window, &gui::MainWindow::longformSettled);
    test::TempDir dir;
    Signal s = planted().read.audio;
    s.samples.resize(static_cast<std::size_t>(60 * s.sampleRate));
    const std::string wav = dir.file("minute.wav");
    writeWav(wav, s, WavEncoding::Float32);
    window.openTakes({TakeEntry{"minute", QString::fromStdString(wav), {}}});
    ASSERT_TRUE(settled.wait(60000));
    EXPECT_TRUE(settled.last().at(0).toBool());
    EXPECT_FALSE(window.longTakeReview());
    EXPECT_FALSE(window.laneStack()->isLaneVisible("drift"));
}

}  // namespace
}  // namespace earmark::widgets
