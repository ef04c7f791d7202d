#include "earmark/model/mel_difference.hpp"

#include "array2d.hpp"

#include "earmark/core/error.hpp"
#include "earmark/dsp/resample.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace earmark {
namespace {

constexpr double kLowestDb = -200.0;  // floor when a side has none (a linear mel)

double levelFactor(SpectrumKind k) { return k == SpectrumKind::Magnitude ? 20.0 : 10.0; }

// The floor of a side in dB.
double floorDb(LogScale log, SpectrumKind kind, double floor) {
    switch (log) {
    case LogScale::Natural: return std::max(kLowestDb, levelFactor(kind) * std::log10(floor));
    case LogScale::Decibel: return std::max(kLowestDb, floor);
    case LogScale::None: return kLowestDb;
    }
    return kLowestDb;
}

double toDb(float v, LogScale log, SpectrumKind kind) {
    switch (log) {
    case LogScale::Natural: return v * levelFactor(kind) / std::numbers::ln10;
    case LogScale::Decibel: return v;
    case LogScale::None: return v > 0 ? levelFactor(kind) * std::log10(static_cast<double>(v)) : kLowestDb;
    }
    return v;
}

std::string hopText(const MelSettings& s) {
    return std::to_string(s.hopSize) + " samples at " + detail::formatted("%.0f Hz", s.sampleRateHz) + " = " +
           detail::formatted("%.2f ms", 1000.0 * s.hopSeconds());
}

void settingWarnings(const MelSettings& p, const MelSettings& c, std::vector<std::string>& w) {
    const std::string tail = ": the difference shows the settings as well as the model";
    if (std::abs(p.fminHz - c.fminHz) > 1e-6 || std::abs(p.fmaxHz - c.fmaxHz) > 1e-6)
        w.push_back("band range differs (" + detail::formatted("%.0f", p.fminHz) + "-" +
                    detail::formatted("%.0f Hz", p.fmaxHz) + " predicted, " + detail::formatted("%.0f", c.fminHz) +
                    "-" + detail::formatted("%.0f Hz", c.fmaxHz) + " computed): the bands cover different frequencies" +
                    tail);
    if (p.scale != c.scale || p.normalisation != c.normalisation)
        w.push_back("mel scale or band normalisation differs" + tail);
    if (p.spectrum != c.spectrum)
        w.push_back(std::string("the prediction is a ") + sidecarName(p.spectrum) + " mel, the computed one a " +
                    sidecarName(c.spectrum) + " mel: a filterbank over |X| cannot be turned into one over |X|² "
                    "afterwards" + tail);
    if (std::abs(p.sampleRateHz - c.sampleRateHz) > 1e-6 || p.fftSize != c.fftSize || p.windowSize != c.windowSize ||
        p.window != c.window)
        w.push_back("sample rate, FFT length or window differs (" + detail::formatted("%.0f Hz", p.sampleRateHz) +
                    ", " + std::to_string(p.fftSize) + "/" + std::to_string(p.windowSize) + " predicted; " +
                    detail::formatted("%.0f Hz", c.sampleRateHz) + ", " + std::to_string(c.fftSize) + "/" +
                    std::to_string(c.windowSize) + " computed): spectral resolution differs" + tail);
    if (std::abs(p.hopSeconds() - c.hopSeconds()) > 1e-9)
        w.push_back("hops differ (" + hopText(p) + " predicted, " + hopText(c) +
                    " computed): each predicted frame is matched with the nearest computed frame in time");
    else if (p.alignment != c.alignment)
        w.push_back("frame alignment differs (centred frames against vocoder-padded ones): frames matched by time");
}

// Connected regions of cells beyond the threshold, one sign each (4-neighbour flood fill).
std::vector<MelDifferenceRegion> findRegions(const MelDifference& d, const MelDifferenceParams& params) {
    const Spectrogram& s = d.difference;
    const int F = s.frames, B = s.bins;
    std::vector<int> label(static_cast<std::size_t>(F) * B, -1);
    std::vector<MelDifferenceRegion> regions;
    std::vector<double> weight;
    std::vector<std::pair<int, int>> stack;
    const auto sign = [&](int f, int b) {
        const float v = s.at(f, b);
        return v >= params.regionThresholdDb ? 1 : v <= -params.regionThresholdDb ? -1 : 0;
    };
    for (int f0 = 0; f0 < F; ++f0)
        for (int b0 = 0; b0 < B; ++b0) {
            const int sg = sign(f0, b0);
            if (sg == 0 || label[static_cast<std::size_t>(f0) * B + b0] >= 0) continue;
            MelDifferenceRegion r{f0, f0, b0, b0};
            double sum = 0.0, absSum = 0.0;
            const int id = static_cast<int>(regions.size());
            stack.assign(1, {f0, b0});
            label[static_cast<std::size_t>(f0) * B + b0] = id;
            while (!stack.empty()) {
                const auto [f, b] = stack.back();
                stack.pop_back();
                const double v = s.at(f, b);
                ++r.cells;
                sum += v;
                absSum += std::abs(v);
                if (std::abs(v) > std::abs(r.peakDb)) r.peakDb = v;
                r.firstFrame = std::min(r.firstFrame, f), r.lastFrame = std::max(r.lastFrame, f);
                r.firstBand = std::min(r.firstBand, b), r.lastBand = std::max(r.lastBand, b);
                const int nf[4] = {f - 1, f + 1, f, f}, nb[4] = {b, b, b - 1, b + 1};
                for (int k = 0; k < 4; ++k) {
                    if (nf[k] < 0 || nf[k] >= F || nb[k] < 0 || nb[k] >= B) continue;
                    int& l = label[static_cast<std::size_t>(nf[k]) * B + nb[k]];
                    if (l >= 0 || sign(nf[k], nb[k]) != sg) continue;
                    l = id;
                    stack.emplace_back(nf[k], nb[k]);
                }
            }
            r.meanDb = sum / r.cells;
            regions.push_back(r);
            weight.push_back(absSum);
        }
    std::vector<std::size_t> order;
    for (std::size_t i = 0; i < regions.size(); ++i)
        if (regions[i].cells >= params.minRegionCells) order.push_back(i);
    std::stable_sort(order.begin(), order.end(), [&](std::size_t x, std::size_t y) { return weight[x] > weight[y]; });
    if (order.size() > static_cast<std::size_t>(params.maxRegions))
        order.resize(static_cast<std::size_t>(params.maxRegions));
    std::vector<MelDifferenceRegion> out;
    const double hop = s.hopSeconds;
    for (std::size_t i : order) {
        MelDifferenceRegion r = regions[i];
        r.startS = s.frameTime(r.firstFrame);
        r.endS = s.frameTime(r.lastFrame) + hop;
        r.lowHz = s.binCentresHz[static_cast<std::size_t>(r.firstBand)];
        r.highHz = s.binCentresHz[static_cast<std::size_t>(r.lastBand)];
        r.firstFrame += d.firstFrame;
        r.lastFrame += d.firstFrame;
        out.push_back(r);
    }
    return out;
}

}  // namespace

void MelDifferenceParams::validate() const {
    if (!(regionThresholdDb > 0)) throw ParamError("MelDifferenceParams.regionThresholdDb", "must be positive");
    if (minRegionCells < 1) throw ParamError("MelDifferenceParams.minRegionCells", "must be at least 1");
    if (maxRegions < 0) throw ParamError("MelDifferenceParams.maxRegions", "must be >= 0");
}

MelDifference compareMels(const PredictedMel& predicted, const Spectrogram& computed,
                          const MelSettings& computedSettings, const MelDifferenceParams& params) {
    params.validate();
    const Spectrogram& p = predicted.mel;
    if (p.bins != computed.bins)
        throw InputError("mel difference", "band counts differ (" + std::to_string(p.bins) + " predicted, " +
                                               std::to_string(computed.bins) +
                                               " computed): they cannot be compared band by band");
    MelDifference out;
    for (const std::string& a : predicted.assumed)
        out.warnings.push_back("assumed " + a + " (neither given nor in a sidecar)");
    out.warnings.insert(out.warnings.end(), predicted.warnings.begin(), predicted.warnings.end());
    settingWarnings(predicted.settings, computedSettings, out.warnings);
    out.predictedFrames = p.frames;
    out.computedFrames = computed.frames;

    // Nearest computed frame of each predicted frame.
    const double hopC = computed.hopSeconds;
    const double t0 = computed.frames > 0 ? computed.frameTime(0) : 0.0;
    std::vector<int> match(static_cast<std::size_t>(p.frames), -1);
    int first = -1, last = -1;
    for (int i = 0; i < p.frames; ++i) {
        const double t = p.frameTime(i);
        const long j = std::lround((t - t0) / hopC);
        if (j < 0 || j >= computed.frames || std::abs(computed.frameTime(static_cast<int>(j)) - t) > 0.5 * hopC + 1e-9)
            continue;
        match[i] = static_cast<int>(j);
        if (first < 0) first = i;
        last = i;
    }
    if (first < 0) throw InputError("mel difference", "no predicted frame lies within the computed mel's time span");
    if (std::abs(predicted.settings.hopSeconds() - computedSettings.hopSeconds()) < 1e-9 &&
        std::abs(p.frames - computed.frames) > 1) {
        const double gap = (p.frames - computed.frames) * hopC;
        out.warnings.push_back("the prediction has " + std::to_string(p.frames) +
                               " frames, Earmark's mel of the audio " + std::to_string(computed.frames) + " (" +
                               detail::formatted("%.2f s ", std::abs(gap)) + (gap > 0 ? "longer" : "shorter") +
                               "): is this the audio made from this prediction? Only frames both cover are compared");
    }

    const double floorP = floorDb(p.log, p.kind, predicted.settings.logFloor);
    const double floorC = floorDb(computed.log, computed.kind, computedSettings.logFloor);
    const double floor = std::max(floorP, floorC);
    const int B = p.bins;
    Spectrogram& d = out.difference;
    d.frames = last - first + 1;
    d.bins = B;
    d.sampleRate = p.sampleRate;
    d.hopSeconds = p.hopSeconds;
    d.binCentresHz = p.binCentresHz;
    d.kind = p.kind;
    d.log = LogScale::Decibel;
    d.values.assign(static_cast<std::size_t>(d.frames) * B, 0.0f);
    if (first > 0 || !p.timesSeconds.empty())
        for (int i = first; i <= last; ++i) d.timesSeconds.push_back(p.frameTime(i));
    out.firstFrame = first;
    out.frameMeanAbsDb.assign(static_cast<std::size_t>(d.frames), 0.0f);
    out.bandMeanAbsDb.assign(static_cast<std::size_t>(B), 0.0f);
    std::vector<double> bandSum(static_cast<std::size_t>(B), 0.0);
    double sum = 0.0, absSum = 0.0, sqSum = 0.0;
    long long cells = 0;
    for (int i = first; i <= last; ++i) {
        // A predicted frame without a match inside the range (hops differ) takes its neighbour's.
        int j = match[i];
        for (int k = i; j < 0 && k >= first; --k) j = match[k];
        double frameAbs = 0.0;
        for (int b = 0; b < B; ++b) {
            const double vp = std::max(floor, toDb(p.at(i, b), p.log, p.kind));
            const double vc = std::max(floor, toDb(computed.at(j, b), computed.log, computed.kind));
            const double diff = vp - vc;
            d.values[static_cast<std::size_t>(i - first) * B + b] = static_cast<float>(diff);
            sum += diff;
            absSum += std::abs(diff);
            sqSum += diff * diff;
            frameAbs += std::abs(diff);
            bandSum[b] += std::abs(diff);
            if (std::abs(diff) > out.maxAbsDb) out.maxAbsDb = std::abs(diff), out.maxFrame = i, out.maxBand = b;
            ++cells;
        }
        out.frameMeanAbsDb[i - first] = static_cast<float>(frameAbs / B);
    }
    out.comparedFrames = d.frames;
    for (int b = 0; b < B; ++b) out.bandMeanAbsDb[b] = static_cast<float>(bandSum[b] / d.frames);
    out.meanDb = sum / static_cast<double>(cells);
    out.meanAbsDb = absSum / static_cast<double>(cells);
    out.rmsDb = std::sqrt(sqSum / static_cast<double>(cells));
    out.regions = findRegions(out, params);
    return out;
}

MelDifference diffPredictedMel(const PredictedMel& predicted, const Signal& audio, const MelDifferenceParams& params,
                               Progress progress) {
    params.validate();
    if (!(audio.sampleRate > 0)) throw ParamError("Signal.sampleRate", "must be positive");
    if (audio.empty()) throw InputError("audio", "is empty");
    const MelSettings& s = predicted.settings;
    std::vector<std::string> rateWarnings;
    if (audio.sampleRate / 2 < s.fmaxHz - 1e-6)
        rateWarnings.push_back(detail::formatted("the audio (%.0f Hz) holds nothing above ", audio.sampleRate) +
                               detail::formatted("%.0f Hz", audio.sampleRate / 2) +
                               detail::formatted(" but the mel reaches %.0f Hz", s.fmaxHz) +
                               ": the top bands differ by construction");
    const bool sameRate = std::abs(audio.sampleRate - s.sampleRateHz) < 1e-6;
    const Progress melProgress = progress.sub(0.0, 0.9);
    const Spectrogram computed = sameRate ? computeMelSpectrogram(audio, s.melParams(), melProgress)
                                          : computeMelSpectrogram(resample(audio, s.sampleRateHz), s.melParams(),
                                                                  melProgress);
    MelDifference out = compareMels(predicted, computed, s, params);
    out.warnings.insert(out.warnings.end(), rateWarnings.begin(), rateWarnings.end());
    progress.report(1.0);
    return out;
}

}  // namespace earmark
