#include "earmark/analysis/take_analysis.hpp"

#include "earmark/core/error.hpp"
#include "earmark/dsp/resample.hpp"
#include "earmark/loudness/bs1770.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace earmark {
namespace {

double percentile(std::vector<float> values, double p) {
    // Linear interpolation between closest ranks (the usual "type 7" definition).
    std::sort(values.begin(), values.end());
    const double pos = p / 100.0 * static_cast<double>(values.size() - 1);
    const auto lo = static_cast<std::size_t>(std::floor(pos));
    const auto hi = std::min(lo + 1, values.size() - 1);
    return values[lo] + (pos - static_cast<double>(lo)) * (values[hi] - values[lo]);
}

// Runs the tracks that only need the mono signal.
void analyseTracks(TakeAnalysis& out, const Signal& signal, const AnalysisParams& params, Progress progress) {
    const auto& t = params.tracks;
    const double total = (t.f0 ? 6.0 : 0.0) + (t.mel ? 3.0 : 0.0) + (t.energy ? 1.0 : 0.0);
    double at = 0.0;
    auto step = [&](double weight) {
        Progress p = progress.sub(at / total, (at + weight) / total);
        at += weight;
        return p;
    };
    if (t.f0) {
        out.pitch = analysePitch(signal, params.pitch, step(6.0));
        out.pitchSummary = summarisePitch(*out.pitch);
    }
    if (t.energy) out.energy = analyseEnergy(signal, params.energy, step(1.0));
    if (t.mel) {
        const double melRate = params.melRateFor(signal.sampleRate);
        if (melRate == signal.sampleRate) {
            out.mel = computeMelSpectrogram(signal, params.mel, step(3.0));
        } else {
            out.mel = computeMelSpectrogram(resample(signal, melRate), params.mel, step(3.0));
        }
    }
    progress.report(1.0);
}

}  // namespace

void AnalysisParams::validate(double fileRate) const {
    if (tracks.f0) pitch.validate();
    if (tracks.mel) {
        if (melRateHz < 0) throw ParamError("AnalysisParams.melRateHz", "must be 0 or positive");
        mel.validate(melRateFor(fileRate));
    }
}

namespace {

// BS.1770's K-weighting needs its shelf (≈ 1.7 kHz) below Nyquist.
bool loudnessDefinedAt(double sampleRate) { return sampleRate >= kMinKWeightingRateHz; }

}  // namespace

PitchSummary summarisePitch(const PitchTrack& track) {
    PitchSummary s;
    std::vector<float> voiced;
    voiced.reserve(track.size());
    for (float f : track.f0Hz)
        if (f > 0) voiced.push_back(f);
    s.voicedFraction = track.size() ? static_cast<double>(voiced.size()) / track.size() : 0.0;
    if (voiced.empty()) return s;
    s.medianHz = percentile(voiced, 50);
    s.p5Hz = percentile(voiced, 5);
    s.p95Hz = percentile(voiced, 95);
    s.rangeSemitones = 12.0 * std::log2(*s.p95Hz / *s.p5Hz);
    return s;
}

TakeAnalysis analyseFile(const std::string& path, const AnalysisParams& params, Progress progress) {
    // One open, one pass: the file may be a pipe that can be read only once.
    std::optional<LoudnessMeter> loudness;
    std::optional<SampleStatsMeter> stats;
    auto onHeader = [&](const AudioInfo& header) {
        params.validate(header.sampleRate);
        if (params.tracks.loudness && loudnessDefinedAt(header.sampleRate))
            loudness.emplace(header.sampleRate, header.channels);
        stats.emplace(header.channels);
    };
    auto observe = [&](const float* block, std::int64_t frames, int) {
        if (loudness) loudness->addInterleaved(block, frames);
        stats->addInterleaved(block, frames);
    };
    LoadedAudio loaded = loadAudio(path, params.channels, onHeader, observe, progress.sub(0.0, 0.15));
    TakeAnalysis out;
    out.info = loaded.info;
    out.signal = std::move(loaded.signal);
    out.sampleStats = stats->result();
    if (loudness) out.loudnessLufs = loudness->integratedLufs();
    else if (params.tracks.loudness) out.loudnessLufs = std::numeric_limits<double>::quiet_NaN();
    analyseTracks(out, out.signal, params, progress.sub(0.15, 1.0));
    return out;
}

TakeAnalysis analyseSignal(const Signal& signal, const AnalysisParams& params, Progress progress,
                           KeepSignal keep) {
    params.validate(signal.sampleRate);
    TakeAnalysis out;
    out.info.sampleRate = signal.sampleRate;
    out.info.channels = 1;
    out.info.frames = static_cast<std::int64_t>(signal.size());
    if (keep == KeepSignal::Copy) out.signal = signal;
    SampleStatsMeter stats(1);
    stats.addInterleaved(signal.samples.data(), static_cast<std::int64_t>(signal.size()));
    out.sampleStats = stats.result();
    if (params.tracks.loudness)
        out.loudnessLufs = loudnessDefinedAt(signal.sampleRate)
                               ? integratedLoudnessLufs(signal.samples.data(),
                                                        static_cast<std::int64_t>(signal.size()), signal.sampleRate)
                               : std::numeric_limits<double>::quiet_NaN();
    analyseTracks(out, signal, params, progress);
    return out;
}

}  // namespace earmark
