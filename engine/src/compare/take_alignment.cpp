#include "earmark/compare/take_alignment.hpp"

#include "earmark/align/dtw.hpp"
#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {
namespace {

// Frames [first, last] of `f`, copied.
FeatureMatrix rows(const FeatureMatrix& f, int first, int last) {
    FeatureMatrix out;
    out.frames = last - first + 1;
    out.dims = f.dims;
    out.hopSeconds = f.hopSeconds;
    out.values.assign(f.row(first), f.row(first) + static_cast<std::size_t>(out.frames) * f.dims);
    return out;
}

struct FrameRange {
    int first = 0, last = -1;  // inclusive
    int count() const { return last - first + 1; }
};

// Frames centred in [startS, endS), or the one nearest the middle.
FrameRange framesOf(double startS, double endS, double hop, int frames) {
    FrameRange r;
    r.first = static_cast<int>(std::ceil(startS / hop - 1e-9));
    r.last = static_cast<int>(std::ceil(endS / hop - 1e-9)) - 1;
    r.first = std::clamp(r.first, 0, frames - 1);
    r.last = std::clamp(r.last, 0, frames - 1);
    if (r.last < r.first)
        r.first = r.last = std::clamp(static_cast<int>(std::lround(0.5 * (startS + endS) / hop)), 0, frames - 1);
    return r;
}

void checkPair(const FeatureMatrix& a, const FeatureMatrix& b) {
    if (a.dims != b.dims) throw ParamError("alignTakes.b", "the two takes' features have different sizes");
    if (!(a.hopSeconds > 0) || std::abs(a.hopSeconds - b.hopSeconds) > 1e-9)
        throw ParamError("alignTakes.b", "the two takes' features need the same positive hop");
    if (a.frames < 1) throw InputError("A", "has no frames to align");
    if (b.frames < 1) throw InputError("B", "has no frames to align");
}

// Anchored DTW of one segment of each take, appended to `out`.
void alignSegment(const FeatureMatrix& a, const FeatureMatrix& b, FrameRange ra, FrameRange rb,
                  const TakeAlignParams& params, TakeAlignment& out) {
    const int na = ra.count(), nb = rb.count();
    if (na == 1 || nb == 1) {  // one frame on either side: everything pairs with it
        for (int i = 0; i < na; ++i)
            for (int j = 0; j < nb; ++j)
                if (na == 1 || j == 0) out.pairs.push_back({ra.first + i, rb.first + j});
        return;
    }
    const double hop = a.hopSeconds;
    const double radiusS = std::clamp(params.bandRadiusFraction * std::max(na, nb) * hop, params.minBandRadiusSeconds,
                                      params.maxBandRadiusSeconds);
    const DtwBand band = lineBand(na, nb, 0.0, 0.0, na - 1.0, nb - 1.0, static_cast<int>(std::ceil(radiusS / hop)));
    const DtwResult r = dtwAlign(rows(a, ra.first, ra.last), rows(b, rb.first, rb.last), band);
    out.dtwCells = std::max(out.dtwCells, r.cells);
    for (const DtwPathPoint& p : r.path) out.pairs.push_back({ra.first + p.take, rb.first + p.ref});
}

}  // namespace

void TakeAlignParams::validate() const {
    if (!(bandRadiusFraction >= 0)) throw ParamError("TakeAlignParams.bandRadiusFraction", "must be >= 0");
    if (!(minBandRadiusSeconds > 0)) throw ParamError("TakeAlignParams.minBandRadiusSeconds", "must be positive");
    if (!(maxBandRadiusSeconds >= minBandRadiusSeconds))
        throw ParamError("TakeAlignParams.maxBandRadiusSeconds", "must be at least minBandRadiusSeconds");
    if (!(spanMarginSeconds >= 0)) throw ParamError("TakeAlignParams.spanMarginSeconds", "must be >= 0");
}

TakeAlignment alignFrameWise(const FeatureMatrix& a, const FeatureMatrix& b, double aStartS, double aEndS,
                             double bStartS, double bEndS, const TakeAlignParams& params, Progress progress) {
    params.validate();
    checkPair(a, b);
    const double hop = a.hopSeconds;
    TakeAlignment out;
    out.method = AlignmentMethod::FrameWise;
    out.hopSeconds = hop;
    // The span's last frame is the one centred at its end, so a span ending
    // on a frame centre keeps that frame.
    const double m = params.spanMarginSeconds;
    const FrameRange ra = framesOf(aStartS - m, aEndS + m + hop, hop, a.frames);
    const FrameRange rb = framesOf(bStartS - m, bEndS + m + hop, hop, b.frames);
    alignSegment(a, b, ra, rb, params, out);
    progress.report(1.0);
    return out;
}

TakeAlignment alignWordByWord(const FeatureMatrix& a, const FeatureMatrix& b, const Tier& wordsA, const Tier& wordsB,
                              const TakeAlignParams& params, Progress progress) {
    params.validate();
    checkPair(a, b);
    const auto& wa = wordsA.intervals;
    const auto& wb = wordsB.intervals;
    if (wa.empty() || wb.empty()) throw InputError(wa.empty() ? "wordsA" : "wordsB", "has no words");
    if (wa.size() != wb.size())
        throw InputError("wordsB",
                         "has " + std::to_string(wb.size()) + " words, take A has " + std::to_string(wa.size()));
    const double hop = a.hopSeconds;
    TakeAlignment out;
    out.method = AlignmentMethod::WordByWord;
    out.hopSeconds = hop;
    int lastA = 0, lastB = 0;  // a segment never starts before the previous one's last frame
    const auto clampAfter = [](FrameRange r, int last) {
        r.first = std::max(r.first, last);
        r.last = std::max(r.last, r.first);
        return r;
    };
    for (std::size_t i = 0; i < wa.size(); ++i) {
        if ((i & 15) == 0) progress.report(static_cast<double>(i) / static_cast<double>(wa.size()));
        if (i > 0) {
            // The pause between two words, when both takes have one of at least a frame.
            const double ga0 = wa[i - 1].endS, ga1 = wa[i].startS, gb0 = wb[i - 1].endS, gb1 = wb[i].startS;
            const FrameRange pa{static_cast<int>(std::ceil(ga0 / hop - 1e-9)),
                                static_cast<int>(std::ceil(ga1 / hop - 1e-9)) - 1};
            const FrameRange pb{static_cast<int>(std::ceil(gb0 / hop - 1e-9)),
                                static_cast<int>(std::ceil(gb1 / hop - 1e-9)) - 1};
            if (pa.count() > 0 && pb.count() > 0 && pa.first > lastA && pb.first > lastB && pa.last < a.frames &&
                pb.last < b.frames) {
                alignSegment(a, b, pa, pb, params, out);
                lastA = pa.last, lastB = pb.last;
            }
        }
        const FrameRange ra = clampAfter(framesOf(wa[i].startS, wa[i].endS, hop, a.frames), lastA);
        const FrameRange rb = clampAfter(framesOf(wb[i].startS, wb[i].endS, hop, b.frames), lastB);
        if (ra.last >= a.frames || rb.last >= b.frames)
            throw InputError(ra.last >= a.frames ? "wordsA" : "wordsB",
                             "word " + std::to_string(i + 1) + " lies past the end of the take's frames");
        alignSegment(a, b, ra, rb, params, out);
        lastA = ra.last, lastB = rb.last;
    }
    progress.report(1.0);
    return out;
}

double mapTime(const TakeAlignment& alignment, double time, bool fromB) {
    const auto& pairs = alignment.pairs;
    if (pairs.empty()) throw ParamError("TakeAlignment.pairs", "there are no aligned frames");
    const double hop = alignment.hopSeconds;
    const auto from = [&](const FramePair& p) { return fromB ? p.b : p.a; };
    const auto to = [&](const FramePair& p) { return fromB ? p.a : p.b; };
    // Mean matched frame of each source frame on the path (the path is sorted in both).
    std::vector<std::pair<int, double>> knots;
    for (std::size_t k = 0; k < pairs.size();) {
        const int f = from(pairs[k]);
        double sum = 0.0;
        int n = 0;
        for (; k < pairs.size() && from(pairs[k]) == f; ++k) sum += to(pairs[k]), ++n;
        knots.emplace_back(f, sum / n);
    }
    const double u = time / hop;
    if (u <= knots.front().first) return (knots.front().second + (u - knots.front().first)) * hop;
    if (u >= knots.back().first) return (knots.back().second + (u - knots.back().first)) * hop;
    const auto hi = std::upper_bound(knots.begin(), knots.end(), u,
                                     [](double v, const std::pair<int, double>& k) { return v < k.first; });
    const auto lo = hi - 1;
    const double w = (u - lo->first) / (hi->first - lo->first);
    return (lo->second + w * (hi->second - lo->second)) * hop;
}

Tier carryTier(const Tier& tier, const TakeAlignment& alignment, double otherDurationS, bool fromB) {
    Tier out{tier.name, {}};
    const double hop = alignment.hopSeconds;
    double prevEnd = 0.0;
    for (const Interval& iv : tier.intervals) {
        const double s = std::clamp(mapTime(alignment, iv.startS, fromB), prevEnd, otherDurationS);
        const double e = std::min(std::max(mapTime(alignment, iv.endS, fromB), s + hop), otherDurationS);
        if (!(e > s)) continue;  // no room left at the end of the other take
        out.intervals.push_back(Interval{s, e, iv.label, iv.confidence});
        prevEnd = e;
    }
    return out;
}

}  // namespace earmark
