// Playback logic without an audio device. The playhead is the stream's
// (PlaybackStream::takeSecondsAt), built from what the transport plays.
#include "earmark/widgets/transport.hpp"

#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace earmark::widgets {
namespace {

// The take time heard `outputSeconds` into the transport's running segment.
std::optional<double> playheadAt(const Transport& t, double outputSeconds) {
    static const Signal take = test::sine(200.0, 10.0, 8000.0, 0.3);
    const PlaybackStream stream(take, t.playbackSpan(), t.playbackParams());
    return stream.takeSecondsAt(std::llround(outputSeconds * take.sampleRate));
}

PlayContext context() {
    PlayContext c;
    c.duration = 10.0;
    c.cursor = 2.5;
    c.selection = TimeRange{4.0, 6.0};
    c.visible = {3.0, 8.0};
    return c;
}

TEST(PlanPlayback, EachModePlaysItsSpan) {
    const PlayContext c = context();
    auto s = planPlayback(PlayMode::FromCursor, c);
    ASSERT_TRUE(s);
    EXPECT_DOUBLE_EQ(s->start, 2.5);
    EXPECT_DOUBLE_EQ(s->end, 10.0);
    EXPECT_FALSE(s->loop);
    s = planPlayback(PlayMode::Selection, c);
    ASSERT_TRUE(s);
    EXPECT_DOUBLE_EQ(s->start, 4.0);
    EXPECT_DOUBLE_EQ(s->end, 6.0);
    EXPECT_FALSE(s->loop);
    s = planPlayback(PlayMode::VisibleRange, c);
    ASSERT_TRUE(s);
    EXPECT_DOUBLE_EQ(s->start, 3.0);
    EXPECT_DOUBLE_EQ(s->end, 8.0);
    s = planPlayback(PlayMode::LoopSelection, c);
    ASSERT_TRUE(s);
    EXPECT_TRUE(s->loop);
}

TEST(PlanPlayback, NothingToPlayGivesNothing) {
    PlayContext c = context();
    c.selection.reset();
    EXPECT_FALSE(planPlayback(PlayMode::Selection, c));
    EXPECT_FALSE(planPlayback(PlayMode::LoopSelection, c));
    c.cursor = 10.0;
    EXPECT_FALSE(planPlayback(PlayMode::FromCursor, c));
}

TEST(PlanPlayback, SpansAreCutToTheTake) {
    PlayContext c = context();
    c.selection = TimeRange{9.0, 12.0};
    const auto s = planPlayback(PlayMode::Selection, c);
    ASSERT_TRUE(s);
    EXPECT_DOUBLE_EQ(s->end, 10.0);
}

TEST(Transport, OneShotPlayheadAdvancesThenStops) {
    Transport t;
    ASSERT_TRUE(t.start(PlayMode::Selection, context()));
    EXPECT_TRUE(t.playing());
    EXPECT_NEAR(*playheadAt(t, 0.0), 4.0, 1e-9);
    EXPECT_NEAR(*playheadAt(t, 1.5), 5.5, 1e-9);
    EXPECT_FALSE(playheadAt(t, 2.0));
}

TEST(Transport, LoopWrapsAtTheSelectionEnd) {
    Transport t;
    ASSERT_TRUE(t.start(PlayMode::LoopSelection, context()));
    EXPECT_NEAR(*playheadAt(t, 2.5), 4.5, 1e-9);
    EXPECT_NEAR(*playheadAt(t, 7.25), 5.25, 1e-9);
    EXPECT_TRUE(t.playing());
    t.stop();
    EXPECT_FALSE(t.playing());
    EXPECT_THROW(t.playbackSpan(), std::bad_optional_access);
}

TEST(Transport, StartWithNothingToPlayStaysStopped) {
    Transport t;
    PlayContext c = context();
    c.selection.reset();
    EXPECT_FALSE(t.start(PlayMode::Selection, c));
    EXPECT_FALSE(t.playing());
}

}  // namespace
}  // namespace earmark::widgets

namespace earmark::widgets {
namespace {

TEST(PlaybackRate, StepsWalkTheLadderAndStopAtItsEnds) {
    EXPECT_DOUBLE_EQ(stepPlaybackRate(1.0, -1), 0.85);
    EXPECT_DOUBLE_EQ(stepPlaybackRate(1.0, -3), 0.5);
    EXPECT_DOUBLE_EQ(stepPlaybackRate(1.0, 1), 1.25);
    EXPECT_DOUBLE_EQ(stepPlaybackRate(0.25, -1), 0.25);
    EXPECT_DOUBLE_EQ(stepPlaybackRate(2.0, 5), 2.0);
    EXPECT_DOUBLE_EQ(stepPlaybackRate(0.6, 1), 0.7);   // between rungs: the next one up
    EXPECT_DOUBLE_EQ(stepPlaybackRate(0.6, -1), 0.5);  // or down
    EXPECT_DOUBLE_EQ(stepPlaybackRate(0.6, 0), 0.6);
}

TEST(Transport, SlowedPlayheadMovesAtTheRate) {
    Transport t;
    t.setRate(0.5);
    ASSERT_TRUE(t.start(PlayMode::Selection, context()));  // 4–6 s, heard over 4 s
    EXPECT_NEAR(*playheadAt(t, 1.0), 4.5, 1e-9);
    EXPECT_NEAR(*playheadAt(t, 3.9), 5.95, 1e-9);
    EXPECT_FALSE(playheadAt(t, 4.0));
    t.setRate(0.1);
    EXPECT_DOUBLE_EQ(t.rate(), 0.25);
    t.setRate(9.0);
    EXPECT_DOUBLE_EQ(t.rate(), 2.0);
}

TEST(Transport, LoopToggleAndCrossfadeShapeThePass) {
    Transport t;
    t.setLooping(true);
    t.setRate(0.25);
    t.setLoopCrossfade(0.01);
    ASSERT_TRUE(t.start(PlayMode::Selection, context()));  // looped: 2 s heard over 8 s, each pass 7.99 s
    ASSERT_TRUE(t.segment()->loop);
    EXPECT_NEAR(*playheadAt(t, 7.99 + 2.0), 4.5, 1e-9);
    EXPECT_TRUE(t.playing());
    // The rate in force at start() holds until the next start().
    t.setRate(1.0);
    EXPECT_NEAR(*playheadAt(t, 1.0), 4.25, 1e-9);
}

}  // namespace
}  // namespace earmark::widgets
