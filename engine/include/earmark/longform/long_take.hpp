// Measures of a long take (a chapter, an article: minutes to hours) over
// time, for finding what no single sentence shows: seams between rendered
// chunks, drifts of level, pitch or rate, a stretch in another voice, a
// monotone stretch (findings.hpp, seams.hpp).
//
// Two steps:
// 1. Frame tracks on one grid (frame i centred at i·hop, hop = frameHopSeconds
//    rounded to whole samples): energy (RMS dBFS, energy.hpp), F0 (YIN,
//    yin.hpp), MFCC c1…c12 (mfcc.hpp, no mean normalisation), and speech /
//    pauses (speech_activity.hpp). They are computed block by block
//    (blockSeconds plus a margin on each side whose frames are dropped), so
//    the working memory beside the audio is one block plus the tracks
//    (≈ 70 bytes per frame: ≈ 25 MB for an hour at a 10 ms hop).
// 2. Per window (windowSeconds long, every windowHopSeconds; the last window
//    ends at or before the end of the take): loudness (BS.1770-4 integrated,
//    gated, over the window: one streaming meter per open window), speech
//    level, F0 median and range, articulation rate, pauses and a timbre
//    distance (timbre.hpp). Windows with less than minSpeechShare of speech
//    are not measured (measured = false, values NaN).
//
// Errors: ParamError naming the field; InputError("audio", …) for a take
// shorter than minTakeSeconds ("too short …") or without speech; Cancelled
// when `progress` asks. Thread-safety: pure functions; reentrant.
#pragma once

#include "earmark/align/mfcc.hpp"
#include "earmark/core/progress.hpp"
#include "earmark/core/signal.hpp"
#include "earmark/level/energy.hpp"
#include "earmark/longform/theil_sen.hpp"
#include "earmark/pitch/pitch_track.hpp"
#include "earmark/pitch/yin.hpp"
#include "earmark/prosody/speech_activity.hpp"

#include <string>
#include <vector>

namespace earmark {

struct LongTakeParams {
    double windowSeconds = 20.0;      // window length, s. Valid: [5, 600]
    double windowHopSeconds = 5.0;    // window step, s. Valid: (0, windowSeconds]
    double frameHopSeconds = 0.01;    // frame step of the tracks, s. Valid: [0.002, 0.05]
    double blockSeconds = 60.0;       // analysis block, s (memory vs. overhead). Valid: [10, 3600]
    double minTakeSeconds = 30.0;     // shorter takes are refused. Valid: >= windowSeconds
    double minSpeechShare = 0.3;      // windows with less speech are not measured. Valid: [0, 1]
    PitchParams pitch;                // hopSeconds is replaced by frameHopSeconds
    PauseParams pause;
    void validate() const;  // throws ParamError("LongTakeParams.<field>")
};

// Frame tracks of the whole take, on one grid.
struct LongTakeTracks {
    double hopSeconds = 0.0;
    double durationS = 0.0;
    EnergyTrack energy;
    PitchTrack pitch;
    FeatureMatrix mfcc;               // c1…c12 per frame (dims = 12), same frames as energy
    SpeechActivity speech;
};

struct WindowMeasures {
    double startS = 0.0, endS = 0.0;
    double speechSeconds = 0.0;       // speech frames × hop
    bool measured = false;            // enough speech (else the values below are NaN)
    double loudnessLufs = 0.0;        // BS.1770-4 integrated over the window
    double speechLevelDb = 0.0;       // power mean of the speech frames' energy, dBFS
    double f0MedianHz = 0.0;          // over voiced frames
    double f0RangeSt = 0.0;           // 12·log2(p95/p5) of voiced F0
    double articulationRate = 0.0;    // syllable nuclei (energy peaks) per second of speech
    int pauses = 0;                   // pauses whose middle lies in the window
    double pauseSeconds = 0.0;        // their total length
    double timbreDistance = 0.0;      // median symmetric KL (nats) to the other measured windows
};

// A trend over the take: Theil–Sen fit of a window measure against the
// window's centre in minutes.
struct MeasureTrend {
    std::string measure;              // "loudness_lufs", "f0_median_st", "f0_range_st", "articulation_rate", "timbre_distance"
    std::string unit;                 // unit of the slope, e.g. "LU/min"
    TrendFit fit;
};

struct LongTakeSeries {
    double durationS = 0.0;
    double windowSeconds = 0.0, windowHopSeconds = 0.0;
    double f0ReferenceHz = 0.0;       // median voiced F0 of the take (0 without voicing); "f0_median_st" is re this
    std::vector<WindowMeasures> windows;
    std::vector<MeasureTrend> trends;
};

struct LongTakeAnalysis {
    LongTakeTracks tracks;
    LongTakeSeries series;
};

LongTakeAnalysis analyseLongTake(const Signal& take, const LongTakeParams& params = {}, Progress progress = {});

// Speech runs between pauses: [speech start, first pause start), [its end, next
// start) … (empty without speech).
struct SpeechSegment {
    double startS = 0.0, endS = 0.0;
};
std::vector<SpeechSegment> speechSegments(const SpeechActivity& speech);

}  // namespace earmark
