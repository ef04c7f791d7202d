// The compare window on samples/pairs: build-a.wav with its words
// (build-a.words.json), build-b.wav with words aligned from the script in
// samples/README.md. Truths: the 13 words of build-a.words.json, and the
// README's measured figures ("half" has the largest prominence difference).
#include "earmark/widgets/compare_window.hpp"
#include "earmark/widgets/view_state.hpp"
#include "image_checks.hpp"
#include "sample_take.hpp"

#include <QApplication>
#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QSignalSpy>
#include <QTableWidget>

#include <qcustomplot.h>

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>

namespace earmark::widgets {
namespace {

namespace fs = std::filesystem;

const QString script = QStringLiteral("The evening ferry to Wrenholm leaves from berth three at half past six.");

TakePairRequest pairsRequest() {
    TakePairRequest r;
    r.pathA = test::pairsSample("build-a.wav");
    r.pathB = test::pairsSample("build-b.wav");
    r.text = script;
    r.wordsA = test::pairsSample("build-a.words.json");
    return r;
}

const TakePairPtr& samplePair() {
    static const TakePairPtr p = loadTakePair(pairsRequest());
    return p;
}

QStringList wordsOfA() {
    QFile f(test::pairsSample("build-a.words.json"));
    EXPECT_TRUE(f.open(QIODevice::ReadOnly));
    QStringList out;
    for (const auto& w : QJsonDocument::fromJson(f.readAll()).object()["words"].toArray()) out << w.toObject()["text"].toString();
    return out;
}

TEST(TakePair, MapsAPositionToBAndBackConsistently) {
    const TakeComparison& c = samplePair()->comparison;
    EXPECT_EQ(c.a.wordSource, WordSource::Given);
    EXPECT_EQ(c.b.wordSource, WordSource::FromText);
    EXPECT_NEAR(c.overall.durationRatio, 1.14, 0.02);  // README: 1.14
    const double hop = c.alignment.hopSeconds;
    for (double t = 0.3; t < 4.0; t += 0.25) {
        const double b = mapToOtherSide(c, PairSide::A, t);
        EXPECT_NEAR(mapToOtherSide(c, PairSide::B, b), t, 3 * hop) << t;
    }
    // Word boundaries meet word boundaries (word-by-word alignment), and the middle of each word of A
    // lands inside the same word of B.
    const auto& wa = c.a.words.intervals;
    const auto& wb = c.b.words.intervals;
    ASSERT_EQ(wa.size(), wb.size());
    EXPECT_NEAR(mapToOtherSide(c, PairSide::A, wa[7].startS), wb[7].startS, 2 * hop);
    for (std::size_t k = 0; k < wa.size(); ++k) {
        const double b = mapToOtherSide(c, PairSide::A, 0.5 * (wa[k].startS + wa[k].endS));
        EXPECT_GT(b, wb[k].startS) << wa[k].label;
        EXPECT_LT(b, wb[k].endS) << wa[k].label;
    }
}

TEST(CompareWindow, TableHasTheWordsOfAAndHighlightsTheLargestDifferences) {
    CompareWindow window;
    window.setPair(samplePair());
    const QStringList expected = wordsOfA();
    ASSERT_EQ(expected.size(), 13);
    QTableWidget* table = window.wordTable();
    ASSERT_EQ(table->rowCount(), expected.size());
    for (int r = 0; r < table->rowCount(); ++r) EXPECT_EQ(table->item(r, 0)->text(), expected[r]);
    EXPECT_EQ(table->columnCount(), 10);
    // Durations in the table are the words' own: A's from the file.
    EXPECT_NEAR(table->item(0, 1)->text().toDouble(), 0.368 - 0.238, 0.002);
    // README: "half" has the largest prominence difference → bold prominence cells.
    const int half = static_cast<int>(expected.indexOf("half"));
    EXPECT_TRUE(table->item(half, 9)->font().bold());
    int bold = 0;
    for (int r = 0; r < table->rowCount(); ++r) bold += table->item(r, 9)->font().bold();
    EXPECT_EQ(bold, 1);
}

TEST(CompareWindow, RendersBothContoursAndSpectrograms) {
    CompareWindow window;
    window.resize(1200, 900);
    window.show();
    const QImage blank = window.grab().toImage();
    window.setPair(samplePair());
    QApplication::processEvents();
    window.pitchPlot()->replot(QCustomPlot::rpImmediateRefresh);
    const QImage image = window.grab().toImage();
    EXPECT_GT(test::differingPixels(image, blank), 200000);
    EXPECT_GT(window.pitchPlot()->graph(0)->dataCount(), 100);
    EXPECT_GT(window.pitchPlot()->graph(1)->dataCount(), 100);
    // B is carried onto A's axis: every point within A's length.
    for (auto it = window.pitchPlot()->graph(1)->data()->begin(); it != window.pitchPlot()->graph(1)->data()->end(); ++it)
        ASSERT_LE(it->key, samplePair()->a->duration() + 1e-9);
    EXPECT_GE(test::distinctColours(image, QRect(0, 0, image.width(), image.height())), 200);
}

TEST(CompareWindow, SwitchesAtTheSamePointWithoutADevice) {
    CompareWindow window;
    window.setPair(samplePair());
    const TakeComparison& c = samplePair()->comparison;
    window.view(PairSide::A)->setCursor(2.0);
    ASSERT_EQ(window.side(), PairSide::A);
    window.switchSide();
    EXPECT_EQ(window.side(), PairSide::B);
    EXPECT_NEAR(window.view(PairSide::B)->cursor(), mapToOtherSide(c, PairSide::A, 2.0), 1e-9);
    window.switchSide();
    EXPECT_EQ(window.side(), PairSide::A);
    EXPECT_NEAR(window.view(PairSide::A)->cursor(), 2.0, 3 * c.alignment.hopSeconds);
}

TEST(CompareWindow, OpensInTheBackgroundAndReportsAMissingFile) {
    CompareWindow window;
    QSignalSpy settled(&window, &CompareWindow::pairSettled);
    TakePairRequest r = pairsRequest();
    r.pathB = test::pairsSample("missing.wav");
    window.open(r);
    ASSERT_TRUE(settled.wait(60000));
    EXPECT_FALSE(settled.at(0).at(0).toBool());
    EXPECT_FALSE(window.pair());
}

TEST(CompareWindow, EveryActionHasItsOwnShortcut) {
    CompareWindow window;
    std::set<QString> seen;
    for (QAction* menu : window.menuBar()->actions())
        for (QAction* a : menu->menu()->actions()) {
            if (a->isSeparator()) continue;
            EXPECT_FALSE(a->shortcut().isEmpty()) << a->text().toStdString();
            EXPECT_TRUE(seen.insert(a->shortcut().toString()).second) << a->text().toStdString();
        }
    EXPECT_GE(seen.size(), 6u);
}

}  // namespace
}  // namespace earmark::widgets
