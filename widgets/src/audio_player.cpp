#include "earmark/widgets/audio_player.hpp"

#include <QAudioDevice>
#include <QAudioSink>
#include <QIODevice>
#include <QMediaDevices>

#include <algorithm>
#include <cstring>

namespace earmark::widgets {

// Feeds the sink with the samples the transport asks for, as float32 mono.
class SegmentSource : public QIODevice {
public:
    SegmentSource(const Transport& transport, TakeAudioPtr take) : transport_(transport), take_(std::move(take)) {}

protected:
    qint64 readData(char* data, qint64 maxBytes) override {
        const qint64 frames = maxBytes / static_cast<qint64>(sizeof(float));
        const auto& x = take_->signal.samples;
        qint64 n = 0;
        for (; n < frames; ++n) {
            const auto src = transport_.sourceFrame(next_ + n, take_->signal.sampleRate);
            if (!src || *src >= static_cast<std::int64_t>(x.size())) break;
            const float v = x[static_cast<std::size_t>(*src)];
            std::memcpy(data + n * sizeof(float), &v, sizeof(float));
        }
        next_ += n;
        return n * static_cast<qint64>(sizeof(float));
    }
    qint64 writeData(const char*, qint64) override { return -1; }
    bool isSequential() const override { return true; }

private:
    const Transport& transport_;
    TakeAudioPtr take_;
    std::int64_t next_ = 0;
};

AudioPlayer::AudioPlayer(ViewState* view, QObject* parent) : QObject(parent), view_(view) {
    if (QMediaDevices::defaultAudioOutput().isNull())
        unavailableReason_ = tr("No audio output device: playback is off.");
    timer_.setInterval(25);
    connect(&timer_, &QTimer::timeout, this, &AudioPlayer::tick);
}

AudioPlayer::~AudioPlayer() {
    blockSignals(true);  // receivers may be half-destroyed already (a parent window)
    stop();
}

void AudioPlayer::setTake(TakeAudioPtr take) {
    stop();
    take_ = std::move(take);
}

bool AudioPlayer::play(PlayMode mode) {
    stop();
    if (!available()) {
        emit message(unavailableReason_);
        return false;
    }
    if (!take_ || !view_) return false;
    PlayContext ctx{take_->duration(), view_->cursor(), view_->selection(), view_->visibleRange()};
    if (!transport_.start(mode, ctx)) {
        emit message(mode == PlayMode::Selection || mode == PlayMode::LoopSelection
                         ? tr("Nothing selected to play.")
                         : tr("Nothing to play from here."));
        return false;
    }
    QAudioFormat format;
    format.setSampleRate(static_cast<int>(take_->signal.sampleRate));
    format.setChannelCount(1);
    format.setSampleFormat(QAudioFormat::Float);
    const QAudioDevice device = QMediaDevices::defaultAudioOutput();
    if (!device.isFormatSupported(format)) {
        transport_.stop();
        emit message(tr("The audio device cannot play %1 Hz mono.").arg(format.sampleRate()));
        return false;
    }
    source_ = std::make_unique<SegmentSource>(transport_, take_);
    source_->open(QIODevice::ReadOnly);
    sink_ = std::make_unique<QAudioSink>(device, format);
    sink_->start(source_.get());
    timer_.start();
    emit playingChanged(true);
    return true;
}

void AudioPlayer::stop() {
    const bool was = transport_.playing() || sink_;
    timer_.stop();
    if (sink_) sink_->stop();
    sink_.reset();
    source_.reset();
    transport_.stop();
    if (view_) view_->setPlayhead(std::nullopt);
    if (was) emit playingChanged(false);
}

void AudioPlayer::tick() {
    if (!sink_ || !view_) return;
    const auto head = transport_.advance(sink_->processedUSecs() / 1e6);
    if (!head) {
        stop();
        return;
    }
    view_->setPlayhead(head);
    // Keep the playhead in view: turn the page when it runs off the right edge.
    const TimeRange r = view_->visibleRange();
    if (*head > r.end || *head < r.start) view_->setVisibleRange({*head, *head + r.span()});
}

}  // namespace earmark::widgets
