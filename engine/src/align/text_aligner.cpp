#include "earmark/align/text_aligner.hpp"

#include "earmark/align/dtw.hpp"
#include "earmark/align/reference_tiers.hpp"
#include "earmark/align/script_check.hpp"
#include "earmark/align/speech_span.hpp"
#include "earmark/core/error.hpp"
#include "earmark/level/energy.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <map>

namespace earmark {
namespace {

// Mean of each block of `factor` frames (the last block may be shorter).
FeatureMatrix coarsen(const FeatureMatrix& f, int factor) {
    FeatureMatrix out;
    out.dims = f.dims;
    out.frames = (f.frames + factor - 1) / factor;
    out.hopSeconds = f.hopSeconds * factor;
    out.values.assign(static_cast<std::size_t>(out.frames) * out.dims, 0.0f);
    for (int c = 0; c < out.frames; ++c) {
        const int first = c * factor, last = std::min(f.frames, first + factor);
        float* dst = out.row(c);
        for (int i = first; i < last; ++i)
            for (int k = 0; k < f.dims; ++k) dst[k] += f.row(i)[k];
        for (int k = 0; k < f.dims; ++k) dst[k] /= static_cast<float>(last - first);
    }
    return out;
}

// Which take frames the path matched with each reference frame.
struct FrameMap {
    std::vector<int> first, last;  // per reference frame
};

FrameMap frameMap(const std::vector<DtwPathPoint>& path, int refFrames) {
    FrameMap m{std::vector<int>(refFrames, -1), std::vector<int>(refFrames, -1)};
    for (const DtwPathPoint& p : path) {
        if (p.skipped) continue;  // left out: a pause the reference lacks
        if (m.first[p.ref] < 0) m.first[p.ref] = p.take;
        m.last[p.ref] = p.take;
    }
    return m;
}

// Take frames may be left out (at the ends, and inside for a pause the
// reading lacks); leaving one out costs its distance from the take's own
// background (the mean of its quietest tenth of frames, by c0):
// leading and trailing silence or noise is dropped almost for free, while
// dropping speech costs as much as matching it with the wrong sound, so the
// path never saves by leaving speech out. (Measured against the reference's
// silence instead, white noise in a take would rather match the reference's
// breathy sounds — an aspirated /t/ — than be left out.)
DtwOptions skipBackground(const FeatureMatrix& take) {
    DtwOptions o;
    o.ends = DtwEnds::FreeTakeEnds;
    o.skipInside = true;
    o.skipCost.resize(static_cast<std::size_t>(take.frames));
    std::vector<std::pair<float, int>> byEnergy;
    for (int i = 0; i < take.frames; ++i) byEnergy.emplace_back(take.row(i)[0], i);
    const auto quiet = std::max<std::size_t>(1, byEnergy.size() / 10);
    std::nth_element(byEnergy.begin(), byEnergy.begin() + static_cast<std::ptrdiff_t>(quiet - 1), byEnergy.end());
    std::vector<double> background(static_cast<std::size_t>(take.dims), 0.0);
    for (std::size_t k = 0; k < quiet; ++k)
        for (int d = 0; d < take.dims; ++d) background[d] += take.row(byEnergy[k].second)[d];
    for (double& b : background) b /= static_cast<double>(quiet);
    for (int i = 0; i < take.frames; ++i) {
        double acc = 0.0;
        for (int d = 0; d < take.dims; ++d) {
            const double diff = take.row(i)[d] - background[d];
            acc += diff * diff;
        }
        o.skipCost[i] = static_cast<float>(std::sqrt(acc));
    }
    return o;
}

std::string secondsText(double s) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.1f s", s);
    return buf;
}

// Deterministic pseudo-random numbers for sampling frame pairs (LCG of
// Numerical Recipes, from memory); only needs to be repeatable.
struct Lcg {
    std::uint32_t state;
    std::uint32_t next() { return state = state * 1664525u + 1013904223u; }
};

double chanceDistance(const FeatureMatrix& a, int aFirst, int aLast, const FeatureMatrix& b, int bFirst, int bLast) {
    Lcg rng{12345u};
    const int na = std::max(1, aLast - aFirst + 1), nb = std::max(1, bLast - bFirst + 1);
    double sum = 0.0;
    constexpr int kPairs = 4096;
    for (int n = 0; n < kPairs; ++n) {
        const int i = std::clamp(aFirst + static_cast<int>(rng.next() % na), 0, a.frames - 1);
        const int j = std::clamp(bFirst + static_cast<int>(rng.next() % nb), 0, b.frames - 1);
        double acc = 0.0;
        for (int k = 0; k < a.dims; ++k) {
            const double d = a.row(i)[k] - b.row(j)[k];
            acc += d * d;
        }
        sum += std::sqrt(acc);
    }
    return sum / kPairs;
}

// How far to look for a sounding reference frame next to a boundary that
// borders silence (common practice: longer than a stop's closure).
constexpr double kSoundingLookSeconds = 0.15;

// Reference frames (centred at i·hop) with energy within 40 dB of the
// reading's level: the reference is clean, so anything quieter is silence
// or a closure (common practice).
std::vector<bool> soundingFrames(const Signal& reference, double hop, int frames) {
    EnergyParams ep;
    ep.hopSeconds = hop;
    ep.windowSeconds = hop;
    const EnergyTrack e = analyseEnergy(reference, ep);
    std::vector<float> sorted = e.db;
    std::sort(sorted.begin(), sorted.end());
    const float level = sorted.empty() ? 0.0f : sorted[static_cast<std::size_t>(0.99 * (sorted.size() - 1))];
    std::vector<bool> out(static_cast<std::size_t>(frames), false);
    for (int i = 0; i < frames; ++i) {
        const auto k = static_cast<std::size_t>(std::lround(i * hop / e.hopSeconds));
        out[i] = k < e.db.size() && e.db[k] > level - 40.0f;
    }
    return out;
}

double roundMs(double s) { return std::round(s * 1000.0) / 1000.0; }

bool hasSpeakableCharacter(const std::string& text) {
    for (unsigned char c : text)
        if (c >= 0x80 || std::isalnum(c)) return true;
    return false;
}

}  // namespace

void AlignParams::validate() const {
    speech.validate();
    features.validate();
    refinement.validate();
    if (coarseFactor < 1) throw ParamError("AlignParams.coarseFactor", "must be at least 1");
    if (!(bandRadiusSeconds > 0)) throw ParamError("AlignParams.bandRadiusSeconds", "must be positive");
    if (!(bandRadiusFraction >= 0)) throw ParamError("AlignParams.bandRadiusFraction", "must be >= 0");
    if (!(maxBandRadiusSeconds >= bandRadiusSeconds))
        throw ParamError("AlignParams.maxBandRadiusSeconds", "must be at least bandRadiusSeconds");
    if (!(corridorSeconds > 0)) throw ParamError("AlignParams.corridorSeconds", "must be positive");
    if (!(referencePadSeconds >= 0)) throw ParamError("AlignParams.referencePadSeconds", "must be >= 0");
    if (!(minPauseSeconds > 0)) throw ParamError("AlignParams.minPauseSeconds", "must be positive");
    if (!(maxLengthRatio > 1)) throw ParamError("AlignParams.maxLengthRatio", "must be above 1");
    if (!(goodDistanceRatio >= 0) || !(badDistanceRatio > goodDistanceRatio))
        throw ParamError("AlignParams.badDistanceRatio", "needs 0 <= goodDistanceRatio < badDistanceRatio");
    if (!(minWordSeconds > 0)) throw ParamError("AlignParams.minWordSeconds", "must be positive");
    if (!(minPhoneSeconds > 0) || minPhoneSeconds > minWordSeconds)
        throw ParamError("AlignParams.minPhoneSeconds", "must be positive and at most minWordSeconds");
}

AlignResult alignText(const Signal& take, const std::string& text, const AlignParams& params, Progress progress) {
    params.validate();
    if (!(take.sampleRate > 0)) throw ParamError("Signal.sampleRate", "must be positive");
    if (take.empty()) throw InputError("audio", "is empty");
    if (!hasSpeakableCharacter(text)) throw InputError("text", "is empty: there are no words to align");

    // 1. Reference reading and its tiers.
    const RenderedSpeech speech = renderSpeech(text, params.speech);
    checkTextScript(text, speech.language, params.speech.voice);
    const ReferenceTiers ref = referenceTiers(text, speech);
    if (ref.words.intervals.empty()) throw InputError("text", "has no words the voice would speak");
    progress.report(0.05);

    const SpeechSpan span = findSpeechSpan(take);
    if (!span.found) throw InputError("audio", "holds no speech (silence or steady noise)");
    const double refFirst = ref.words.intervals.front().startS, refLast = ref.words.intervals.back().endS;
    const double refSpeech = refLast - refFirst;
    const double takeSpeech = std::max(span.endS - span.startS, 0.05);
    if (refSpeech > params.maxLengthRatio * takeSpeech || takeSpeech > params.maxLengthRatio * refSpeech)
        throw InputError("text", "does not match the audio: read by '" + params.speech.voice + "' it lasts about " +
                                     secondsText(refSpeech) + ", but the audio holds " + secondsText(takeSpeech) +
                                     " of speech");

    // 2. Features; the reference gets silent margins like a take's.
    Signal padded;
    padded.sampleRate = speech.audio.sampleRate;
    const auto pad = static_cast<std::size_t>(std::lround(params.referencePadSeconds * padded.sampleRate));
    padded.samples.assign(pad, 0.0f);
    padded.samples.insert(padded.samples.end(), speech.audio.samples.begin(), speech.audio.samples.end());
    padded.samples.resize(padded.samples.size() + pad, 0.0f);
    const double padS = static_cast<double>(pad) / padded.sampleRate;
    const MfccPair features = computeMatchedMfcc(take, padded, params.features, progress.sub(0.05, 0.4));
    const FeatureMatrix& takeF = features.take;
    const FeatureMatrix& refF = features.reference;
    const double hop = takeF.hopSeconds;
    if (takeF.frames < 2 || refF.frames < 2) throw InputError("audio", "is too short to align");

    // 3. Coarse pass in a band around the line joining the speech spans, then full rate in a corridor.
    const int factor = params.coarseFactor;
    const FeatureMatrix takeC = coarsen(takeF, factor), refC = coarsen(refF, factor);
    const double hopC = takeC.hopSeconds;
    const double radiusS = std::min(params.maxBandRadiusSeconds,
                                    std::max(params.bandRadiusSeconds,
                                             params.bandRadiusFraction * std::max(refSpeech, takeSpeech)));
    const DtwBand coarseBand =
        lineBand(takeC.frames, refC.frames, span.startS / hopC, (padS + refFirst) / hopC,
                 std::max(span.endS, span.startS + hopC) / hopC, (padS + refLast) / hopC,
                 static_cast<int>(std::ceil(radiusS / hopC)));
    const DtwResult coarse = dtwAlign(takeC, refC, coarseBand, skipBackground(takeC), progress.sub(0.4, 0.5));
    const DtwBand fineBand = corridorBand(coarse.path, factor, takeF.frames, refF.frames,
                                          static_cast<int>(std::ceil(params.corridorSeconds / hop)));
    const DtwResult fine = dtwAlign(takeF, refF, fineBand, skipBackground(takeF), progress.sub(0.5, 0.9));
    const FrameMap map = frameMap(fine.path, refF.frames);

    // 4. Carry every reference boundary (word and phone) through the path.
    // A boundary where something starts goes to the first take frame matched
    // with the first reference frame after it; where something ends, to the
    // last take frame matched with the last reference frame before it. Next
    // to silence the path may match any silent reference frame with the
    // take's silence (a stop's closure looks like a pause), so such
    // boundaries are carried from the nearest sounding reference frame and
    // keep the reference's distance to it.
    const std::vector<bool> sounding = soundingFrames(padded, hop, refF.frames);
    const int lookFrames = static_cast<int>(std::ceil(kSoundingLookSeconds / hop));
    const auto frameOf = [&](double refS) { return (refS + padS) / hop; };
    // The sounding test starts at the first frame wholly on the boundary's
    // side (frame j's energy window spans j ± 0.5 frames).
    const auto carryStart = [&](double refS, bool toSound) {
        const double u = frameOf(refS);
        const int j0 = std::clamp(static_cast<int>(std::ceil(u)), 0, refF.frames - 1);
        int j = toSound ? std::clamp(static_cast<int>(std::ceil(u + 0.5)), 0, refF.frames - 1) : j0;
        if (toSound)
            while (j < refF.frames - 1 && j - j0 < lookFrames && !sounding[j]) ++j;
        if (toSound && !sounding[j]) j = j0;
        return (map.first[j] - (j - u)) * hop;
    };
    const auto carryEnd = [&](double refS, bool toSound) {
        const double u = frameOf(refS);
        const int j1 = std::clamp(static_cast<int>(std::ceil(u)) - 1, 0, refF.frames - 1);
        int j = toSound ? std::clamp(static_cast<int>(std::floor(u - 0.5)), 0, refF.frames - 1) : j1;
        if (toSound)
            while (j > 0 && j1 - j < lookFrames && !sounding[j]) --j;
        if (toSound && !sounding[j]) j = j1;
        return (map.last[j] + (u - j)) * hop;
    };
    struct BoundaryUse {
        bool starts = false, ends = false, word = false;
    };
    std::map<double, BoundaryUse> uses;  // reference time → how it is used
    for (const Interval& p : ref.phones.intervals) uses[p.startS].starts = true, uses[p.endS].ends = true;
    for (const Interval& w : ref.words.intervals) uses[w.startS].word = true, uses[w.endS].word = true;
    struct Carried {
        double end = 0.0, start = 0.0;  // take time for what ends / starts here (equal unless the take pauses here)
    };
    std::map<double, Carried> carried;
    std::vector<BoundaryToRefine> toRefine;
    std::vector<std::pair<double, bool>> refinedSlot;  // (reference time, is the start side)
    const auto addRefine = [&](double refS, double t, BoundaryKind kind, bool startSide) {
        if (!params.refine) return;
        toRefine.push_back({t, refS + padS, kind});
        refinedSlot.emplace_back(refS, startSide);
    };
    for (const auto& [refS, use] : uses) {
        Carried c;
        if (use.starts && use.ends) {
            const double end = carryEnd(refS, true), start = carryStart(refS, true);
            if (start - end > params.minPauseSeconds) {
                // The take pauses where the reading does not: keep the pause as a gap.
                c = {end, start};
                if (use.word) addRefine(refS, end, BoundaryKind::Offset, false), addRefine(refS, start, BoundaryKind::Onset, true);
            } else {
                const double t = 0.5 * (carryStart(refS, false) + carryEnd(refS, false));
                c = {t, t};
                if (use.word) addRefine(refS, t, BoundaryKind::Join, true);
            }
        } else if (use.starts) {
            const double t = carryStart(refS, true);
            c = {t, t};
            if (use.word) addRefine(refS, t, BoundaryKind::Onset, true);
        } else {
            const double t = carryEnd(refS, true);
            c = {t, t};
            if (use.word) addRefine(refS, t, BoundaryKind::Offset, false);
        }
        carried[refS] = c;
    }
    // 5. Word boundaries onto the take's own landmarks.
    if (!toRefine.empty()) {
        const std::vector<double> refined = refineBoundaries(take, padded, toRefine, params.refinement);
        for (std::size_t k = 0; k < toRefine.size(); ++k) {
            Carried& c = carried[refinedSlot[k].first];
            if (toRefine[k].kind == BoundaryKind::Join) c = {refined[k], refined[k]};
            else if (refinedSlot[k].second) c.start = refined[k];
            else c.end = refined[k];
        }
    }
    progress.report(0.95);

    // 6. Confidence from the local path distances of each word's frames.
    const int takeSpanFirst = static_cast<int>(span.startS / hop), takeSpanLast = static_cast<int>(span.endS / hop);
    const double chance = chanceDistance(takeF, takeSpanFirst, takeSpanLast, refF,
                                         static_cast<int>((padS + refFirst) / hop), static_cast<int>((padS + refLast) / hop));
    std::vector<double> distSum(refF.frames, 0.0);
    std::vector<int> distCount(refF.frames, 0);
    for (const DtwPathPoint& p : fine.path)
        if (!p.skipped) distSum[p.ref] += p.distance, ++distCount[p.ref];

    AlignResult result;
    result.tiers.durationS = take.durationSeconds();
    result.referenceSeconds = refSpeech;
    result.speechStartS = span.startS;
    result.speechEndS = span.endS;
    result.dtwCells = std::max(coarse.cells, fine.cells);
    result.voiceName = speech.voiceName;
    const double duration = take.durationSeconds();

    result.tiers.tiers = {Tier{std::string(kWordsTier), {}}, Tier{std::string(kPhonesTier), {}}};
    Tier& words = result.tiers.tiers[0];
    Tier& phones = result.tiers.tiers[1];
    double prevEnd = 0.0, confSum = 0.0;
    std::size_t phoneIndex = 0;
    for (std::size_t w = 0; w < ref.words.intervals.size(); ++w) {
        const Interval& rw = ref.words.intervals[w];
        // Later words must still fit: keep room for minWordSeconds each.
        const double room = static_cast<double>(ref.words.intervals.size() - w) * params.minWordSeconds;
        double s = std::clamp(carried[rw.startS].start, prevEnd, std::max(prevEnd, duration - room));
        double e = std::clamp(carried[rw.endS].end, s + params.minWordSeconds, std::max(s + params.minWordSeconds, duration - room + params.minWordSeconds));
        s = roundMs(s);
        e = std::max(roundMs(e), s + 0.001);
        const int j0 = std::clamp(static_cast<int>(std::ceil((rw.startS + padS) / hop)), 0, refF.frames - 1);
        const int j1 = std::clamp(static_cast<int>(std::ceil((rw.endS + padS) / hop)) - 1, j0, refF.frames - 1);
        double sum = 0.0;
        int count = 0;
        for (int j = j0; j <= j1; ++j) sum += distSum[j], count += distCount[j];
        const double ratio = count > 0 && chance > 0 ? sum / count / chance : 1.0;
        const double conf = std::clamp((params.badDistanceRatio - ratio) /
                                           (params.badDistanceRatio - params.goodDistanceRatio), 0.0, 1.0);
        words.intervals.push_back(Interval{s, e, rw.label, std::round(conf * 1000.0) / 1000.0});
        confSum += conf;
        prevEnd = e;

        // Phones of this word, kept inside it, in order, each at least minPhoneSeconds.
        std::vector<Interval> ph;
        for (; phoneIndex < ref.phones.intervals.size() && ref.phoneWord[phoneIndex] == w; ++phoneIndex) {
            const Interval& rp = ref.phones.intervals[phoneIndex];
            ph.push_back(Interval{carried[rp.startS].start, carried[rp.endS].end, rp.label, std::nullopt});
        }
        if (ph.empty()) continue;
        const double minPhone = params.minPhoneSeconds;
        if ((e - s) < minPhone * static_cast<double>(ph.size())) {
            const double step = (e - s) / static_cast<double>(ph.size());
            for (std::size_t k = 0; k < ph.size(); ++k) ph[k].startS = s + k * step, ph[k].endS = s + (k + 1) * step;
        } else {
            ph.front().startS = s;
            ph.back().endS = e;
            for (std::size_t k = 0; k < ph.size(); ++k) {  // forward: order and least length
                const double before = k == 0 ? s : ph[k - 1].endS;
                const double after = e - minPhone * static_cast<double>(ph.size() - 1 - k);
                ph[k].startS = std::clamp(ph[k].startS, before, after - minPhone);
                ph[k].endS = std::clamp(ph[k].endS, ph[k].startS + minPhone, after);
            }
            ph.back().endS = e;
            for (std::size_t k = 0; k + 1 < ph.size(); ++k) ph[k + 1].startS = std::max(ph[k + 1].startS, ph[k].endS);
        }
        for (Interval& p : ph) {
            p.startS = roundMs(p.startS);
            p.endS = roundMs(p.endS);
            if (!phones.intervals.empty()) p.startS = std::max(p.startS, phones.intervals.back().endS);
            if (p.endS > p.startS) phones.intervals.push_back(std::move(p));
        }
    }
    result.meanConfidence = confSum / static_cast<double>(words.intervals.size());
    progress.report(1.0);
    return result;
}

}  // namespace earmark
