// A short voice-like take with known F0 for widget tests, written to a
// temporary WAV and analysed with the window's own loader steps.
#pragma once

#include "earmark/widgets/take_loader.hpp"
#include "support/temp_dir.hpp"

#include <QString>

#include <string>

namespace earmark::test {

struct SampleTake {
    earmark::test::TempDir dir;
    QString path;
    widgets::TakeAudioPtr audio;
    widgets::TakeTracksPtr tracks;
};

// 0.2 s silence, 0.6 s voiced 120→180 Hz, 0.15 s noise, 0.2 s silence,
// 0.5 s voiced 200→140 Hz, 0.15 s silence, at 16 kHz.
const SampleTake& sampleTake();

// The path of a file of samples/pairs, the bundled two-build example.
QString pairsSample(const std::string& name);

}  // namespace earmark::test
