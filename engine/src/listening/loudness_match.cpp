#include "earmark/listening/loudness_match.hpp"

#include "earmark/io/audio_file.hpp"
#include "earmark/loudness/bs1770.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace earmark::listening {

std::vector<double> matchingGainsDb(const std::vector<double>& loudness) {
    double quietest = std::numeric_limits<double>::infinity();
    for (double l : loudness)
        if (std::isfinite(l)) quietest = std::min(quietest, l);
    std::vector<double> gains;
    for (double l : loudness) gains.push_back(std::isfinite(l) ? quietest - l : 0.0);
    return gains;
}

std::vector<MatchedTake> measureTrialLoudness(const std::vector<std::string>& paths) {
    std::vector<double> loudness;
    for (const std::string& path : paths) {
        std::vector<float> interleaved;
        int channels = 1;
        const LoadedAudio audio = loadAudio(path, {}, [&](const float* block, std::int64_t frames, int ch) {
            channels = ch;
            interleaved.insert(interleaved.end(), block, block + frames * ch);
        });
        const auto frames = static_cast<std::int64_t>(interleaved.size()) / channels;
        loudness.push_back(integratedLoudnessLufs(interleaved.data(), frames, audio.info.sampleRate, channels));
    }
    const std::vector<double> gains = matchingGainsDb(loudness);
    std::vector<MatchedTake> out;
    for (std::size_t i = 0; i < paths.size(); ++i) out.push_back({loudness[i], gains[i]});
    return out;
}

}  // namespace earmark::listening
