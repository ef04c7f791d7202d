// Speech and pauses from the energy track: a frame is speech when its energy
// is within `silenceBelowSpeechDb` of the take's speech level (a high
// percentile of frame energy) and above an absolute floor. Silent runs
// shorter than `minPauseSeconds` are bridged (stop closures are not pauses);
// speech runs shorter than `minSpeechSeconds` are treated as silence (clicks).
// Thresholds are common practice, not from a single source.
//
// Thread-safety: pure function; the result is a value.
#pragma once

#include "earmark/level/energy.hpp"

#include <cstdint>
#include <optional>
#include <vector>

namespace earmark {

struct PauseParams {
    double minPauseSeconds = 0.2;       // shortest silent stretch counted as a pause
    double silenceBelowSpeechDb = 30.0; // silence = energy below speech level − this
    double absoluteSilenceDb = -65.0;   // frames below this dBFS are always silent
    double minSpeechSeconds = 0.03;     // shorter energy bursts count as silence
    double speechLevelPercentile = 95.0;// percentile of frame energy (frames above the floor) = speech level

    void validate() const;  // throws ParamError("PauseParams.<field>")
};

struct Pause {
    double startS = 0.0;
    double endS = 0.0;
    double seconds() const { return endS - startS; }
};

struct SpeechActivity {
    double hopSeconds = 0.0;
    double durationS = 0.0;
    // Speech level (dBFS) and the silence threshold derived from it; when the
    // take is silent both are the absolute floor.
    double speechLevelDb = -120.0;
    double thresholdDb = -120.0;
    std::vector<std::uint8_t> rawSpeech;  // per energy frame, before bridging: 1 = above threshold
    std::vector<std::uint8_t> speech;     // per energy frame, after bridging and click removal
    std::optional<double> speechStartS;   // first speech frame − half a hop; empty when no speech
    std::optional<double> speechEndS;     // last speech frame + half a hop (≤ durationS)
    std::vector<Pause> pauses;            // silent stretches ≥ minPauseSeconds strictly inside speech

    bool hasSpeech() const { return speechStartS.has_value(); }
    double leadingSilenceS() const { return speechStartS.value_or(durationS); }
    double trailingSilenceS() const { return hasSpeech() ? durationS - *speechEndS : durationS; }
    // Seconds of speech (speech span minus pauses); 0 without speech.
    double articulationSeconds() const;
    // Longest run of raw-silent frames whose centres lie in [startS, endS), seconds.
    double longestSilenceWithin(double startS, double endS) const;
    // The pause overlapping most of [startS, endS), if at least `share` of the span is in it.
    std::optional<Pause> pauseCovering(double startS, double endS, double share = 0.8) const;
};

// `durationS`: the take's length (frames beyond it are ignored).
SpeechActivity detectSpeech(const EnergyTrack& energy, double durationS, const PauseParams& params = {});

}  // namespace earmark
