// Reading audio files (anything libsndfile reads: WAV, FLAC, OGG/Vorbis,
// AIFF…; 8/16/24/32-bit integer and float; any rate and channel count).
//
// Files are streamed in blocks: loading a 1-hour 48 kHz stereo file to mono
// needs the mono float32 result plus one block, not the interleaved file.
// Every error is an InputError whose subject is the file path and whose
// problem says what is wrong (missing, a folder, unreadable, not audio,
// truncated, empty, non-finite samples).
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"

#include <cstdint>
#include <functional>
#include <string>

namespace earmark {

struct AudioInfo {
    std::string path;
    double sampleRate = 0.0;   // Hz
    int channels = 0;
    std::int64_t frames = 0;   // samples per channel as declared by the header
    std::string format;        // e.g. "WAV (Microsoft) / Signed 16 bit PCM"
    double durationSeconds() const { return sampleRate > 0 ? frames / sampleRate : 0.0; }
};

enum class ChannelMode {
    Mix,   // average of all channels
    Pick,  // one channel, by zero-based index
};

struct ChannelSelection {
    ChannelMode mode = ChannelMode::Mix;
    int channel = 0;  // used with ChannelMode::Pick; must be < AudioInfo::channels
};

// Called once per block read, with the interleaved samples of all channels,
// before down-mixing. Lets meters that need every channel (BS.1770 loudness,
// peaks) run in the same pass without keeping the whole file.
using AudioBlockObserver =
    std::function<void(const float* interleaved, std::int64_t frames, int channels)>;

// Called once when the header has been read, before the first block: lets a
// caller set up meters (or refuse the file, by throwing) without opening the
// file a second time — a pipe or /dev/stdin can be read only once.
using AudioHeaderObserver = std::function<void(const AudioInfo& header)>;

// Reads the header only (opens the file; use the loadAudio overload with an
// AudioHeaderObserver for a pipe). Throws InputError.
AudioInfo probeAudio(const std::string& path);

struct LoadedAudio {
    AudioInfo info;   // info.frames is corrected to the frames actually read
    Signal signal;    // mono per `selection`
};

// Reads the whole file to a mono Signal. Throws InputError (also for NaN/Inf
// samples, naming the first bad frame), ParamError for a channel index out of
// range, Cancelled if `progress` asks to stop.
LoadedAudio loadAudio(const std::string& path, const ChannelSelection& selection = {},
                      const AudioBlockObserver& observer = {}, Progress progress = {});
LoadedAudio loadAudio(const std::string& path, const ChannelSelection& selection, const AudioHeaderObserver& onHeader,
                      const AudioBlockObserver& observer, Progress progress);

// Writes a mono signal as a 16-bit PCM or 32-bit float WAV (for clips, tests,
// the demo). Throws Error naming the path if it cannot be written.
enum class WavEncoding { Pcm16, Float32 };
void writeWav(const std::string& path, const Signal& signal, WavEncoding encoding = WavEncoding::Pcm16);

}  // namespace earmark
