// Whole-take analysis: one pass over the file for samples, loudness and peak
// statistics, then the requested tracks (F0, energy, mel spectrogram).
// Pure: takes a path and parameters, returns values; safe to run several at
// once on different threads.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/level/energy.hpp"
#include "earmark/level/sample_stats.hpp"
#include "earmark/pitch/yin.hpp"
#include "earmark/spectral/mel.hpp"

#include <optional>

namespace earmark {

struct TrackSelection {
    bool f0 = true;
    bool energy = true;
    bool mel = true;
    bool loudness = true;
};

struct AnalysisParams {
    ChannelSelection channels;
    TrackSelection tracks;
    PitchParams pitch;
    EnergyParams energy;
    MelParams mel;
    // The mel spectrogram is computed on the signal resampled to this rate, so
    // features of files at any rate are comparable with a model's features
    // (common neural-TTS settings use 22.05 kHz). 0 = the file's own rate.
    double melRateHz = 22050.0;

    double melRateFor(double fileRate) const { return melRateHz > 0 ? melRateHz : fileRate; }
    // Validates every enabled part; throws ParamError naming the field.
    void validate(double fileRate) const;
};

// Summary figures of the F0 contour (over voiced frames only).
struct PitchSummary {
    std::optional<double> medianHz, p5Hz, p95Hz;  // empty when nothing is voiced
    double voicedFraction = 0.0;                  // voiced frames / all frames
    std::optional<double> rangeSemitones;         // 12·log2(p95/p5)
};

struct TakeAnalysis {
    AudioInfo info;
    Signal signal;  // mono per AnalysisParams::channels (kept for views and clips)
    std::optional<PitchTrack> pitch;
    PitchSummary pitchSummary;
    std::optional<EnergyTrack> energy;
    std::optional<Spectrogram> mel;
    // −inf when every block is gated out; NaN (undefined) when the sample rate
    // is below kMinKWeightingRateHz (3364 Hz), where BS.1770's filter does not exist.
    std::optional<double> loudnessLufs;
    SampleStats sampleStats;             // over all channels
};

PitchSummary summarisePitch(const PitchTrack& track);

// Throws InputError (bad file), ParamError (bad parameter), Cancelled.
TakeAnalysis analyseFile(const std::string& path, const AnalysisParams& params = {},
                         Progress progress = {});

// Whether analyseSignal keeps a copy of the signal in its result.
enum class KeepSignal {
    Copy,  // result.signal is a copy of the input
    No,    // result.signal stays empty: for callers that already hold the signal
           // (the window), so an hour-long take is not held twice
};

// Same, for a signal already in memory (loudness and stats on that mono signal).
TakeAnalysis analyseSignal(const Signal& signal, const AnalysisParams& params = {},
                           Progress progress = {}, KeepSignal keep = KeepSignal::Copy);

}  // namespace earmark
