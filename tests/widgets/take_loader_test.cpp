// Background loading: the waveform first, then the tracks; the latest request
// wins; failures name the file; the loader can be torn down mid-job.
#include "earmark/widgets/take_loader.hpp"

#include "earmark/core/error.hpp"

#include "sample_take.hpp"

#include <QCoreApplication>
#include <QSignalSpy>
#include <QTest>

#include <gtest/gtest.h>

namespace earmark::widgets {
namespace {

TEST(TakeLoader, DeliversAudioThenTracksTaggedWithTheRequest) {
    const auto& sample = test::sampleTake();
    TakeLoader loader;
    QSignalSpy audio(&loader, &TakeLoader::audioReady);
    QSignalSpy tracks(&loader, &TakeLoader::tracksReady);
    const quint64 id = loader.open(sample.path, AnalysisSettings{});
    ASSERT_TRUE(tracks.wait(30000));
    ASSERT_EQ(audio.count(), 1);
    ASSERT_EQ(tracks.count(), 1);
    EXPECT_EQ(audio.at(0).at(0).toULongLong(), id);
    EXPECT_EQ(tracks.at(0).at(0).toULongLong(), id);
    const auto a = audio.at(0).at(1).value<TakeAudioPtr>();
    const auto t = tracks.at(0).at(1).value<TakeTracksPtr>();
    ASSERT_TRUE(a && t);
    EXPECT_EQ(a->signal.size(), sample.audio->signal.size());
    EXPECT_TRUE(t->pitch && t->energy && t->mel && t->linear);
    EXPECT_FALSE(t->linear->image.isNull());
}

TEST(TakeLoader, OnlyTheLatestRequestIsDelivered) {
    const auto& sample = test::sampleTake();
    TakeLoader loader;
    QSignalSpy audio(&loader, &TakeLoader::audioReady);
    QSignalSpy tracks(&loader, &TakeLoader::tracksReady);
    loader.open(sample.path, AnalysisSettings{});
    loader.open(sample.path, AnalysisSettings{});
    const quint64 last = loader.open(sample.path, AnalysisSettings{});
    ASSERT_TRUE(tracks.wait(30000));
    QTest::qWait(200);  // give any stale job time to (wrongly) report
    for (const auto& call : audio) EXPECT_EQ(call.at(0).toULongLong(), last);
    ASSERT_EQ(tracks.count(), 1);
    EXPECT_EQ(tracks.at(0).at(0).toULongLong(), last);
}

TEST(TakeLoader, ReanalyseReusesTheAudioWithNewSettings) {
    const auto& sample = test::sampleTake();
    TakeLoader loader;
    QSignalSpy audio(&loader, &TakeLoader::audioReady);
    QSignalSpy tracks(&loader, &TakeLoader::tracksReady);
    loader.open(sample.path, AnalysisSettings{});
    ASSERT_TRUE(tracks.wait(30000));
    AnalysisSettings s;
    s.melBands = 40;
    s.hopMs = 10.0;
    const quint64 id = loader.reanalyse(s);
    ASSERT_NE(id, 0u);
    ASSERT_TRUE(tracks.wait(30000));
    EXPECT_EQ(audio.count(), 1);  // no second load
    const auto t = tracks.at(1).at(1).value<TakeTracksPtr>();
    EXPECT_EQ(t->mel->data.bins, 40);
    EXPECT_NEAR(t->pitch->hopSeconds, 0.010, 1e-9);
}

TEST(TakeLoader, AMissingFileFailsWithItsName) {
    TakeLoader loader;
    QSignalSpy failed(&loader, &TakeLoader::failed);
    loader.open(QStringLiteral("/nonexistent/earmark-no-such-take.wav"), AnalysisSettings{});
    ASSERT_TRUE(failed.wait(10000));
    EXPECT_TRUE(failed.at(0).at(1).toString().contains("earmark-no-such-take.wav"));
}

// A cancelled job reports nothing: the next request's results are the only ones that arrive
// (no fixed wait: the later job's arrival bounds the earlier one's). A loader destroyed with a job
// running cancels and waits for it (under the sanitizers, a job outliving its loader is an error).
TEST(TakeLoader, CancelDropsTheJobAndTeardownWaits) {
    const auto& sample = test::sampleTake();
    {
        TakeLoader loader;
        QSignalSpy audio(&loader, &TakeLoader::audioReady);
        QSignalSpy tracks(&loader, &TakeLoader::tracksReady);
        const quint64 cancelled = loader.open(sample.path, AnalysisSettings{});
        loader.cancel();
        EXPECT_FALSE(loader.busy());
        const quint64 kept = loader.open(sample.path, AnalysisSettings{});
        ASSERT_NE(kept, cancelled);
        ASSERT_TRUE(tracks.wait(30000));
        QCoreApplication::processEvents();  // anything the cancelled job queued would be delivered by now
        ASSERT_EQ(tracks.count(), 1);
        EXPECT_EQ(tracks.at(0).at(0).value<quint64>(), kept);
        for (const auto& signal : audio) EXPECT_EQ(signal.at(0).value<quint64>(), kept);
        loader.open(sample.path, AnalysisSettings{});
        EXPECT_TRUE(loader.busy());
    }  // destroyed while the job runs: must cancel and wait, not crash
}

TEST(LoadSteps, CancelledProgressStopsTheAnalysis) {
    const auto& sample = test::sampleTake();
    int calls = 0;
    Progress stop([&calls](double) { return ++calls < 3; });
    EXPECT_THROW(analyseTake(*sample.audio, AnalysisSettings{}, stop), Cancelled);
}

}  // namespace
}  // namespace earmark::widgets

#include "earmark/io/audio_file.hpp"
#include "support/test_signals.hpp"

namespace earmark::widgets {
namespace {

TEST(LoadSteps, A48kHzTakeGetsAllTracks) {
    earmark::test::TempDir dir;
    const auto voice = earmark::test::synthesiseVoice(
        {{earmark::test::VoiceSegment::Kind::Voiced, 0.5, 150.0, 150.0, 0.4}}, 48000.0);
    writeWav(dir.file("v48.wav"), voice.signal);
    const auto audio = loadTake(QString::fromStdString(dir.file("v48.wav")));
    const auto tracks = analyseTake(*audio, AnalysisSettings{});
    EXPECT_TRUE(tracks->mel.has_value()) << tracks->melProblem.toStdString();
    EXPECT_TRUE(tracks->linear.has_value());
    EXPECT_NEAR(*tracks->pitchSummary.medianHz, 150.0, 3.0);
}

TEST(LoadSteps, UnusableMelSettingsCostOnlyTheMelView) {
    const auto& sample = test::sampleTake();
    AnalysisSettings s;
    s.melBands = 64;  // 64 bands between 7.9 and 8 kHz: far narrower than an FFT bin
    s.melFminHz = 7900.0;
    const auto tracks = analyseTake(*sample.audio, s);
    EXPECT_FALSE(tracks->mel.has_value());
    EXPECT_TRUE(tracks->melProblem.contains("MelParams")) << tracks->melProblem.toStdString();
    EXPECT_TRUE(tracks->pitch && tracks->energy && tracks->linear);
}

}  // namespace
}  // namespace earmark::widgets
