#include "earmark/pitch/yin.hpp"

#include "earmark/core/error.hpp"
#include "earmark/dsp/frames.hpp"
#include "earmark/dsp/resample.hpp"
#include "earmark/pitch/pitch_continuity.hpp"
#include "earmark/pitch/noise_floor.hpp"
#include "earmark/pitch/yin_frame.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <vector>

namespace earmark {

namespace {

constexpr std::int64_t kProgressEvery = 2048;  // frames between progress reports
constexpr double kStep6Range = 0.2;            // the paper's ±20 % re-search range

void checkSignal(const Signal& signal) {
    if (!(signal.sampleRate > 0) || !std::isfinite(signal.sampleRate))
        throw ParamError("Signal.sampleRate", "must be positive and finite");
    for (float v : signal.samples)
        if (!std::isfinite(v)) throw InputError("Signal.samples", "contains NaN or infinite values");
}

// The take's loud level: 95th percentile of frame energies (dB).
double loudLevelDb(const std::vector<float>& energyDb) {
    std::vector<float> sorted(energyDb);
    const auto k = static_cast<std::size_t>(0.95 * static_cast<double>(sorted.size() - 1));
    std::nth_element(sorted.begin(), sorted.begin() + static_cast<std::ptrdiff_t>(k), sorted.end());
    return sorted[k];
}

// Samples [start, start + scratch.size()) of x, zero outside: a view into x when
// the range lies inside it (the common case), else a zero-padded copy in `scratch`.
std::span<const float> samplesAt(std::span<const float> x, std::int64_t start, std::span<float> scratch) {
    const auto n = static_cast<std::int64_t>(x.size());
    const auto len = static_cast<std::int64_t>(scratch.size());
    if (start >= 0 && start + len <= n) return x.subspan(static_cast<std::size_t>(start), scratch.size());
    for (std::int64_t j = 0; j < len; ++j) {
        const std::int64_t k = start + j;
        scratch[static_cast<std::size_t>(j)] = k >= 0 && k < n ? x[static_cast<std::size_t>(k)] : 0.0f;
    }
    return scratch;
}

// Mean square (dB) of the span each frame reads; −300 for digital silence.
std::vector<float> frameEnergiesDb(std::span<const float> x, std::int64_t frames, double centreStep, int span) {
    std::vector<float> out(static_cast<std::size_t>(frames));
    std::vector<float> edgeFrame(static_cast<std::size_t>(span));
    for (std::int64_t i = 0; i < frames; ++i) {
        const double centre = static_cast<double>(i) * centreStep;
        const auto frame = samplesAt(x, std::llround(centre - 0.5 * span), edgeFrame);
        double sum[4] = {0.0, 0.0, 0.0, 0.0};  // independent partial sums
        std::size_t j = 0;
        for (; j + 4 <= frame.size(); j += 4)
            for (std::size_t u = 0; u < 4; ++u) sum[u] += static_cast<double>(frame[j + u]) * frame[j + u];
        for (; j < frame.size(); ++j) sum[0] += static_cast<double>(frame[j]) * frame[j];
        const double meanSquare = ((sum[0] + sum[1]) + (sum[2] + sum[3])) / span;
        out[static_cast<std::size_t>(i)] = static_cast<float>(meanSquare > 1e-30 ? 10.0 * std::log10(meanSquare) : -300.0);
    }
    return out;
}

// Each frame's noise share (noise_floor.hpp) against the take's steady noise
// floor, estimated from the frames wholly inside the signal (the zero padding
// makes edge frames read low).
std::vector<float> frameNoiseShares(std::span<const float> energyDb, std::size_t samples, double centreStep, int span) {
    const NoiseFloorRule rule;
    const auto first = static_cast<std::size_t>(std::ceil(0.5 * span / centreStep));
    const double lastCentre = static_cast<double>(samples) - 0.5 * span;
    const std::size_t end =
        lastCentre < 0.0 ? 0 : std::min(energyDb.size(), static_cast<std::size_t>(std::floor(lastCentre / centreStep)) + 1);
    const double floorDb = first < end ? steadyNoiseFloorDb(energyDb.subspan(first, end - first), rule)
                                       : -std::numeric_limits<double>::infinity();
    return noiseShares(energyDb, floorDb, rule);
}

// Steps 2–6 over every frame; the candidates of each. Step 4's absolute
// threshold is per frame (raised in noisy frames, noise_floor.hpp). Step 6
// needs each frame's d′ until the frames `radius` ahead have their own
// estimate, so the last radius+1 frames' d and d′ are kept in a small ring.
std::vector<PitchCandidates> firstPass(std::span<const float> x, std::int64_t frames, double centreStep,
                                       const YinGeometry& g, std::span<const float> thresholds, int radius,
                                       const Progress& progress) {
    std::vector<PitchCandidates> out(static_cast<std::size_t>(frames));
    std::vector<YinDip> initial(static_cast<std::size_t>(frames));

    YinFrame yin(g);
    const auto lags = static_cast<std::size_t>(g.maxLag + 2);
    const auto slots = static_cast<std::size_t>(radius + 1);
    std::vector<float> ringD(slots * lags), ringN(slots * lags);

    const auto finalise = [&](std::int64_t t) {
        const std::span<const float> d(ringD.data() + static_cast<std::size_t>(t) % slots * lags, lags);
        const std::span<const float> dn(ringN.data() + static_cast<std::size_t>(t) % slots * lags, lags);
        // Step 6: the neighbour with the lowest d′ at its own estimate leads.
        std::int64_t lead = t;
        for (std::int64_t th = std::max<std::int64_t>(0, t - radius); th <= std::min(frames - 1, t + radius); ++th)
            if (initial[static_cast<std::size_t>(th)].aperiodicity < initial[static_cast<std::size_t>(lead)].aperiodicity)
                lead = th;
        YinDip pick = initial[static_cast<std::size_t>(t)];
        if (lead != t) {
            const double guide = initial[static_cast<std::size_t>(lead)].lag;
            const int lo = std::max(g.minLag, static_cast<int>(std::floor(guide * (1.0 - kStep6Range))));
            const int hi = std::min(g.maxLag, static_cast<int>(std::ceil(guide * (1.0 + kStep6Range))));
            if (lo <= hi) pick = pickDip(d, dn, lo, hi, thresholds[static_cast<std::size_t>(t)]);
        }
        auto& c = out[static_cast<std::size_t>(t)];
        c.dips[0] = pick;
        c.count = 1 + deepestDips(d, dn, g.minLag, g.maxLag, pick.lag, std::span(c.dips).subspan(1));
        // F0 above the range: every dip in range is a subharmonic, none is an answer.
        if (periodicBelowLag(dn, g.minLag, thresholds[static_cast<std::size_t>(t)]))
            for (int k = 0; k < c.count; ++k) c.dips[static_cast<std::size_t>(k)].aperiodicity = 1.0f;
    };

    const double half = 0.5 * g.span;
    std::vector<float> edgeFrame(static_cast<std::size_t>(g.span));
    for (std::int64_t i = 0; i < frames; ++i) {
        const double centre = static_cast<double>(i) * centreStep;
        const std::span<float> d(ringD.data() + static_cast<std::size_t>(i) % slots * lags, lags);
        const std::span<float> dn(ringN.data() + static_cast<std::size_t>(i) % slots * lags, lags);
        yin.compute(samplesAt(x, std::llround(centre - half), edgeFrame), d, dn);
        initial[static_cast<std::size_t>(i)] = pickDip(d, dn, g.minLag, g.maxLag, thresholds[static_cast<std::size_t>(i)]);
        if (i >= radius) finalise(i - radius);
        if (i % kProgressEvery == 0) progress.report(static_cast<double>(i) / static_cast<double>(frames));
    }
    for (std::int64_t t = std::max<std::int64_t>(0, frames - radius); t < frames; ++t) finalise(t);
    return out;
}

}  // namespace

PitchTrack analysePitch(const Signal& signal, const PitchParams& params, Progress progress) {
    params.validate();
    checkSignal(signal);
    const int hop = hopSamples(params.hopSeconds, signal.sampleRate);
    const FrameLayout layout(static_cast<std::int64_t>(signal.size()), 1, hop);
    const std::int64_t frames = layout.count();

    PitchTrack track;
    track.hopSeconds = static_cast<double>(hop) / signal.sampleRate;
    const auto n = static_cast<std::size_t>(frames);
    track.f0Hz.assign(n, 0.0f);
    track.aperiodicity.assign(n, 1.0f);
    track.confidence.assign(n, 0.0f);
    progress.report(0.0);
    if (frames == 0) {
        progress.report(1.0);
        return track;
    }

    const double rate = params.analysisRateHz;
    const YinGeometry g = YinGeometry::forRange(rate, params.minF0Hz, params.maxF0Hz);
    const Signal x = resample(signal, rate);
    progress.report(0.1);

    const double centreStep = track.hopSeconds * rate;  // frame step in analysis samples
    const double maxPeriodSeconds = g.maxLag / rate;
    const int radius = std::max(1, static_cast<int>(std::floor(0.5 * maxPeriodSeconds / track.hopSeconds)));

    // The noise floor and each frame's noise share (noise_floor.hpp) set the
    // bars of step 4 and of voicing.
    const std::vector<float> energyDb = frameEnergiesDb(x.samples, frames, centreStep, g.span);
    const std::vector<float> noiseShare =
        params.noiseAdaptiveVoicing ? frameNoiseShares(energyDb, x.samples.size(), centreStep, g.span)
                                    : std::vector<float>(n, 0.0f);
    std::vector<float> thresholds(n);
    for (std::size_t i = 0; i < n; ++i)
        thresholds[i] = static_cast<float>(barInNoise(noiseShare[i], params.threshold, params.noiseVoicingMaxAperiodicity));
    const std::vector<PitchCandidates> candidates =
        firstPass(x.samples, frames, centreStep, g, thresholds, radius, progress.sub(0.1, 0.9));

    // Voicing: the energy gates are hard; the aperiodicity bar is applied per
    // frame, or inside the continuity step's Viterbi search.
    const double gateDb = std::max(params.absoluteFloorDb, loudLevelDb(energyDb) + params.silenceGateDb);
    std::vector<std::uint8_t> loudEnough(n);
    for (std::size_t i = 0; i < n; ++i) loudEnough[i] = energyDb[i] >= gateDb;
    std::vector<std::uint8_t> choice(n, kUnvoiced);
    if (params.continuity) {
        ContinuityCosts costs;
        costs.unvoicedCost = params.voicingMaxAperiodicity;
        costs.switchCost = params.voicingSwitchCost;
        costs.octaveJumpCost = params.octaveJumpCost;
        costs.freeOctavesPerFrame = params.freeGlideSemitonesPerSecond * track.hopSeconds / 12.0;
        costs.shorterLagPreference = params.shorterLagPreference;
        costs.noisyUnvoicedCostMax = params.noiseVoicingMaxAperiodicity;
        choice = trackCandidates(candidates, loudEnough, noiseShare, costs);
        const int minRun = static_cast<int>(std::ceil(params.minVoicedSeconds / track.hopSeconds - 1e-9));
        dropShortVoicedRuns(choice, minRun);
    } else {
        for (std::size_t i = 0; i < n; ++i)
            if (loudEnough[i] && candidates[i].dips[0].aperiodicity <=
                                      barInNoise(noiseShare[i], params.voicingMaxAperiodicity,
                                                 params.noiseVoicingMaxAperiodicity))
                choice[i] = 0;
    }
    progress.report(0.95);

    const std::int64_t refineReach = g.span;
    std::vector<float> refineScratch(static_cast<std::size_t>(2 * refineReach));
    for (std::size_t i = 0; i < n; ++i) {
        const bool isVoiced = choice[i] != kUnvoiced;
        const YinDip& dip = candidates[i].dips[isVoiced ? choice[i] : 0];
        track.aperiodicity[i] = dip.aperiodicity;
        track.confidence[i] = loudEnough[i] ? std::clamp(1.0f - dip.aperiodicity, 0.0f, 1.0f) : 0.0f;
        if (isVoiced) {
            // The refinement reads at most (W + 1.2·maxLag)/2 + 3 < span samples either side.
            const double centre = static_cast<double>(i) * centreStep;
            const std::int64_t first = std::llround(centre) - refineReach;
            const auto region = samplesAt(x.samples, first, refineScratch);
            const float lag = refineLagCentred(region, centre - static_cast<double>(first), g.window, dip.lag);
            // Interpolation at the range's edge may step just past it; F0 stays within the range.
            track.f0Hz[i] = static_cast<float>(std::clamp(rate / lag, params.minF0Hz, params.maxF0Hz));
        }
    }
    progress.report(1.0);
    return track;
}

}  // namespace earmark
