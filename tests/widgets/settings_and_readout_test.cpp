// Analysis settings (engine parameters, persistence), the hover read-out and
// the view export.
#include "earmark/core/error.hpp"
#include "earmark/widgets/analysis_settings.hpp"
#include "earmark/widgets/elided_label.hpp"
#include "earmark/widgets/hover_readout.hpp"
#include "earmark/widgets/view_export.hpp"
#include "earmark/widgets/waveform_lane.hpp"
#include "sample_take.hpp"

#include <QFileInfo>
#include <QImage>
#include <QSettings>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

TEST(AnalysisSettings, TranslateToEngineParameters) {
    AnalysisSettings s;
    s.f0MinHz = 70;
    s.f0MaxHz = 400;
    s.hopMs = 10;
    s.fftSize = 1024;
    s.melBands = 64;
    s.melFmaxHz = 20000;  // above Nyquist at 16 kHz: cut
    s.melScale = MelScale::Htk;
    const AnalysisParams p = s.toParams(16000.0, 2.0);
    EXPECT_DOUBLE_EQ(p.pitch.minF0Hz, 70);
    EXPECT_DOUBLE_EQ(p.pitch.maxF0Hz, 400);
    EXPECT_DOUBLE_EQ(p.pitch.hopSeconds, 0.010);
    EXPECT_DOUBLE_EQ(p.energy.hopSeconds, 0.010);
    EXPECT_EQ(p.mel.stft.fftSize, 1024);
    EXPECT_EQ(p.mel.stft.hopSize, 160);
    EXPECT_EQ(p.mel.bands, 64);
    EXPECT_DOUBLE_EQ(p.mel.fmaxHz, 8000.0);
    EXPECT_EQ(p.mel.scale, MelScale::Htk);
    EXPECT_EQ(s.linearStft(16000.0, 2.0).hopSize, 160);
}

TEST(AnalysisSettings, LongTakesGetACoarserSpectrogramHop) {
    const AnalysisSettings s;
    const double hour = 3600.0, rate = 48000.0;
    const StftParams stft = s.linearStft(rate, hour);
    EXPECT_LE(hour * rate / stft.hopSize, AnalysisSettings::maxSpectrogramFrames + 1);
    EXPECT_DOUBLE_EQ(s.toParams(rate, hour).pitch.hopSeconds, 0.005);  // tracks keep their hop
}

TEST(AnalysisSettings, InvalidValuesNameTheField) {
    AnalysisSettings s;
    s.f0MaxHz = 50;
    try {
        s.validate();
        FAIL();
    } catch (const ParamError& e) {
        EXPECT_EQ(e.subject(), "AnalysisSettings.f0MaxHz");
    }
}

TEST(AnalysisSettings, PersistAndReload) {
    QSettings q;
    q.clear();
    AnalysisSettings s;
    s.hopMs = 8;
    s.melScale = MelScale::Htk;
    s.melBands = 128;
    s.save(q);
    EXPECT_EQ(AnalysisSettings::load(q), s);
    q.setValue("analysis/f0MaxHz", 10.0);  // broken by hand: defaults, not a crash
    EXPECT_EQ(AnalysisSettings::load(q), AnalysisSettings{});
    q.clear();
}

TEST(HoverReadout, ShowsTimeF0AndEnergy) {
    const auto& sample = test::sampleTake();
    ViewState view;
    view.resetForDuration(sample.audio->duration());
    HoverReadout readout(&view);
    readout.setTracks(sample.tracks);
    // Mid-way through the first voiced segment (0.2–0.8 s, 120→180 Hz).
    view.setHoverTime(0.5);
    const QString text = readout.text();
    EXPECT_TRUE(text.startsWith("0.500 s")) << text.toStdString();
    EXPECT_TRUE(text.contains("F0 ")) << text.toStdString();
    EXPECT_TRUE(text.contains("dBFS")) << text.toStdString();
    const double f0 = *sample.tracks->f0At(0.5);
    EXPECT_GT(f0, 130.0);
    EXPECT_LT(f0, 170.0);
    readout.setLaneDetail("2.00 kHz, -30.0 dB re peak");
    EXPECT_TRUE(readout.text().endsWith("2.00 kHz, -30.0 dB re peak"));
    view.setHoverTime(0.1);  // silence
    EXPECT_TRUE(readout.text().contains("unvoiced"));
    view.setHoverTime(std::nullopt);  // pointer left: cursor and selection
    view.setCursor(0.25);
    view.setSelection(TimeRange{0.25, 0.75});
    EXPECT_EQ(readout.text(), QString::fromUtf8("cursor 0.250 s  ·  selection 0.250–0.750 s (500 ms)"));
}

// A long status message gives way: it is cut with "…" to its width, keeps the whole text as its
// tooltip, and asks for only a few characters' width at least.
TEST(ElidedLabel, ALongTextIsCutToItsWidthAndKeptWhole) {
    ElidedLabel label;
    const QString text = "Word evidence: the acoustic model placed only 2 of 13 script words: word evidence not shown";
    label.setText(text);
    label.resize(label.sizeHint());
    EXPECT_EQ(label.shownText(), text);
    EXPECT_LT(label.minimumSizeHint().width(), label.sizeHint().width() / 3);
    label.resize(120, label.height());
    const QString shown = label.shownText();
    EXPECT_TRUE(shown.endsWith(QChar(0x2026))) << shown.toStdString();
    EXPECT_TRUE(text.startsWith(shown.chopped(1))) << shown.toStdString();
    EXPECT_LE(label.fontMetrics().horizontalAdvance(shown), 120);
    EXPECT_EQ(label.toolTip(), text);
}

TEST(ViewExport, WritesPngAndPdf) {
    const auto& sample = test::sampleTake();
    ViewState view;
    view.resetForDuration(sample.audio->duration());
    WaveformLane lane(&view);
    lane.resize(640, 160);
    lane.setTake(sample.audio);
    const QString png = QString::fromStdString(sample.dir.file("export.png"));
    const QString pdf = QString::fromStdString(sample.dir.file("export.pdf"));
    EXPECT_EQ(exportWidget(lane, png), QString());
    EXPECT_EQ(QImage(png).size(), QSize(640, 160));
    EXPECT_EQ(exportWidget(lane, pdf), QString());
    QFile f(pdf);
    ASSERT_TRUE(f.open(QIODevice::ReadOnly));
    EXPECT_TRUE(f.read(5) == "%PDF-");
    EXPECT_FALSE(exportWidget(lane, QString::fromStdString(sample.dir.file("x.bmp"))).isEmpty());
}

}  // namespace
}  // namespace earmark::widgets

#include "earmark/widgets/settings_dialog.hpp"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QPushButton>
#include <QSpinBox>

namespace earmark::widgets {
namespace {

TEST(SettingsDialog, ShowsAndReturnsTheSettings) {
    AnalysisSettings s;
    s.f0MinHz = 75;
    s.fftSize = 1024;
    s.melBands = 64;
    s.melScale = MelScale::Htk;
    SettingsDialog dialog(s);
    EXPECT_EQ(dialog.settings(), s);
}

TEST(SettingsDialog, RefusesAnF0RangeThatIsUpsideDown) {
    SettingsDialog dialog(AnalysisSettings{});
    auto spins = dialog.findChildren<QDoubleSpinBox*>();
    ASSERT_GE(spins.size(), 2);
    QPushButton* ok = dialog.findChild<QDialogButtonBox*>()->button(QDialogButtonBox::Ok);
    EXPECT_TRUE(ok->isEnabled());
    spins[0]->setValue(400);  // lowest F0
    spins[1]->setValue(300);  // highest F0
    EXPECT_FALSE(ok->isEnabled());
    spins[1]->setValue(600);
    EXPECT_TRUE(ok->isEnabled());
    EXPECT_DOUBLE_EQ(dialog.settings().f0MinHz, 400);
    EXPECT_DOUBLE_EQ(dialog.settings().f0MaxHz, 600);
}

}  // namespace
}  // namespace earmark::widgets
