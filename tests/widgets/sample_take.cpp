#include "sample_take.hpp"

#include "earmark/io/audio_file.hpp"
#include "support/test_signals.hpp"

namespace earmark::test {

const SampleTake& sampleTake() {
    static SampleTake t;
    static const bool made = [] {
        using earmark::test::VoiceSegment;
        const auto voice = earmark::test::synthesiseVoice(
            {{VoiceSegment::Kind::Silence, 0.2}, {VoiceSegment::Kind::Voiced, 0.6, 120.0, 180.0, 0.4},
             {VoiceSegment::Kind::Noise, 0.15, 0, 0, 0.05}, {VoiceSegment::Kind::Silence, 0.2},
             {VoiceSegment::Kind::Voiced, 0.5, 200.0, 140.0, 0.3}, {VoiceSegment::Kind::Silence, 0.15}},
            16000.0);
        t.path = QString::fromStdString(t.dir.file("voice.wav"));
        writeWav(t.path.toStdString(), voice.signal);
        t.audio = widgets::loadTake(t.path);
        t.tracks = widgets::analyseTake(*t.audio, widgets::AnalysisSettings{});
        return true;
    }();
    (void)made;
    return t;
}

QString pairsSample(const std::string& name) {
    return QString::fromStdString(std::string(EARMARK_SOURCE_DIR) + "/samples/pairs/" + name);
}

}  // namespace earmark::test
