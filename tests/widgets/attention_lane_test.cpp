// The attention lane on samples/pairs/attention.npy: a made-up matrix of 13
// word tokens in which the "model" skips "from" (token 6, at frame 171,
// 1.985 s) and goes back to "half" (token 10) over frames 316–323
// (3.669–3.762 s) — the truth planted in the file (samples/README.md).
#include "main_window.hpp"
#include "sample_take.hpp"

#include "earmark/widgets/attention_lane.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/tier_lane.hpp"
#include "image_checks.hpp"

#include <QApplication>
#include <QSignalSpy>

#include <gtest/gtest.h>

#include <filesystem>

namespace earmark::widgets {
namespace {

namespace fs = std::filesystem;


ModelAttentionPtr pairsAttention() {
    static const ModelAttentionPtr a = loadModelAttention(test::pairsSample("attention.npy"),
                                                          test::pairsSample("attention-tokens.txt"));
    return a;
}

struct Shown {
    ViewState view;
    AttentionLane lane{&view};
    QImage image;
    double x(double t) const {
        const QRect plot = lane.plotRect();
        return plot.left() + (t - view.visibleRange().start) * plot.width() / view.visibleRange().span();
    }
};

void show(Shown& s, ModelAttentionPtr a) {
    s.view.resetForDuration(a ? a->frames * a->hopSeconds : 4.5);
    s.lane.setAttention(std::move(a));
    s.lane.resize(1000, 200);
    s.lane.show();
    QApplication::processEvents();
    s.image = s.lane.grab().toImage();
}

TEST(ModelAttention, FindsThePlantedSkipAndRepeat) {
    const auto a = pairsAttention();
    EXPECT_EQ(a->tokens, 13);
    ASSERT_EQ(a->alignment.faults.size(), 2u);
    const AttentionEvent& skip = a->alignment.faults[0];
    EXPECT_EQ(skip.kind, AttentionFault::Skip);
    EXPECT_EQ(skip.firstToken, 6);
    EXPECT_NEAR(skip.startS, 1.985, 0.001);
    const AttentionEvent& repeat = a->alignment.faults[1];
    EXPECT_EQ(repeat.kind, AttentionFault::Repeat);
    EXPECT_EQ(repeat.firstToken, 10);
    EXPECT_NEAR(repeat.startS, 3.669, 0.001);
    EXPECT_NEAR(repeat.endS, 3.762, 0.001);
    // One interval per token on the monotonic path.
    EXPECT_EQ(a->alignment.tokens.intervals.size(), 13u);
}

TEST(AttentionLane, RendersTheMatrixNonBlank) {
    Shown empty;
    show(empty, nullptr);
    Shown s;
    show(s, pairsAttention());
    EXPECT_GE(test::distinctColours(s.image, s.lane.plotRect()), 30);
    EXPECT_GT(test::differingPixels(s.image, empty.image), s.lane.plotRect().width() * 20);
    // The path's token carries the weight: "The" early on, "six" at the end.
    const QRect plot = s.lane.plotRect();
    const int rowH = plot.height() / 13;
    EXPECT_GT(*s.lane.weightAt(QPoint(static_cast<int>(s.x(0.05)), plot.top() + rowH / 2)), 0.3);
    EXPECT_LT(*s.lane.weightAt(QPoint(static_cast<int>(s.x(0.05)), plot.bottom() - rowH / 2)), 0.1);
}

TEST(AttentionLane, MarksTheFaultsAtTheirTimesWithTooltips) {
    Shown s;
    show(s, pairsAttention());
    const int midY = s.lane.plotRect().center().y();
    const QString atSkip = s.lane.faultTextAt(QPoint(static_cast<int>(s.x(1.985)), midY));
    EXPECT_TRUE(atSkip.contains("skip")) << atSkip.toStdString();
    EXPECT_TRUE(atSkip.contains("from")) << atSkip.toStdString();
    const QString atRepeat = s.lane.faultTextAt(QPoint(static_cast<int>(s.x(3.715)), midY));
    EXPECT_TRUE(atRepeat.contains("repeat")) << atRepeat.toStdString();
    EXPECT_TRUE(atRepeat.contains("half")) << atRepeat.toStdString();
    EXPECT_TRUE(s.lane.faultTextAt(QPoint(static_cast<int>(s.x(1.0)), midY)).isEmpty());
    EXPECT_TRUE(s.lane.faultTextAt(QPoint(static_cast<int>(s.x(3.0)), midY)).isEmpty());
    // The marks are drawn there in their colours (pixels read back a row above the captions).
    auto near = [](QRgb a, const QColor& b, int tol) {
        return std::abs(qRed(a) - b.red()) <= tol && std::abs(qGreen(a) - b.green()) <= tol && std::abs(qBlue(a) - b.blue()) <= tol;
    };
    const int y = s.lane.plotRect().top() + s.lane.plotRect().height() / 2;
    EXPECT_TRUE(near(s.image.pixel(static_cast<int>(s.x(1.985)) + 1, y), AttentionLane::skipColour, 40));
    EXPECT_FALSE(near(s.image.pixel(static_cast<int>(s.x(1.5)), y), AttentionLane::skipColour, 40));
}

TEST(MainWindow, OpensAnAttentionMatrixWithItsTokenTier) {
    gui::MainWindow window;
    window.resize(1200, 900);
    window.show();
    QSignalSpy modelSettled(&window, &gui::MainWindow::modelSettled);
    window.openTakes({{"a", test::pairsSample("build-a.wav"), {}}});
    window.openAttention(test::pairsSample("attention.npy"),
                         test::pairsSample("attention-tokens.txt"));
    ASSERT_TRUE(modelSettled.wait(60000));
    EXPECT_TRUE(modelSettled.at(0).at(0).toBool());
    EXPECT_TRUE(window.laneStack()->isLaneVisible("attention"));
    EXPECT_TRUE(window.laneStack()->isLaneVisible(window.tokensLane()->id()));
    ASSERT_EQ(window.tokensLane()->tier().intervals.size(), 13u);
    EXPECT_EQ(window.tokensLane()->tier().intervals.front().label, "The");
}

}  // namespace
}  // namespace earmark::widgets
