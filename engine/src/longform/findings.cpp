#include "earmark/longform/findings.hpp"

#include "earmark/core/format.hpp"
#include "earmark/longform/timbre.hpp"

#include "../prosody/track_stats.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace earmark {
namespace {

std::string fmt(const char* format, double a, double b = 0, double c = 0) {
    char buf[200];
    std::snprintf(buf, sizeof buf, format, a, b, c);
    return buf;
}

Finding make(FindingKind kind, const char* measure, const char* unit, double startS, double endS, double value,
             double threshold, std::string reason) {
    return {kind, measure, unit, startS, endS, value, threshold, std::move(reason)};
}

// Keeps, among flagged joins closer than `spacing`, the one with the largest |value|.
std::vector<const JoinMeasures*> strongest(const std::vector<const JoinMeasures*>& flagged,
                                          double JoinMeasures::*field, double spacing) {
    std::vector<const JoinMeasures*> kept;
    for (const JoinMeasures* j : flagged) {
        bool beaten = false;
        for (const JoinMeasures* o : flagged)
            if (o != j && std::fabs(o->timeS - j->timeS) < spacing &&
                (std::fabs(o->*field) > std::fabs(j->*field) ||
                 (std::fabs(o->*field) == std::fabs(j->*field) && o->timeS < j->timeS)))
                beaten = true;
        if (!beaten) kept.push_back(j);
    }
    return kept;
}

struct Hinge {
    double t0 = 0.0;
    double base = 0.0;    // level up to t0
    double change = 0.0;  // over [t0, last centre]
};

// Least-squares hinge (broken-stick regression): y = a + b·max(0, x − t0).
// The knee is searched over the window centres, then between the neighbours
// of the best one on a grid of kKneeStepSeconds, so it is placed finer than
// the window hop (the windows' means smooth a hinge symmetrically about its knee).
constexpr double kKneeStepSeconds = 0.1;

Hinge fitHinge(const std::vector<double>& x, const std::vector<double>& y, double minSpan) {
    const double last = x.back();
    const auto fitAt = [&](double t0, Hinge& out) -> double {
        double mh = 0, my = 0;
        for (std::size_t i = 0; i < x.size(); ++i) {
            mh += std::max(0.0, x[i] - t0);
            my += y[i];
        }
        mh /= static_cast<double>(x.size());
        my /= static_cast<double>(x.size());
        double shy = 0, shh = 0;
        for (std::size_t i = 0; i < x.size(); ++i) {
            const double h = std::max(0.0, x[i] - t0) - mh;
            shy += h * (y[i] - my);
            shh += h * h;
        }
        if (!(shh > 0)) return INFINITY;
        const double b = shy / shh, a = my - b * mh;
        double sse = 0;
        for (std::size_t i = 0; i < x.size(); ++i) {
            const double r = y[i] - (a + b * std::max(0.0, x[i] - t0));
            sse += r * r;
        }
        out = {t0, a, b * (last - t0)};
        return sse;
    };
    Hinge best;
    double bestSse = INFINITY;
    std::size_t bestIndex = 0;
    for (std::size_t c = 0; c < x.size(); ++c) {
        if (last - x[c] < minSpan && c > 0) break;
        Hinge h;
        if (const double sse = fitAt(x[c], h); sse < bestSse) {
            bestSse = sse;
            best = h;
            bestIndex = c;
        }
    }
    if (!std::isfinite(bestSse)) return best;
    const double from = bestIndex > 0 ? x[bestIndex - 1] : x[bestIndex];
    const double to = std::min(bestIndex + 1 < x.size() ? x[bestIndex + 1] : x[bestIndex], last - minSpan);
    for (double t0 = from; t0 <= to; t0 += kKneeStepSeconds) {
        Hinge h;
        if (const double sse = fitAt(t0, h); sse < bestSse) {
            bestSse = sse;
            best = h;
        }
    }
    return best;
}

std::vector<double> voicedRangeF0(const LongTakeTracks& tr, double a, double b) {
    const std::vector<float> f0 = detail::voicedF0(tr.pitch, a, b);
    if (f0.size() < 10) return {};
    return {12.0 * std::log2(detail::percentile(f0, 95) / detail::percentile(f0, 5))};
}

}  // namespace

const char* findingName(FindingKind kind) {
    switch (kind) {
    case FindingKind::Seam: return "seam";
    case FindingKind::LevelDrift: return "level-drift";
    case FindingKind::PitchDrift: return "pitch-drift";
    case FindingKind::RateDrift: return "rate-drift";
    case FindingKind::TimbreShift: return "timbre-shift";
    case FindingKind::MonotoneStretch: return "monotone-stretch";
    }
    return "seam";
}

std::optional<FindingKind> findingKindFromName(const std::string& name) {
    for (auto k : {FindingKind::Seam, FindingKind::LevelDrift, FindingKind::PitchDrift, FindingKind::RateDrift,
                   FindingKind::TimbreShift, FindingKind::MonotoneStretch})
        if (name == findingName(k)) return k;
    return std::nullopt;
}

std::vector<Finding> findSeams(const std::vector<JoinMeasures>& joins, const LongformRules& rules) {
    std::vector<Finding> out;
    const auto& r = rules.seam;
    if (!r.enabled) return out;
    const auto span = [](const JoinMeasures& j) {
        return j.pauseEndS > j.pauseStartS ? std::pair{j.pauseStartS, j.pauseEndS} : std::pair{j.timeS - 0.05, j.timeS + 0.05};
    };
    std::vector<const JoinMeasures*> level, envelope;
    for (const JoinMeasures& j : joins) {
        if (std::fabs(j.levelStepDb) >= r.levelStepDb) level.push_back(&j);
        if (j.envelopeJump >= r.envelopeJump) envelope.push_back(&j);
        const auto [a, b] = span(j);
        if (std::fabs(j.roomToneStepDb) >= r.roomToneStepDb)
            out.push_back(make(FindingKind::Seam, "room_tone_step_db", "dB", a, b, j.roomToneStepDb, r.roomToneStepDb,
                               fmt("seam: background steps %+.1f dB at %.2f s (|step| >= %.1f dB)", j.roomToneStepDb,
                                   j.timeS, r.roomToneStepDb)));
        if (j.clickDb >= r.clickDb)
            out.push_back(make(FindingKind::Seam, "click_db", "dB", j.clickTimeS - 0.005, j.clickTimeS + 0.005, j.clickDb,
                               r.clickDb, fmt("seam: click %.1f dB above its surroundings at %.3f s (>= %.1f dB)",
                                              j.clickDb, j.clickTimeS, r.clickDb)));
    }
    for (const JoinMeasures* j : strongest(level, &JoinMeasures::levelStepDb, r.contextSeconds)) {
        const auto [a, b] = span(*j);
        out.push_back(make(FindingKind::Seam, "level_step_db", "dB", a, b, j->levelStepDb, r.levelStepDb,
                           fmt("seam: speech level steps %+.1f dB at %.2f s (|step| >= %.1f dB)", j->levelStepDb,
                               j->timeS, r.levelStepDb)));
    }
    for (const JoinMeasures* j : strongest(envelope, &JoinMeasures::envelopeJump, r.contextSeconds)) {
        const auto [a, b] = span(*j);
        out.push_back(make(FindingKind::Seam, "envelope_jump", "ratio", a, b, j->envelopeJump, r.envelopeJump,
                           fmt("seam: spectral envelope jumps %.1fx the median join at %.2f s (>= %.1fx)", j->envelopeJump, j->timeS,
                               r.envelopeJump)));
    }
    return out;
}

std::vector<Finding> findDrifts(const LongTakeSeries& series, const LongformRules& rules,
                                const std::vector<Finding>& excluded) {
    std::vector<Finding> out;
    struct Spec {
        FindingKind kind;
        const LongformRules::Drift* rule;
        const char* measure;
        const char* unit;
        bool relative;  // change in percent of the level at t0
        double (*value)(const WindowMeasures&, double f0Ref);
        const char* words;
    };
    const Spec specs[] = {
        {FindingKind::LevelDrift, &rules.levelDrift, "loudness_change_db", "dB", false,
         [](const WindowMeasures& m, double) { return m.loudnessLufs; }, "loudness"},
        {FindingKind::PitchDrift, &rules.pitchDrift, "f0_median_change_st", "st", false,
         [](const WindowMeasures& m, double ref) { return 12.0 * std::log2(m.f0MedianHz / ref); }, "F0 median"},
        {FindingKind::RateDrift, &rules.rateDrift, "rate_change_percent", "%", true,
         [](const WindowMeasures& m, double) { return m.articulationRate; }, "articulation rate"},
    };
    for (const Spec& s : specs) {
        if (!s.rule->enabled) continue;
        std::vector<double> x, y;
        for (const auto& m : series.windows) {
            if (!m.measured) continue;
            const bool overlaps = std::any_of(excluded.begin(), excluded.end(), [&](const Finding& f) {
                return f.startS < m.endS && m.startS < f.endS;
            });
            if (overlaps) continue;
            const double v = s.value(m, series.f0ReferenceHz);
            if (!std::isfinite(v)) continue;
            x.push_back(0.5 * (m.startS + m.endS));
            y.push_back(v);
        }
        if (x.size() < 4) continue;
        const Hinge h = fitHinge(x, y, rules.driftMinSpanSeconds);
        const double value = s.relative ? (h.base > 0 ? 100.0 * h.change / h.base : 0.0) : h.change;
        if (!(std::fabs(value) >= s.rule->minChange)) continue;
        std::vector<double> xa, ya;
        for (std::size_t i = 0; i < x.size(); ++i)
            if (x[i] >= h.t0) {
                xa.push_back(x[i] / 60.0);
                ya.push_back(y[i]);
            }
        const TrendFit fit = theilSen(xa, ya);
        if (!fit.significant() || (fit.slope > 0) != (h.change > 0)) continue;
        const double end = series.windows.back().endS;
        // A knee at the first window's centre is a straight line over all the data: the drift runs
        // from the start of the first window measured.
        const double start = h.t0 <= x.front() ? std::max(0.0, x.front() - 0.5 * series.windowSeconds) : h.t0;
        char buf[200];
        std::snprintf(buf, sizeof buf, "%s: %s drifts %+.1f %s from %.1f s to %.1f s (|change| >= %.1f %s)",
                      findingName(s.kind), s.words, value, s.unit, start, end, s.rule->minChange, s.unit);
        out.push_back(make(s.kind, s.measure, s.unit, start, end, value, s.rule->minChange, buf));
    }
    return out;
}

std::vector<Finding> findTimbreShifts(const LongTakeTracks& tr, const LongformRules& rules) {
    std::vector<Finding> out;
    const auto& r = rules.timbreShift;
    if (!r.enabled) return out;
    const std::vector<SpeechSegment> segments = speechSegments(tr.speech);
    std::vector<TimbreAccumulator> acc(segments.size(), TimbreAccumulator(tr.mfcc.dims));
    for (std::size_t s = 0; s < segments.size(); ++s) {
        const detail::FrameRange fr = detail::framesIn(tr.hopSeconds, tr.energy.db.size(), segments[s].startS, segments[s].endS);
        for (std::size_t i = fr.begin; i < fr.end; ++i)
            if (tr.speech.speech[i] && tr.pitch.voiced(i)) acc[s].add(tr.mfcc.row(static_cast<int>(i)));
    }
    std::vector<TimbreModel> models;
    for (const auto& a : acc) models.push_back(TimbreModel::fit(a, 0.05));
    std::vector<double> distance(segments.size(), NAN);
    std::vector<double> valid;
    // Pass 1: against all segments pooled; pass 2: against the closer half.
    for (int pass = 0; pass < 2; ++pass) {
        const double cut = valid.empty() ? INFINITY : detail::percentile(std::vector<float>(valid.begin(), valid.end()), 50);
        TimbreAccumulator pool(tr.mfcc.dims);
        for (std::size_t s = 0; s < segments.size(); ++s)
            if (models[s].valid() && (pass == 0 || distance[s] <= cut)) pool.add(acc[s]);
        const TimbreModel voice = TimbreModel::fit(pool);
        valid.clear();
        for (std::size_t s = 0; s < segments.size(); ++s) {
            distance[s] = models[s].valid() ? symmetricKl(models[s], voice) : NAN;
            if (std::isfinite(distance[s])) valid.push_back(distance[s]);
        }
        if (valid.size() < 5) return out;
    }
    const double typical = detail::percentile(std::vector<float>(valid.begin(), valid.end()), 50);
    if (!(typical > 0)) return out;
    // Runs of far segments; segments without a model neither start nor break a run.
    std::size_t s = 0;
    while (s < segments.size()) {
        if (!(distance[s] / typical > r.minRatio)) {
            ++s;
            continue;
        }
        std::size_t e = s;
        std::vector<float> ratios{static_cast<float>(distance[s] / typical)};
        for (std::size_t k = s + 1; k < segments.size(); ++k) {
            if (!std::isfinite(distance[k])) continue;
            if (!(distance[k] / typical > r.minRatio)) break;
            e = k;
            ratios.push_back(static_cast<float>(distance[k] / typical));
        }
        const double a = segments[s].startS, b = segments[e].endS;
        if (b - a >= r.minSeconds) {
            const double value = detail::percentile(ratios, 50);
            out.push_back(make(FindingKind::TimbreShift, "timbre_ratio", "ratio", a, b, value, r.minRatio,
                               fmt("timbre-shift: %.1f s to %.1f s sound %.1fx farther from the take's voice than usual",
                                   a, b, value) +
                                   fmt(" (> %.1fx)", r.minRatio)));
        }
        s = e + 1;
    }
    return out;
}

std::vector<Finding> findMonotoneStretches(const LongTakeTracks& tr, const LongTakeSeries& series,
                                           const LongformRules& rules) {
    std::vector<Finding> out;
    const auto& r = rules.monotone;
    if (!r.enabled) return out;
    const std::vector<SpeechSegment> segments = speechSegments(tr.speech);
    if (segments.empty()) return out;
    const auto segmentMonotone = [&](std::size_t s) {
        const auto range = voicedRangeF0(tr, segments[s].startS, segments[s].endS);
        return range.empty() ? std::optional<bool>{} : std::optional<bool>{range[0] < r.maxRangeSt};
    };
    std::size_t w = 0;
    const auto& win = series.windows;
    while (w < win.size()) {
        if (!(win[w].measured && win[w].f0RangeSt < r.maxRangeSt)) {
            ++w;
            continue;
        }
        std::size_t e = w;
        while (e + 1 < win.size() && win[e + 1].measured && win[e + 1].f0RangeSt < r.maxRangeSt) ++e;
        const double a = win[w].startS, b = win[e].endS;
        w = e + 1;
        // Segments inside the flagged windows, then widen by monotone neighbours
        // and narrow by non-monotone edges.
        std::size_t first = segments.size(), last = 0;
        for (std::size_t s = 0; s < segments.size(); ++s)
            if (segments[s].startS >= a - 0.5 && segments[s].endS <= b + 0.5) {
                first = std::min(first, s);
                last = std::max(last, s);
            }
        if (first > last) continue;
        while (first > 0 && segmentMonotone(first - 1).value_or(true)) --first;
        while (last + 1 < segments.size() && segmentMonotone(last + 1).value_or(true)) ++last;
        while (first < last && !segmentMonotone(first).value_or(true)) ++first;
        while (last > first && !segmentMonotone(last).value_or(true)) --last;
        const double sa = segments[first].startS, sb = segments[last].endS;
        const auto range = voicedRangeF0(tr, sa, sb);
        if (sb - sa < r.minSeconds || range.empty() || !(range[0] < r.maxRangeSt)) continue;
        if (!out.empty() && sa < out.back().endS) continue;  // already covered by the previous stretch
        out.push_back(make(FindingKind::MonotoneStretch, "f0_range_st", "st", sa, sb, range[0], r.maxRangeSt,
                           fmt("monotone-stretch: F0 range %.1f st over %.1f s from %.1f s", range[0], sb - sa, sa) +
                               fmt(" (< %.1f st)", r.maxRangeSt)));
    }
    return out;
}

LongformReport analyseLongform(const Signal& take, const std::vector<double>& knownJoins, const LongformRules& rules,
                               Progress progress, const std::string& joinsOrigin) {
    checkJoins(knownJoins, take.durationSeconds(), joinsOrigin);
    LongTakeParams params;
    params.windowSeconds = rules.windowSeconds;
    params.windowHopSeconds = rules.windowHopSeconds;
    params.minTakeSeconds = rules.minTakeSeconds;
    LongformReport report;
    report.analysis = analyseLongTake(take, params, progress.sub(0, 0.9));
    const auto& tr = report.analysis.tracks;
    report.joins = measureJoins(take, tr, knownJoins, rules.seam, joinsOrigin);
    const std::vector<Finding> shifts = findTimbreShifts(tr, rules);
    for (auto part : {findSeams(report.joins, rules), findDrifts(report.analysis.series, rules, shifts), shifts,
                      findMonotoneStretches(tr, report.analysis.series, rules)})
        report.findings.insert(report.findings.end(), part.begin(), part.end());
    std::stable_sort(report.findings.begin(), report.findings.end(),
                     [](const Finding& a, const Finding& b) { return a.startS < b.startS; });
    progress.report(1.0);
    return report;
}

}  // namespace earmark
