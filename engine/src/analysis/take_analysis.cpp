#include "earmark/analysis/take_analysis.hpp"

#include "earmark/core/error.hpp"
#include "earmark/dsp/resample.hpp"
#include "earmark/loudness/bs1770.hpp"

#include <algorithm>
#include <cmath>

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
    const AudioInfo header = probeAudio(path);
    params.validate(header.sampleRate);
    std::optional<LoudnessMeter> loudness;
    if (params.tracks.loudness) loudness.emplace(header.sampleRate, header.channels);
    SampleStatsMeter stats(header.channels);
    auto observe = [&](const float* block, std::int64_t frames, int) {
        if (loudness) loudness->addInterleaved(block, frames);
        stats.addInterleaved(block, frames);
    };
    LoadedAudio loaded = loadAudio(path, params.channels, observe, progress.sub(0.0, 0.15));
    TakeAnalysis out;
    out.info = loaded.info;
    out.signal = std::move(loaded.signal);
    out.sampleStats = stats.result();
    if (loudness) out.loudnessLufs = loudness->integratedLufs();
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
        out.loudnessLufs = integratedLoudnessLufs(signal.samples.data(),
                                                  static_cast<std::int64_t>(signal.size()),
                                                  signal.sampleRate);
    analyseTracks(out, signal, params, progress);
    return out;
}

}  // namespace earmark
