#include "earmark/widgets/take_pair.hpp"

#include "earmark/core/error.hpp"
#include "earmark/tiers/timings_file.hpp"
#include "earmark/widgets/take_loader.hpp"

#include <algorithm>
#include <cmath>

namespace earmark::widgets {

namespace {

std::optional<Tier> wordsOf(const QString& path, double durationS) {
    if (path.isEmpty()) return std::nullopt;
    TimingsReadOptions read;
    read.takeDurationS = durationS;
    const LoadedTimings loaded = loadTimings(path.toStdString(), read);
    const Tier* words = loaded.tiers.find(kWordsTier);
    if (!words) throw InputError(path.toStdString(), "has no 'words' tier");
    return *words;
}

}  // namespace

TakePairPtr loadTakePair(const TakePairRequest& request, Progress progress) {
    auto out = std::make_shared<TakePair>();
    out->request = request;
    out->a = loadTake(request.pathA, progress.sub(0.0, 0.05));
    out->b = loadTake(request.pathB, progress.sub(0.05, 0.1));
    out->tracksA = analyseTake(*out->a, {}, progress.sub(0.1, 0.3));
    out->tracksB = analyseTake(*out->b, {}, progress.sub(0.3, 0.5));
    const TakeInput a{out->a->signal, wordsOf(request.wordsA, out->a->duration())};
    const TakeInput b{out->b->signal, wordsOf(request.wordsB, out->b->duration())};
    out->comparison = compareTakes(a, b, request.text.toStdString(), {}, progress.sub(0.5, 1.0));
    return out;
}

PairSide otherSide(PairSide side) { return side == PairSide::A ? PairSide::B : PairSide::A; }

double mapToOtherSide(const TakeComparison& c, PairSide from, double seconds) {
    const double t = mapTime(c.alignment, seconds, from == PairSide::B);
    const double length = from == PairSide::A ? c.b.durationS : c.a.durationS;
    return std::clamp(t, 0.0, length);
}

std::vector<ContourPoint> relativeContour(const TakeComparison& c, PairSide side, bool warpToA) {
    const TakeSide& s = side == PairSide::A ? c.a : c.b;
    std::vector<ContourPoint> out;
    if (!s.pitchSummary.medianHz || !(*s.pitchSummary.medianHz > 0)) return out;
    for (std::size_t i = 0; i < s.pitch.size(); ++i) {
        if (!s.pitch.voiced(i)) continue;
        double t = s.pitch.timeSeconds(i);
        if (warpToA && side == PairSide::B) t = mapToOtherSide(c, PairSide::B, t);
        out.push_back({t, 12.0 * std::log2(s.pitch.f0Hz[i] / *s.pitchSummary.medianHz)});
    }
    return out;
}

}  // namespace earmark::widgets
