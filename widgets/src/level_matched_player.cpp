#include "earmark/widgets/level_matched_player.hpp"

#include <QAudioDevice>
#include <QAudioSink>
#include <QMediaDevices>

namespace earmark::widgets {

LevelMatchedPlayer::LevelMatchedPlayer(QObject* parent) : QObject(parent) {}

LevelMatchedPlayer::~LevelMatchedPlayer() {
    blockSignals(true);
    stop();
}

bool LevelMatchedPlayer::play(std::vector<float> samples, double sampleRate) {
    stop();
    const QAudioDevice device = QMediaDevices::defaultAudioOutput();
    if (device.isNull()) {
        emit message(tr("No audio output device: playback is off."));
        return false;
    }
    QAudioFormat format;
    format.setSampleRate(static_cast<int>(sampleRate));
    format.setChannelCount(1);
    format.setSampleFormat(QAudioFormat::Float);
    if (!device.isFormatSupported(format)) {
        emit message(tr("The audio device cannot play %1 Hz mono.").arg(format.sampleRate()));
        return false;
    }
    bytes_ = QByteArray(reinterpret_cast<const char*>(samples.data()),
                        static_cast<qsizetype>(samples.size() * sizeof(float)));
    buffer_.setBuffer(&bytes_);
    buffer_.open(QIODevice::ReadOnly);
    sink_ = std::make_unique<QAudioSink>(device, format);
    sink_->start(&buffer_);
    return true;
}

void LevelMatchedPlayer::stop() {
    if (sink_) sink_->stop();
    sink_.reset();
    if (buffer_.isOpen()) buffer_.close();
}

}  // namespace earmark::widgets
