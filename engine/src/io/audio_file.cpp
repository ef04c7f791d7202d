#include "earmark/io/audio_file.hpp"

#include "earmark/core/error.hpp"

#include <sndfile.h>

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <memory>
#include <vector>

namespace earmark {
namespace {

namespace fs = std::filesystem;

constexpr std::int64_t kBlockFrames = 1 << 16;
constexpr std::int64_t kReserveFrames = std::int64_t{1} << 26;  // 23 min at 48 kHz

struct SndfileCloser {
    void operator()(SNDFILE* f) const { sf_close(f); }
};
using SndfilePtr = std::unique_ptr<SNDFILE, SndfileCloser>;

// Turns the reasons libsndfile and the file system give into one plain sentence.
[[noreturn]] void throwOpenError(const std::string& path, int sfError) {
    std::error_code ec;
    if (!fs::exists(path, ec)) throw InputError(path, "file not found");
    if (fs::is_directory(path, ec)) throw InputError(path, "is a folder, not an audio file");
    // A pipe or device was opened once already; opening it again would wait for a writer or eat its data.
    if (!fs::is_regular_file(path, ec))
        throw InputError(path, std::string("cannot be read as audio: ") + sf_error_number(sfError));
    {
        std::ifstream probe(path, std::ios::binary);
        if (!probe) throw InputError(path, std::string("cannot be opened: ") + std::strerror(errno));
    }
    if (fs::file_size(path, ec) == 0) throw InputError(path, "is empty (0 bytes)");
    switch (sfError) {
    case SF_ERR_UNRECOGNISED_FORMAT:
        throw InputError(path, "not a recognised audio format");
    case SF_ERR_MALFORMED_FILE:
        throw InputError(path, "malformed or truncated audio header");
    case SF_ERR_UNSUPPORTED_ENCODING:
        throw InputError(path, "audio encoding not supported");
    default:
        throw InputError(path, std::string("cannot be read as audio: ") + sf_error_number(sfError));
    }
}

std::string describeFormat(int format) {
    SF_FORMAT_INFO major{}, sub{};
    major.format = format & SF_FORMAT_TYPEMASK;
    sub.format = format & SF_FORMAT_SUBMASK;
    std::string text;
    if (sf_command(nullptr, SFC_GET_FORMAT_INFO, &major, sizeof(major)) == 0 && major.name)
        text = major.name;
    if (sf_command(nullptr, SFC_GET_FORMAT_INFO, &sub, sizeof(sub)) == 0 && sub.name)
        text += (text.empty() ? "" : " / ") + std::string(sub.name);
    return text;
}

SndfilePtr openForRead(const std::string& path, AudioInfo& info) {
    SF_INFO sfinfo{};
    SndfilePtr file(sf_open(path.c_str(), SFM_READ, &sfinfo));
    if (!file) throwOpenError(path, sf_error(nullptr));
    info.path = path;
    info.sampleRate = sfinfo.samplerate;
    info.channels = sfinfo.channels;
    info.frames = sfinfo.frames;
    info.format = describeFormat(sfinfo.format);
    if (sfinfo.channels <= 0) throw InputError(path, "declares no channels");
    if (sfinfo.samplerate <= 0) throw InputError(path, "declares no sample rate");
    if (sfinfo.frames <= 0) throw InputError(path, "contains no audio frames (zero length)");
    // Integer files are scaled to [-1, 1); float files are read as stored.
    sf_command(file.get(), SFC_SET_NORM_FLOAT, nullptr, SF_TRUE);
    return file;
}

}  // namespace

AudioInfo probeAudio(const std::string& path) {
    AudioInfo info;
    openForRead(path, info);
    return info;
}

LoadedAudio loadAudio(const std::string& path, const ChannelSelection& selection,
                      const AudioBlockObserver& observer, Progress progress) {
    return loadAudio(path, selection, AudioHeaderObserver{}, observer, progress);
}

LoadedAudio loadAudio(const std::string& path, const ChannelSelection& selection, const AudioHeaderObserver& onHeader,
                      const AudioBlockObserver& observer, Progress progress) {
    LoadedAudio out;
    SndfilePtr file = openForRead(path, out.info);
    if (onHeader) onHeader(out.info);
    const int channels = out.info.channels;
    if (selection.mode == ChannelMode::Pick &&
        (selection.channel < 0 || selection.channel >= channels)) {
        throw ParamError("ChannelSelection.channel",
                         "channel " + std::to_string(selection.channel + 1) + " requested but " +
                             path + " has " + std::to_string(channels) + " channel(s)");
    }

    out.signal.sampleRate = out.info.sampleRate;
    // A pipe's header may declare no length (SF_COUNT_MAX): reserve what is plausible, grow beyond.
    out.signal.samples.reserve(static_cast<std::size_t>(std::min(out.info.frames, kReserveFrames)));
    std::vector<float> block(static_cast<std::size_t>(kBlockFrames * channels));
    std::int64_t done = 0;
    const float mixGain = 1.0f / static_cast<float>(channels);
    for (;;) {
        const sf_count_t got = sf_readf_float(file.get(), block.data(), kBlockFrames);
        if (got <= 0) break;
        const std::size_t values = static_cast<std::size_t>(got) * channels;
        for (std::size_t i = 0; i < values; ++i) {
            if (!std::isfinite(block[i])) {
                throw InputError(path, "contains non-finite samples (NaN or Inf) at frame " +
                                           std::to_string(done + static_cast<std::int64_t>(i / channels)));
            }
        }
        if (observer) observer(block.data(), got, channels);
        for (sf_count_t f = 0; f < got; ++f) {
            const float* frame = block.data() + f * channels;
            float v;
            if (selection.mode == ChannelMode::Pick) {
                v = frame[selection.channel];
            } else if (channels == 1) {
                v = frame[0];
            } else {
                float sum = 0.0f;
                for (int c = 0; c < channels; ++c) sum += frame[c];
                v = sum * mixGain;
            }
            out.signal.samples.push_back(v);
        }
        done += got;
        progress.report(static_cast<double>(done) / static_cast<double>(out.info.frames));
    }
    const int err = sf_error(file.get());
    if (err != SF_ERR_NO_ERROR && done == 0) {
        throw InputError(path, std::string("audio data cannot be read: ") + sf_strerror(file.get()));
    }
    if (done == 0) throw InputError(path, "audio data is missing (truncated after the header)");
    out.info.frames = done;
    out.signal.samples.shrink_to_fit();
    return out;
}

void writeWav(const std::string& path, const Signal& signal, WavEncoding encoding) {
    if (signal.sampleRate <= 0) throw ParamError("Signal.sampleRate", "must be positive to write " + path);
    SF_INFO info{};
    info.samplerate = static_cast<int>(std::lround(signal.sampleRate));
    info.channels = 1;
    info.format = SF_FORMAT_WAV | (encoding == WavEncoding::Pcm16 ? SF_FORMAT_PCM_16 : SF_FORMAT_FLOAT);
    SndfilePtr file(sf_open(path.c_str(), SFM_WRITE, &info));
    if (!file) throw WriteError(path, std::string("cannot be written: ") + sf_strerror(nullptr));
    // Clip instead of wrapping when float samples exceed full scale.
    sf_command(file.get(), SFC_SET_CLIPPING, nullptr, SF_TRUE);
    const auto n = static_cast<sf_count_t>(signal.samples.size());
    if (sf_writef_float(file.get(), signal.samples.data(), n) != n)
        throw WriteError(path, std::string("write failed: ") + sf_strerror(file.get()));
}

}  // namespace earmark
