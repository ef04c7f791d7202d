#include "earmark/longform/long_take.hpp"

#include "earmark/core/error.hpp"
#include "earmark/core/numeric.hpp"
#include "earmark/dsp/frames.hpp"
#include "earmark/longform/timbre.hpp"
#include "earmark/loudness/bs1770.hpp"
#include "earmark/prosody/syllables.hpp"

#include "../prosody/track_stats.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <optional>

namespace earmark {
namespace {

constexpr int kTimbreDims = 12;        // c1…c12
constexpr double kMarginSeconds = 0.5;  // block margin: covers YIN's frame, step 6 and the MFCC window
constexpr std::size_t kMaxTimbreReferences = 240;  // windows each window is compared with (evenly spaced)

std::size_t frameAt(double t, double hop, std::size_t frames) {
    const auto i = static_cast<long long>(std::lround(t / hop));
    return static_cast<std::size_t>(std::clamp<long long>(i, 0, static_cast<long long>(frames) - 1));
}

// Step 1: energy, F0 and MFCC block by block on one frame grid; loudness of
// every window from streaming meters fed as the blocks pass.
void computeTracks(const Signal& take, const LongTakeParams& params, int windowCount, LongTakeAnalysis& out,
                   Progress progress) {
    const double rate = take.sampleRate;
    const int hop = hopSamples(params.frameHopSeconds, rate);
    const double hopS = hop / rate;
    const auto n = static_cast<std::int64_t>(take.size());
    const std::int64_t frames = n / hop + 1;
    auto& tr = out.tracks;
    tr.hopSeconds = hopS;
    tr.durationS = take.durationSeconds();
    tr.energy.hopSeconds = hopS;
    tr.energy.db.assign(static_cast<std::size_t>(frames), -120.0f);
    tr.pitch.hopSeconds = hopS;
    tr.pitch.f0Hz.assign(static_cast<std::size_t>(frames), 0.0f);
    tr.pitch.aperiodicity.assign(static_cast<std::size_t>(frames), 1.0f);
    tr.pitch.confidence.assign(static_cast<std::size_t>(frames), 0.0f);
    tr.mfcc.frames = static_cast<int>(frames);
    tr.mfcc.dims = kTimbreDims;
    tr.mfcc.hopSeconds = hopS;
    tr.mfcc.values.assign(static_cast<std::size_t>(frames) * kTimbreDims, 0.0f);

    PitchParams pitchParams = params.pitch;
    pitchParams.hopSeconds = hopS;
    EnergyParams energyParams;
    energyParams.hopSeconds = hopS;
    MfccParams mfccParams;
    mfccParams.hopSeconds = 0.01;
    mfccParams.coefficients = kTimbreDims + 1;
    mfccParams.meanNormalise = false;

    // Window loudness: one meter per window open over the current block.
    const auto windowSamples = [&](int w) {
        const double s = w * params.windowHopSeconds;
        return std::pair<std::int64_t, std::int64_t>{std::llround(s * rate),
                                                     std::min<std::int64_t>(n, std::llround((s + params.windowSeconds) * rate))};
    };
    std::map<int, LoudnessMeter> meters;
    int nextWindow = 0;
    out.series.windows.resize(static_cast<std::size_t>(windowCount));

    const auto blockFrames = std::max<std::int64_t>(1, std::llround(params.blockSeconds / hopS));
    const auto margin = static_cast<std::int64_t>(std::ceil(kMarginSeconds / hopS));
    Signal block;
    block.sampleRate = rate;
    for (std::int64_t b0 = 0; b0 < frames; b0 += blockFrames) {
        const std::int64_t b1 = std::min(frames, b0 + blockFrames);
        const std::int64_t m0 = std::max<std::int64_t>(0, b0 - margin);
        const std::int64_t m1 = std::min(frames, b1 + margin);
        const std::int64_t s0 = m0 * hop, s1 = std::min(n, m1 * hop);
        block.samples.assign(take.samples.begin() + s0, take.samples.begin() + s1);
        const Progress part = progress.sub(static_cast<double>(b0) / frames, static_cast<double>(b1) / frames);
        const EnergyTrack energy = analyseEnergy(block, energyParams);
        const PitchTrack pitch = analysePitch(block, pitchParams, part.sub(0, 0.6));
        const FeatureMatrix mfcc = computeMfcc(block, mfccParams, part.sub(0.6, 0.9));
        for (std::int64_t g = b0; g < b1; ++g) {
            const auto j = static_cast<std::size_t>(g - m0);
            const auto gi = static_cast<std::size_t>(g);
            if (j < energy.db.size()) tr.energy.db[gi] = energy.db[j];
            if (j < pitch.size()) {
                tr.pitch.f0Hz[gi] = pitch.f0Hz[j];
                tr.pitch.aperiodicity[gi] = pitch.aperiodicity[j];
                tr.pitch.confidence[gi] = pitch.confidence[j];
            }
            if (mfcc.frames > 0) {
                const auto k = static_cast<int>(frameAt(static_cast<double>(j) * hopS, mfcc.hopSeconds,
                                                        static_cast<std::size_t>(mfcc.frames)));
                std::copy_n(mfcc.row(k) + 1, kTimbreDims, tr.mfcc.row(static_cast<int>(g)));
            }
        }
        // Loudness: feed the block's own samples to every window they fall in.
        const std::int64_t c0 = b0 * hop, c1 = std::min(n, b1 * hop);
        for (int w = nextWindow; w < windowCount; ++w) {
            const auto [ws, we] = windowSamples(w);
            if (ws >= c1) break;
            const std::int64_t a = std::max(ws, c0), e = std::min(we, c1);
            if (e > a) meters.try_emplace(w, rate, 1).first->second.addInterleaved(take.samples.data() + a, e - a);
            if (we <= c1) {
                auto it = meters.find(w);
                out.series.windows[w].loudnessLufs =
                    it != meters.end() ? it->second.integratedLufs() : -std::numeric_limits<double>::infinity();
                if (it != meters.end()) meters.erase(it);
                if (w == nextWindow) ++nextWindow;
            }
        }
        part.report(1.0);
    }
}

double powerMeanDb(const EnergyTrack& energy, const std::vector<std::uint8_t>& speech, std::size_t a, std::size_t b) {
    double sum = 0;
    long count = 0;
    for (std::size_t i = a; i < b; ++i)
        if (speech[i]) {
            sum += std::pow(10.0, energy.db[i] / 10.0);
            ++count;
        }
    return count ? 10.0 * std::log10(sum / count) : kNaN;
}

double medianOf(std::vector<double> v) {
    if (v.empty()) return kNaN;
    std::sort(v.begin(), v.end());
    const std::size_t m = v.size() / 2;
    return v.size() % 2 ? v[m] : 0.5 * (v[m - 1] + v[m]);
}

void measureWindows(const LongTakeParams& params, LongTakeAnalysis& out) {
    const auto& tr = out.tracks;
    auto& series = out.series;
    const double hop = tr.hopSeconds;
    const std::size_t frames = tr.energy.db.size();
    std::vector<float> allVoiced;
    for (float f : tr.pitch.f0Hz)
        if (f > 0) allVoiced.push_back(f);
    series.f0ReferenceHz = allVoiced.empty() ? 0.0 : detail::percentile(allVoiced, 50);

    std::vector<TimbreModel> timbre(series.windows.size());
    for (std::size_t w = 0; w < series.windows.size(); ++w) {
        WindowMeasures& m = series.windows[w];
        m.startS = static_cast<double>(w) * params.windowHopSeconds;
        m.endS = std::min(tr.durationS, m.startS + params.windowSeconds);
        const detail::FrameRange r = detail::framesIn(hop, frames, m.startS, m.endS);
        long speechFrames = 0;
        TimbreAccumulator acc(kTimbreDims);
        std::vector<float> f0;
        for (std::size_t i = r.begin; i < r.end; ++i) {
            if (!tr.speech.speech[i]) continue;
            ++speechFrames;
            if (tr.pitch.voiced(i)) {
                f0.push_back(tr.pitch.f0Hz[i]);
                acc.add(tr.mfcc.row(static_cast<int>(i)));
            }
        }
        m.speechSeconds = static_cast<double>(speechFrames) * hop;
        for (const Pause& p : tr.speech.pauses) {
            const double mid = 0.5 * (p.startS + p.endS);
            if (mid >= m.startS && mid < m.endS) {
                ++m.pauses;
                m.pauseSeconds += p.seconds();
            }
        }
        m.measured = m.speechSeconds >= params.minSpeechShare * (m.endS - m.startS) && f0.size() > 10;
        if (!m.measured) {
            m.loudnessLufs = m.speechLevelDb = m.f0MedianHz = m.f0RangeSt = m.articulationRate = m.timbreDistance = kNaN;
            continue;
        }
        m.speechLevelDb = powerMeanDb(tr.energy, tr.speech.speech, r.begin, r.end);
        m.f0MedianHz = detail::percentile(f0, 50);
        m.f0RangeSt = 12.0 * std::log2(detail::percentile(f0, 95) / detail::percentile(f0, 5));
        const int nuclei = countEnergyPeaks(tr.energy, &tr.pitch, tr.speech.speechLevelDb, m.startS, m.endS);
        m.articulationRate = nuclei / m.speechSeconds;
        timbre[w] = TimbreModel::fit(acc);
    }

    // Timbre distance: median divergence to (up to kMaxTimbreReferences) other measured windows.
    std::vector<std::size_t> measured;
    for (std::size_t w = 0; w < timbre.size(); ++w)
        if (series.windows[w].measured && timbre[w].valid()) measured.push_back(w);
    std::vector<std::size_t> refs;
    const std::size_t step = std::max<std::size_t>(1, (measured.size() + kMaxTimbreReferences - 1) / kMaxTimbreReferences);
    for (std::size_t k = 0; k < measured.size(); k += step) refs.push_back(measured[k]);
    for (std::size_t w = 0; w < timbre.size(); ++w) {
        if (!series.windows[w].measured) continue;
        std::vector<double> d;
        for (std::size_t r : refs)
            if (r != w && timbre[w].valid()) d.push_back(symmetricKl(timbre[w], timbre[r]));
        series.windows[w].timbreDistance = medianOf(d);
    }
}

void fitTrends(LongTakeSeries& series) {
    struct Spec {
        const char* measure;
        const char* unit;
        double (*value)(const WindowMeasures&, double f0Ref);
    };
    static const Spec specs[] = {
        {"loudness_lufs", "LU/min", [](const WindowMeasures& m, double) { return m.loudnessLufs; }},
        {"f0_median_st", "st/min",
         [](const WindowMeasures& m, double ref) { return ref > 0 ? 12.0 * std::log2(m.f0MedianHz / ref) : kNaN; }},
        {"f0_range_st", "st/min", [](const WindowMeasures& m, double) { return m.f0RangeSt; }},
        {"articulation_rate", "syl/s/min", [](const WindowMeasures& m, double) { return m.articulationRate; }},
        {"timbre_distance", "nats/min", [](const WindowMeasures& m, double) { return m.timbreDistance; }},
    };
    for (const Spec& s : specs) {
        std::vector<double> x, y;
        for (const auto& m : series.windows)
            if (m.measured) {
                x.push_back(0.5 * (m.startS + m.endS) / 60.0);
                y.push_back(s.value(m, series.f0ReferenceHz));
            }
        series.trends.push_back({s.measure, s.unit, theilSen(x, y)});
    }
}

}  // namespace

void LongTakeParams::validate() const {
    const auto check = [](bool ok, const char* field, const char* problem) {
        if (!ok) throw ParamError(std::string("LongTakeParams.") + field, problem);
    };
    check(windowSeconds >= 5 && windowSeconds <= 600, "windowSeconds", "must be 5…600 s");
    check(windowHopSeconds > 0 && windowHopSeconds <= windowSeconds, "windowHopSeconds",
          "must be positive and at most windowSeconds");
    check(frameHopSeconds >= 0.002 && frameHopSeconds <= 0.05, "frameHopSeconds", "must be 0.002…0.05 s");
    check(blockSeconds >= 10 && blockSeconds <= 3600, "blockSeconds", "must be 10…3600 s");
    check(minTakeSeconds >= windowSeconds && std::isfinite(minTakeSeconds), "minTakeSeconds",
          "must be at least windowSeconds");
    check(minSpeechShare >= 0 && minSpeechShare <= 1, "minSpeechShare", "must be 0…1");
    PitchParams p = pitch;
    p.hopSeconds = frameHopSeconds;
    p.validate();
    pause.validate();
}

std::vector<SpeechSegment> speechSegments(const SpeechActivity& speech) {
    std::vector<SpeechSegment> out;
    if (!speech.hasSpeech()) return out;
    double start = *speech.speechStartS;
    for (const Pause& p : speech.pauses) {
        if (p.startS > start) out.push_back({start, p.startS});
        start = p.endS;
    }
    if (*speech.speechEndS > start) out.push_back({start, *speech.speechEndS});
    return out;
}

LongTakeAnalysis analyseLongTake(const Signal& take, const LongTakeParams& params, Progress progress) {
    params.validate();
    if (!(take.sampleRate > 0)) throw ParamError("Signal.sampleRate", "must be positive");
    const double duration = take.durationSeconds();
    if (duration < params.minTakeSeconds) {
        char buf[160];
        std::snprintf(buf, sizeof buf, "too short for long-form measures: %.1f s (at least %.0f s)", duration,
                      params.minTakeSeconds);
        throw InputError("audio", buf);
    }
    for (float s : take.samples)
        if (!std::isfinite(s)) throw InputError("audio", "has a NaN or infinite sample");
    const int windowCount = static_cast<int>(std::floor((duration - params.windowSeconds) / params.windowHopSeconds + 1e-9)) + 1;

    LongTakeAnalysis out;
    out.series.durationS = duration;
    out.series.windowSeconds = params.windowSeconds;
    out.series.windowHopSeconds = params.windowHopSeconds;
    computeTracks(take, params, windowCount, out, progress.sub(0, 0.95));
    out.tracks.speech = detectSpeech(out.tracks.energy, duration, params.pause);
    if (!out.tracks.speech.hasSpeech()) throw InputError("audio", "has no speech (silence or steady noise)");
    measureWindows(params, out);
    fitTrends(out.series);
    progress.report(1.0);
    return out;
}

}  // namespace earmark
