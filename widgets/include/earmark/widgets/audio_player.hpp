// Plays a take through Qt Multimedia (QAudioSink, pull mode) under the
// control of a Transport, and moves the view's playhead. Without an output
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

signals:
    void playingChanged(bool playing);
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
