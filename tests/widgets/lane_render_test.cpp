// Every lane draws something for a sample take: its image differs from the
// same lane without a take, and it has many distinct colours in the plot area.
#include "earmark/widgets/energy_lane.hpp"
#include "earmark/widgets/overview_lane.hpp"
#include "earmark/widgets/pitch_lane.hpp"
#include "earmark/widgets/spectrogram_lane.hpp"
#include "earmark/widgets/time_ruler_lane.hpp"
#include "earmark/widgets/waveform_lane.hpp"
#include "image_checks.hpp"
#include "sample_take.hpp"

#include <QApplication>
#include <QImage>
#include <QSet>

#include <qcustomplot.h>

#include <gtest/gtest.h>

#include <cmath>
#include <functional>
#include <memory>

namespace earmark::widgets {
namespace {

QImage render(Lane& lane) {
    lane.resize(900, 180);
    lane.show();
    QApplication::processEvents();
    if (auto* plot = lane.findChild<QCustomPlot*>()) plot->replot(QCustomPlot::rpImmediateRefresh);
    return lane.grab().toImage();
}

using test::differingPixels;
using test::distinctColours;

using LaneFactory = std::function<std::unique_ptr<Lane>(ViewState*)>;

struct LaneCase {
    const char* name;
    LaneFactory make;
    int minColours;
};

void PrintTo(const LaneCase& c, std::ostream* os) { *os << c.name; }

class EveryLane : public ::testing::TestWithParam<LaneCase> {};

TEST_P(EveryLane, RendersANonBlankImageForASampleTake) {
    const auto& sample = test::sampleTake();
    ViewState nothing;  // no take, no time axis
    auto empty = GetParam().make(&nothing);
    const QImage blank = render(*empty);

    ViewState view;
    view.resetForDuration(sample.audio->duration());

    auto lane = GetParam().make(&view);
    lane->setTake(sample.audio);
    lane->setTracks(sample.tracks);
    const QImage image = render(*lane);
    ASSERT_FALSE(image.isNull());

    const QRect plot = lane->plotRect();
    EXPECT_GE(distinctColours(image, plot), GetParam().minColours) << GetParam().name;
    EXPECT_GT(differingPixels(image, blank), plot.width() * 2) << GetParam().name;
}

INSTANTIATE_TEST_SUITE_P(
    Lanes, EveryLane,
    ::testing::Values(
        LaneCase{"overview", [](ViewState* v) { return std::make_unique<OverviewLane>(v); }, 3},
        LaneCase{"ruler", [](ViewState* v) { return std::make_unique<TimeRulerLane>(v); }, 3},
        LaneCase{"waveform", [](ViewState* v) { return std::make_unique<WaveformLane>(v); }, 3},
        LaneCase{"spectrogram", [](ViewState* v) { return std::make_unique<SpectrogramLane>(v); }, 40},
        LaneCase{"pitch", [](ViewState* v) { return std::make_unique<PitchLane>(v); }, 4},
        LaneCase{"energy", [](ViewState* v) { return std::make_unique<EnergyLane>(v); }, 4}),
    [](const ::testing::TestParamInfo<LaneCase>& info) { return std::string(info.param.name); });

TEST(WaveformLane, DrawsSamplesWhenZoomedIn) {
    const auto& sample = test::sampleTake();
    ViewState view;
    view.resetForDuration(sample.audio->duration());
    view.setVisibleRange({0.3, 0.31});  // 160 samples over 814 px: the sample line
    WaveformLane lane(&view);
    lane.setTake(sample.audio);
    const QImage image = render(lane);
    // The waveform colour appears in many rows: a line, not a flat band.
    const QRgb wave = lane.colours().waveform.rgb();
    QSet<int> rows;
    for (int y = 0; y < image.height(); ++y)
        for (int x = lane.plotRect().left(); x <= lane.plotRect().right(); ++x)
            if (image.pixel(x, y) == wave) rows.insert(y);
    EXPECT_GT(rows.size(), 40);
}

TEST(SpectrogramLane, ColourScaleRunsFromFloorToFloorPlusRange) {
    SpectrogramLook look;
    look.floorDb = -60.0;
    look.rangeDb = 40.0;
    const auto table = SpectrogramLane::colourTable(look);
    auto indexOf = [](double rel) {
        return static_cast<int>(std::lround((rel - SpectrogramView::lowestRelativeDb) / SpectrogramView::dbPerIndex));
    };
    const QRgb darkest = table[0];
    const QRgb brightest = table[255];
    EXPECT_EQ(table[indexOf(-60.0)], darkest);
    EXPECT_EQ(table[indexOf(-90.0)], darkest);
    EXPECT_EQ(table[indexOf(-20.0)], brightest);
    EXPECT_EQ(table[indexOf(0.0)], brightest);
    EXPECT_NE(table[indexOf(-40.0)], darkest);
    EXPECT_NE(table[indexOf(-40.0)], brightest);
}

TEST(SpectrogramLane, FrequencyAxisMapsBothWays) {
    const auto& sample = test::sampleTake();
    ViewState view;
    view.resetForDuration(sample.audio->duration());
    for (SpectrogramKind kind : {SpectrogramKind::Linear, SpectrogramKind::Mel}) {
        SpectrogramLane lane(&view);
        lane.resize(900, 300);
        lane.setTake(sample.audio);
        lane.setTracks(sample.tracks);
        SpectrogramLook look;
        look.kind = kind;
        lane.setLook(look);
        for (double hz : {300.0, 1000.0, 2500.0}) {
            const auto y = lane.yOfHz(hz);
            ASSERT_TRUE(y);
            EXPECT_NEAR(*lane.hzAtY(*y), hz, 1e-6 * hz);
        }
        EXPECT_LT(*lane.yOfHz(2000.0), *lane.yOfHz(500.0));  // higher is up
    }
}

TEST(PitchLane, BreaksTheContourAtUnvoicedFrames) {
    const auto& sample = test::sampleTake();
    ViewState view;
    view.resetForDuration(sample.audio->duration());
    PitchLane lane(&view);
    lane.setTracks(sample.tracks);
    QCPGraph* contour = lane.plot()->graph(1);
    ASSERT_NE(contour, nullptr);
    const PitchTrack& pt = *sample.tracks->pitch;
    ASSERT_EQ(contour->dataCount(), static_cast<int>(pt.size()));
    int gaps = 0;
    for (int i = 0; i < contour->dataCount(); ++i) {
        const double v = (contour->data()->constBegin() + i)->value;
        EXPECT_EQ(std::isnan(v), !pt.voiced(static_cast<std::size_t>(i))) << i;
        gaps += std::isnan(v);
    }
    EXPECT_GT(gaps, 0);
}

TEST(PitchLane, SemitonesAreRelativeToTheMedian) {
    const auto& sample = test::sampleTake();
    ViewState view;
    PitchLane lane(&view);
    lane.setTracks(sample.tracks);
    lane.setLook({PitchUnit::Semitones, false});
    const double median = *sample.tracks->pitchSummary.medianHz;
    const PitchTrack& pt = *sample.tracks->pitch;
    QCPGraph* contour = lane.plot()->graph(1);
    for (std::size_t i = 0; i < pt.size(); ++i) {
        if (!pt.voiced(i)) continue;
        EXPECT_NEAR((contour->data()->constBegin() + static_cast<int>(i))->value,
                    12.0 * std::log2(pt.f0Hz[i] / median), 1e-9);
    }
    EXPECT_EQ(lane.plot()->graph(0)->dataCount(), 0);  // confidence off
}

TEST(PitchAxisRange, FollowsTheSpeakersRange) {
    PitchSummary s;
    s.medianHz = 120.0;
    s.p5Hz = 95.0;
    s.p95Hz = 170.0;
    const ValueRange hz = pitchAxisRange(s, PitchUnit::Hertz);
    EXPECT_LE(hz.low, 95.0);
    EXPECT_GE(hz.high, 170.0);
    EXPECT_GT(hz.low, 50.0);
    EXPECT_LT(hz.high, 260.0);
    const ValueRange st = pitchAxisRange(s, PitchUnit::Semitones);
    EXPECT_LE(st.low, 12.0 * std::log2(95.0 / 120.0));
    EXPECT_GE(st.high, 12.0 * std::log2(170.0 / 120.0));
}

}  // namespace
}  // namespace earmark::widgets
