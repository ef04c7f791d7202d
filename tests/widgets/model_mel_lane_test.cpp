// The model lanes on samples/pairs: predicted-mel.npy is Earmark's own mel of
// build-a.wav with +10 dB planted over bands 30–44 (1.2–2.0 kHz) in frames
// 197–242 (2.287–2.821 s) — samples/README.md and samples/pairs/planted.txt,
// the truth the lanes are checked against. Also the "ember" diverging map.
#include "main_window.hpp"
#include "sample_take.hpp"

#include "earmark/widgets/colour_map.hpp"
#include "earmark/widgets/lane_stack.hpp"
#include "earmark/widgets/model_mel_lane.hpp"
#include "earmark/widgets/spectrogram_lane.hpp"
#include "earmark/widgets/take_loader.hpp"
#include "image_checks.hpp"

#include <QApplication>
#include <QSignalSpy>

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>

namespace earmark::widgets {
namespace {

namespace fs = std::filesystem;

constexpr double plantedStartS = 2.287, plantedEndS = 2.821;  // planted.txt
constexpr double plantedLowHz = 1200.0, plantedHighHz = 2000.0;

double chroma(const OkLab& c) { return std::hypot(c.a, c.b); }

TEST(EmberColourMap, LightnessRisesFromTheCentreAlikeOnBothSides) {
    // Lightness and hue judged in OKLab (Ottosson 2020, "A perceptual color
    // space for image processing").
    const auto lab = emberColourMapOkLab();
    EXPECT_LT(lab[127].L, 0.25);
    EXPECT_LT(chroma(lab[128]), 0.03);  // the centre is nearly grey
    EXPECT_GT(lab[0].L, 0.85);
    EXPECT_GT(lab[255].L, 0.85);
    for (std::size_t k = 0; k < 127; ++k) {
        EXPECT_GT(lab[128 + k + 1].L, lab[128 + k].L) << k;  // positive side brightens outwards
        EXPECT_GT(lab[126 - k].L, lab[127 - k].L) << k;      // so does the negative side
        EXPECT_NEAR(lab[128 + k].L, lab[127 - k].L, 0.01) << k;  // mirrored indices, same lightness
    }
    // Negative cold (blue: b < 0), positive warm (b > 0), well apart mid-way.
    EXPECT_LT(lab[40].b, -0.05);
    EXPECT_GT(lab[215].b, 0.05);
}

struct PairsMel {
    TakeAudioPtr audio;
    ModelMelPtr mel;
};

const PairsMel& pairsMel() {
    static const PairsMel p = [] {
        PairsMel out;
        out.audio = loadTake(test::pairsSample("build-a.wav"));
        out.mel = loadModelMel(test::pairsSample("predicted-mel.npy"), *out.audio);
        return out;
    }();
    return p;
}

QImage renderModelLane(Lane& lane) {
    lane.resize(1000, 260);
    lane.show();
    QApplication::processEvents();
    return lane.grab().toImage();
}

TEST(ModelMel, FindsThePlantedTenDecibels) {
    const auto& p = pairsMel();
    EXPECT_NEAR(p.mel->maxAbsDb, 10.0, 0.5);  // +10 dB planted
    EXPECT_GE(p.mel->maxTimeS, plantedStartS - 0.02);
    EXPECT_LE(p.mel->maxTimeS, plantedEndS + 0.02);
    EXPECT_EQ(p.mel->scaleDb, 10.0);
    EXPECT_EQ(p.mel->regions, 1);
    EXPECT_EQ(p.mel->predicted.data.bins, 80);  // from the sidecar
    EXPECT_FALSE(p.mel->difference.image.isNull());
}

TEST(ModelMelLane, BothLanesRenderNonBlank) {
    const auto& p = pairsMel();
    for (ModelMelPart part : {ModelMelPart::Predicted, ModelMelPart::Difference}) {
        ViewState view;
        view.resetForDuration(p.audio->duration());
        ModelMelLane empty(part, &view);
        const QImage blank = renderModelLane(empty);
        ModelMelLane lane(part, &view);
        lane.setTake(p.audio);
        lane.setModelMel(p.mel);
        const QImage image = renderModelLane(lane);
        EXPECT_GE(test::distinctColours(image, lane.plotRect()), 30);
        EXPECT_GT(test::differingPixels(image, blank), lane.plotRect().width() * 20);
    }
}

TEST(ModelMelLane, ThePlantedPatchIsWhereTheDifferenceIsBrightest) {
    const auto& p = pairsMel();
    ViewState view;
    view.resetForDuration(p.audio->duration());
    ModelMelLane lane(ModelMelPart::Difference, &view);
    lane.setTake(p.audio);
    lane.setModelMel(p.mel);
    const QImage image = renderModelLane(lane);
    // Read the pixels back, leaving out the title and legend strip on top and
    // the warning strip at the bottom.
    const QRect plot = lane.plotRect().adjusted(0, 34, 0, -24);
    double brightest = -1.0;
    QPoint at;
    for (int y = plot.top(); y <= plot.bottom(); y += 2)
        for (int x = plot.left(); x <= plot.right(); x += 2) {
            const QRgb c = image.pixel(x, y);
            const double L = linearSrgbToOkLab({srgbDecode(qRed(c) / 255.0), srgbDecode(qGreen(c) / 255.0),
                                                srgbDecode(qBlue(c) / 255.0)}).L;
            if (L > brightest) brightest = L, at = QPoint(x, y);
        }
    const double t = view.visibleRange().start +
                     (at.x() - lane.plotRect().left()) * view.visibleRange().span() / lane.plotRect().width();
    EXPECT_GE(t, plantedStartS - 0.02);
    EXPECT_LE(t, plantedEndS + 0.02);
    const double bandsUp = (lane.plotRect().bottom() + 1 - at.y()) * 80.0 / lane.plotRect().height();
    EXPECT_GE(bandsUp, 29.0);  // bands 30–44 of 80
    EXPECT_LE(bandsUp, 46.0);
    // The value under a point: +10 dB inside the patch, about 0 well outside.
    const auto inside = lane.valueAt(at);
    ASSERT_TRUE(inside);
    EXPECT_NEAR(*inside, 10.0, 0.5);
    const int xOutside = lane.plotRect().left() + static_cast<int>(1.0 / view.visibleRange().span() * lane.plotRect().width());
    const auto outside = lane.valueAt(QPoint(xOutside, at.y()));
    ASSERT_TRUE(outside);
    EXPECT_LT(std::abs(*outside), 1.0);
    EXPECT_TRUE(lane.describePoint(at).contains("predicted"));
}

TEST(MainWindow, OpensAPredictedMelUnderTheTakesMel) {
    gui::MainWindow window;
    window.resize(1200, 900);
    window.show();
    QSignalSpy settled(&window, &gui::MainWindow::takeSettled);
    QSignalSpy modelSettled(&window, &gui::MainWindow::modelSettled);
    window.openTakes({{"a", test::pairsSample("build-a.wav"), {}}});
    window.openPredictedMel(test::pairsSample("predicted-mel.npy"));
    ASSERT_TRUE(modelSettled.wait(60000));
    EXPECT_TRUE(modelSettled.at(0).at(0).toBool());
    EXPECT_TRUE(window.laneStack()->isLaneVisible("predicted-mel"));
    EXPECT_TRUE(window.laneStack()->isLaneVisible("mel-difference"));
    ASSERT_TRUE(window.melDifferenceLane()->modelMel());
    EXPECT_NEAR(window.melDifferenceLane()->modelMel()->maxAbsDb, 10.0, 0.5);
    auto* spectrogram = qobject_cast<SpectrogramLane*>(window.laneStack()->lane("spectrogram"));
    ASSERT_NE(spectrogram, nullptr);
    EXPECT_EQ(spectrogram->look().kind, SpectrogramKind::Mel);
    // Another take drops the prediction.
    window.openTakes({{"b", test::pairsSample("build-b.wav"), {}}});
    EXPECT_FALSE(window.laneStack()->isLaneVisible("mel-difference"));
    EXPECT_FALSE(window.melDifferenceLane()->modelMel());
}

TEST(MainWindow, AMissingPredictedMelIsReported) {
    gui::MainWindow window;
    QSignalSpy modelSettled(&window, &gui::MainWindow::modelSettled);
    window.openTakes({{"a", test::pairsSample("build-a.wav"), {}}});
    window.openPredictedMel(test::pairsSample("no-such.npy"));
    ASSERT_TRUE(modelSettled.wait(60000));
    EXPECT_FALSE(modelSettled.at(0).at(0).toBool());
    EXPECT_FALSE(window.laneStack()->isLaneVisible("mel-difference"));
}

}  // namespace
}  // namespace earmark::widgets
