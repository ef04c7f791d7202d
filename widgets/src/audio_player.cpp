#include "earmark/widgets/audio_player.hpp"

#include "earmark/core/error.hpp"
#include "earmark/playback/playback_stream.hpp"

#include <QAudioDevice>
#include <QAudioSink>
#include <QIODevice>
#include <QMediaDevices>

#include <algorithm>
#include <cstring>
#include <vector>

namespace earmark::widgets {

// Feeds the sink with what the stream renders (the segment time-stretched
// to the transport's rate, loops cross-faded), as float32 mono.
class SegmentSource : public QIODevice {
public:
    SegmentSource(TakeAudioPtr take, const PlaybackSpan& span, const PlaybackParams& params)
        : take_(std::move(take)), stream_(take_->signal, span, params) {}
    const PlaybackStream& stream() const { return stream_; }

protected:
    qint64 readData(char* data, qint64 maxBytes) override {
        const auto frames = static_cast<std::size_t>(maxBytes / static_cast<qint64>(sizeof(float)));
        buffer_.resize(frames);
        const std::size_t n = stream_.read(buffer_.data(), frames);
        std::memcpy(data, buffer_.data(), n * sizeof(float));
        return static_cast<qint64>(n * sizeof(float));
    }
    qint64 writeData(const char*, qint64) override { return -1; }
    bool isSequential() const override { return true; }

private:
    TakeAudioPtr take_;  // keeps the samples the stream reads alive
    PlaybackStream stream_;
    std::vector<float> buffer_;
};

namespace {
constexpr double loopCrossfadeSeconds = 0.01;  // short enough not to blur a 40 ms fault; common practice
}

void AudioPlayer::setRate(double rate) {
    transport_.setRate(rate);
    emit rateOrLoopChanged();
}

void AudioPlayer::setLooping(bool on) {
    transport_.setLooping(on);
    emit rateOrLoopChanged();
}

AudioPlayer::AudioPlayer(ViewState* view, QObject* parent) : QObject(parent), view_(view) {
    if (QMediaDevices::defaultAudioOutput().isNull())
        unavailableReason_ = tr("No audio output device: playback is off.");
    transport_.setLoopCrossfade(loopCrossfadeSeconds);
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
    try {
        source_ = std::make_unique<SegmentSource>(take_, transport_.playbackSpan(), transport_.playbackParams());
    } catch (const Error& e) {
        transport_.stop();
        emit message(tr("Cannot play this span: %1").arg(QString::fromStdString(e.what())));
        return false;
    }
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
    // What the device has played, mapped back to take time by the stream.
    const auto played = static_cast<std::int64_t>(static_cast<double>(sink_->processedUSecs()) * 1e-6 * take_->signal.sampleRate);
    const auto head = source_->stream().takeSecondsAt(played);
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
