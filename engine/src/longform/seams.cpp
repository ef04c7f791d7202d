#include "earmark/longform/seams.hpp"

#include "earmark/core/error.hpp"
#include "earmark/core/numeric.hpp"
#include "earmark/core/format.hpp"
#include "earmark/longform/timbre.hpp"

#include "../prosody/track_stats.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>
#include <utility>

namespace earmark {
namespace {

constexpr double kMinSideSpeechSeconds = 3.0;  // least speech on each side for level and envelope
// A click in a pause reads as a burst of "speech" this short that splits the
// pause; the halves are joined again so the click lies inside one pause.
constexpr double kClickSpeechSeconds = 0.05;

std::vector<Pause> pausesAcrossClicks(const std::vector<Pause>& pauses) {
    std::vector<Pause> out;
    for (const Pause& p : pauses) {
        if (!out.empty() && p.startS - out.back().endS < kClickSpeechSeconds) out.back().endS = p.endS;
        else out.push_back(p);
    }
    return out;
}

std::optional<Pause> pauseHolding(const std::vector<Pause>& pauses, double t) {
    for (const Pause& p : pauses)
        if (p.startS <= t && t <= p.endS) return p;
    return std::nullopt;
}

// Median energy of the frames in [a, b), dB; empty with fewer than minFrames.
std::optional<double> medianDb(const LongTakeTracks& tr, double a, double b, std::size_t minFrames) {
    const detail::FrameRange r = detail::framesIn(tr.hopSeconds, tr.energy.db.size(), a, b);
    if (r.end - r.begin < minFrames) return std::nullopt;
    return detail::percentile(std::vector<float>(tr.energy.db.begin() + r.begin, tr.energy.db.begin() + r.end), 50);
}

// Power mean of the speech frames' energy in [a, b), dB (dominated by the
// loud frames, so it does not move when a level change shifts which quiet
// frames count as speech); empty with fewer than minFrames speech frames.
std::optional<double> speechLevelDb(const LongTakeTracks& tr, double a, double b, std::size_t minFrames) {
    const detail::FrameRange r = detail::framesIn(tr.hopSeconds, tr.energy.db.size(), a, b);
    double sum = 0;
    std::size_t count = 0;
    for (std::size_t i = r.begin; i < r.end; ++i)
        if (tr.speech.speech[i]) {
            sum += std::pow(10.0, tr.energy.db[i] / 10.0);
            ++count;
        }
    if (count < minFrames) return std::nullopt;
    return 10.0 * std::log10(sum / static_cast<double>(count));
}

TimbreModel voicedModel(const LongTakeTracks& tr, double a, double b) {
    const detail::FrameRange r = detail::framesIn(tr.hopSeconds, tr.energy.db.size(), a, b);
    TimbreAccumulator acc(tr.mfcc.dims);
    for (std::size_t i = r.begin; i < r.end; ++i)
        if (tr.speech.speech[i] && tr.pitch.voiced(i)) acc.add(tr.mfcc.row(static_cast<int>(i)));
    return TimbreModel::fit(acc, 0.05);
}

void measureClick(const Signal& take, double a, double b, JoinMeasures& j) {
    const double rate = take.sampleRate;
    const auto n = static_cast<std::int64_t>(take.size());
    const std::int64_t s0 = std::clamp<std::int64_t>(std::llround(a * rate), 1, n);
    const std::int64_t s1 = std::clamp<std::int64_t>(std::llround(b * rate), s0, n);
    const float* x = take.samples.data();
    std::int64_t peakAt = -1;
    double peak = 0;
    for (std::int64_t i = s0; i < s1; ++i) {
        const double d = std::fabs(static_cast<double>(x[i]) - x[i - 1]);
        if (d > peak) {
            peak = d;
            peakAt = i;
        }
    }
    j.clickDb = 0.0;
    j.clickTimeS = j.timeS;
    if (peakAt < 0 || peak < 1e-3) return;
    // Baseline: the louder side of the peak's neighbourhood (±1…10 ms), so a
    // burst that starts speech is not read as a click.
    const auto near = static_cast<std::int64_t>(std::llround(0.010 * rate));
    const auto skip = std::max<std::int64_t>(1, std::llround(0.001 * rate));
    const auto sideRms = [&](std::int64_t from, std::int64_t to) {
        from = std::max<std::int64_t>(1, from);
        to = std::min(n, to);
        double sum = 0;
        for (std::int64_t i = from; i < to; ++i) {
            const double d = static_cast<double>(x[i]) - x[i - 1];
            sum += d * d;
        }
        return to > from ? std::sqrt(sum / static_cast<double>(to - from)) : 0.0;
    };
    const double rms = std::max(sideRms(peakAt - near, peakAt - skip), sideRms(peakAt + skip + 1, peakAt + near + 1));
    j.clickDb = rms > 0 ? std::min(120.0, 20.0 * std::log10(peak / rms)) : 120.0;
    j.clickTimeS = static_cast<double>(peakAt) / rate;
}

}  // namespace

void checkJoins(const std::vector<double>& knownJoins, double durationS, const std::string& origin) {
    for (double t : knownJoins)
        if (!(t > 0 && t < durationS))
            throw InputError(origin, "join at " + formatSeconds(t) + " lies outside the take (0–" +
                                         formatSeconds(durationS) + ")");
}

std::vector<JoinMeasures> measureJoins(const Signal& take, const LongTakeTracks& tr,
                                       const std::vector<double>& knownJoins, const LongformRules::Seam& rules,
                                       const std::string& origin) {
    checkJoins(knownJoins, tr.durationS, origin);
    const std::vector<Pause> pauses = pausesAcrossClicks(tr.speech.pauses);
    std::vector<JoinMeasures> joins;
    for (double t : knownJoins) {
        JoinMeasures j;
        j.timeS = t;
        j.known = true;
        joins.push_back(j);
    }
    if (knownJoins.empty())
        for (const Pause& p : pauses) {
            JoinMeasures j;
            j.timeS = 0.5 * (p.startS + p.endS);
            joins.push_back(j);
        }
    std::sort(joins.begin(), joins.end(), [](const auto& a, const auto& b) { return a.timeS < b.timeS; });

    const double ctx = rules.contextSeconds;
    const double edge = 0.03;
    for (JoinMeasures& j : joins) {
        const double t = j.timeS;
        const auto pause = pauseHolding(pauses, t);
        j.pauseStartS = pause ? pause->startS : t;
        j.pauseEndS = pause ? pause->endS : t;
        const std::size_t minSpeechFrames = static_cast<std::size_t>(std::ceil(kMinSideSpeechSeconds / tr.hopSeconds));
        const auto before = speechLevelDb(tr, t - ctx, t, minSpeechFrames);
        const auto after = speechLevelDb(tr, t, t + ctx, minSpeechFrames);
        j.levelStepDb = before && after ? *after - *before : kNaN;
        j.roomToneStepDb = kNaN;
        if (pause) {
            const auto left = medianDb(tr, pause->startS + edge, t - 0.01, 5);
            const auto right = medianDb(tr, t + 0.01, pause->endS - edge, 5);
            if (left && right) j.roomToneStepDb = *right - *left;
        }
        if (pause) {
            // The pause, and the click-long edges either side: a click near
            // the next speech joins that speech and shortens the pause.
            measureClick(take, pause->startS, pause->endS, j);
            for (const auto& [a, b] : {std::pair{pause->startS - kClickSpeechSeconds, pause->startS},
                                      std::pair{pause->endS, pause->endS + kClickSpeechSeconds}}) {
                JoinMeasures nearby = j;
                measureClick(take, a, b, nearby);
                if (nearby.clickDb > j.clickDb) {
                    j.clickDb = nearby.clickDb;
                    j.clickTimeS = nearby.clickTimeS;
                }
            }
        } else {
            measureClick(take, t - 0.05, t + 0.05, j);
        }
        j.envelopeJump = symmetricKl(voicedModel(tr, t - ctx, t), voicedModel(tr, t, t + ctx));
    }
    // As a ratio to the median join, so the measure does not depend on the voice.
    std::vector<float> finite;
    for (const JoinMeasures& j : joins)
        if (std::isfinite(j.envelopeJump)) finite.push_back(static_cast<float>(j.envelopeJump));
    const double typical = finite.empty() ? 0.0 : detail::percentile(finite, 50);
    for (JoinMeasures& j : joins) j.envelopeJump = typical > 0 ? j.envelopeJump / typical : kNaN;
    return joins;
}

}  // namespace earmark
