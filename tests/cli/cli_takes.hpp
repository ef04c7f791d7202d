// Takes the command-line tests write for earmark-cli to read.
#pragma once

#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <string>

namespace earmark::test {

// One second of speech-like sound (test::speechLike) at `rate`, written as
// `name` in `dir`; returns its path.
inline std::string writeSpeechLikeTake(const TempDir& dir, const std::string& name, double rate = 16000.0) {
    writeWav(dir.file(name), speechLike(1.0, rate));
    return dir.file(name);
}

}  // namespace earmark::test
