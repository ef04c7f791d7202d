// Plays one take at a time with a fixed gain (the trial's loudness-matching
// gain, earmark/listening/loudness_match.hpp), through Qt Multimedia. The
// samples are scaled once when a take is loaded; nothing is computed while
// playing. Without an output device every play fails with a message.
#pragma once

#include <QBuffer>
#include <QObject>

#include <memory>

class QAudioSink;

namespace earmark::widgets {

class LevelMatchedPlayer : public QObject {
    Q_OBJECT
public:
    explicit LevelMatchedPlayer(QObject* parent = nullptr);
    ~LevelMatchedPlayer() override;

    // Mono samples at `sampleRate`, already scaled by the gain. Returns false
    // (and emits message) when nothing can be played.
    bool play(std::vector<float> samples, double sampleRate);
    void stop();

signals:
    void message(const QString& text);

private:
    std::unique_ptr<QAudioSink> sink_;
    QByteArray bytes_;
    QBuffer buffer_;
};

}  // namespace earmark::widgets
