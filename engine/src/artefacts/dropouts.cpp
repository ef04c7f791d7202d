#include "earmark/artefacts/dropouts.hpp"

#include "runs.hpp"
#include "signal_checks.hpp"

#include <algorithm>
#include <cmath>

namespace earmark {

void DropoutParams::validate() const {
    if (!(blockSeconds > 0 && blockSeconds <= 0.01)) throw ParamError("DropoutParams.blockSeconds", "must be in (0, 0.01]");
    if (!(minDepthDb > 0 && std::isfinite(minDepthDb))) throw ParamError("DropoutParams.minDepthDb", "must be positive");
    if (!(minSeconds > 0 && std::isfinite(minSeconds))) throw ParamError("DropoutParams.minSeconds", "must be positive");
    if (!(maxSeconds > minSeconds && std::isfinite(maxSeconds)))
        throw ParamError("DropoutParams.maxSeconds", "must be above minSeconds");
    if (!(edgeSeconds >= blockSeconds && edgeSeconds <= 0.05))
        throw ParamError("DropoutParams.edgeSeconds", "must be in [blockSeconds, 0.05]");
    if (!(edgeBelowSpeechDb > 0 && std::isfinite(edgeBelowSpeechDb)))
        throw ParamError("DropoutParams.edgeBelowSpeechDb", "must be positive");
    if (!(voicedSeconds >= 0 && voicedSeconds <= 0.1)) throw ParamError("DropoutParams.voicedSeconds", "must be in [0, 0.1]");
    if (!(maxF0StepSt > 0 && std::isfinite(maxF0StepSt))) throw ParamError("DropoutParams.maxF0StepSt", "must be positive");
    if (!(unvoicedEdgeBelowSpeechDb > 0 && unvoicedEdgeBelowSpeechDb <= edgeBelowSpeechDb))
        throw ParamError("DropoutParams.unvoicedEdgeBelowSpeechDb", "must be in (0, edgeBelowSpeechDb]");
}

std::vector<ArtefactEvent> findDropouts(const Signal& signal, const PitchTrack& pitch, double speechLevelDb,
                                        const DropoutParams& p, Progress progress) {
    p.validate();
    detail::checkSignal(signal);
    if (!(pitch.hopSeconds > 0)) throw ParamError("PitchTrack.hopSeconds", "must be positive");
    auto f0At = [&](double t) -> double {  // 0 when unvoiced or outside the track
        if (t < 0) return 0.0;
        const auto k = static_cast<std::size_t>(std::llround(t / pitch.hopSeconds));
        return k < pitch.size() ? pitch.f0Hz[k] : 0.0;
    };
    const double rate = signal.sampleRate;
    const auto block = static_cast<std::size_t>(std::max(1.0, std::round(p.blockSeconds * rate)));
    const std::size_t blocks = signal.size() / block;
    std::vector<double> power(blocks);
    for (std::size_t b = 0; b < blocks; ++b) {
        if (b % 65536 == 0) progress.report(0.9 * static_cast<double>(b) / static_cast<double>(std::max<std::size_t>(blocks, 1)));
        double s = 0.0;
        for (std::size_t i = b * block; i < (b + 1) * block; ++i) s += static_cast<double>(signal.samples[i]) * signal.samples[i];
        power[b] = s / static_cast<double>(block);
    }
    auto db = [](double pw) { return 10.0 * std::log10(std::max(pw, 1e-15)); };
    const double gapBelow = std::pow(10.0, (speechLevelDb - p.minDepthDb) / 10.0);
    std::vector<bool> flags(blocks);
    for (std::size_t b = 0; b < blocks; ++b) flags[b] = power[b] < gapBelow;
    const double blockS = static_cast<double>(block) / rate;
    const auto edge = static_cast<std::size_t>(std::max(1.0, std::round(p.edgeSeconds / blockS)));
    auto meanDb = [&](std::size_t a, std::size_t b) {  // blocks [a, b)
        double s = 0.0;
        for (std::size_t i = a; i < b; ++i) s += power[i];
        return db(s / static_cast<double>(b - a));
    };
    std::vector<ArtefactEvent> events;
    for (const auto& run : detail::flaggedRuns(flags)) {
        const double seconds = static_cast<double>(run.length()) * blockS;
        if (seconds < p.minSeconds || seconds > p.maxSeconds) continue;
        if (run.first < edge || run.last + 1 + edge > blocks) continue;
        const double edgeFloor = speechLevelDb - p.edgeBelowSpeechDb;
        if (meanDb(run.first - edge, run.first) < edgeFloor || meanDb(run.last + 1, run.last + 1 + edge) < edgeFloor)
            continue;
        const double startS = static_cast<double>(run.first) * blockS, endS = static_cast<double>(run.last + 1) * blockS;
        // The nearest voiced frame outside the gap on each side, within voicedSeconds
        // (YIN's frames that reach into the gap are often unvoiced).
        double before = 0.0, after = 0.0;
        for (double d = 0.0; d <= p.voicedSeconds + 1e-9 && (before <= 0 || after <= 0); d += pitch.hopSeconds) {
            if (before <= 0) before = f0At(startS - d);
            if (after <= 0) after = f0At(endS + d);
        }
        // A side YIN calls unvoiced (its frames reach into the gap) still
        // continues the voice when the sound there is near the speech level.
        const double strongFloor = speechLevelDb - p.unvoicedEdgeBelowSpeechDb;
        const bool beforeOk = before > 0 || meanDb(run.first - edge, run.first) >= strongFloor;
        const bool afterOk = after > 0 || meanDb(run.last + 1, run.last + 1 + edge) >= strongFloor;
        if (!beforeOk || !afterOk || (before <= 0 && after <= 0)) continue;
        if (before > 0 && after > 0 && std::fabs(12.0 * std::log2(after / before)) > p.maxF0StepSt) continue;
        events.push_back({static_cast<double>(run.first) * blockS, static_cast<double>(run.last + 1) * blockS,
                          speechLevelDb - meanDb(run.first, run.last + 1)});
    }
    progress.report(1.0);
    return events;
}

}  // namespace earmark
