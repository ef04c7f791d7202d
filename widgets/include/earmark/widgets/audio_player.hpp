// Plays a take through Qt Multimedia (QAudioSink, pull mode) under the
// control of a Transport: at the transport's rate through the engine's
// PlaybackStream (WSOLA keeps the pitch; loops cross-fade), and moves the
// view's playhead to the take time being heard. Without an output
// device it reports itself unavailable and every play request fails with a
// message; nothing else in the window depends on a device.
#pragma once

#include "earmark/widgets/take_data.hpp"
#include "earmark/widgets/transport.hpp"
#include "earmark/widgets/view_state.hpp"

#include <QObject>
#include <QPointer>
#include <QTimer>

#include <memory>

class QAudioSink;

namespace earmark::widgets {

class SegmentSource;

class AudioPlayer : public QObject {
    Q_OBJECT
public:
    explicit AudioPlayer(ViewState* view, QObject* parent = nullptr);
    ~AudioPlayer() override;

    bool available() const { return unavailableReason_.isEmpty(); }
    const QString& unavailableReason() const { return unavailableReason_; }

    void setTake(TakeAudioPtr take);
    // Returns false (and emits message) when nothing can be played.
    bool play(PlayMode mode);
    void stop();
    bool playing() const { return transport_.playing(); }

    // Speed (0.25–2, clamped) and loop toggle; they apply from the next play().
    void setRate(double rate);
    double rate() const { return transport_.rate(); }
    void setLooping(bool on);
    bool looping() const { return transport_.looping(); }

signals:
    void playingChanged(bool playing);
    void rateOrLoopChanged();
    void message(const QString& text);

private:
    void tick();

    QPointer<ViewState> view_;  // may go first when both share a parent
    TakeAudioPtr take_;
    Transport transport_;
    QString unavailableReason_;
    std::unique_ptr<QAudioSink> sink_;
    std::unique_ptr<SegmentSource> source_;
    QTimer timer_;
};

}  // namespace earmark::widgets
