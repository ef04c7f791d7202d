#include "earmark/prosody/suspects.hpp"

#include "track_stats.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <functional>

namespace earmark {
namespace {

constexpr std::array<std::pair<SuspectKind, const char*>, 23> kNames = {{
    {SuspectKind::Flat, "flat"},
    {SuspectKind::PitchJump, "pitch-jump"},
    {SuspectKind::PauseTooLong, "pause-too-long"},
    {SuspectKind::PauseMissing, "pause-missing"},
    {SuspectKind::Rushed, "rushed"},
    {SuspectKind::Dragged, "dragged"},
    {SuspectKind::Clipping, "clipping"},
    {SuspectKind::Truncation, "truncation"},
    {SuspectKind::LeadingSilence, "leading-silence"},
    {SuspectKind::TrailingSilence, "trailing-silence"},
    {SuspectKind::Loud, "loud"},
    {SuspectKind::Quiet, "quiet"},
    {SuspectKind::DcOffset, "dc-offset"},
    {SuspectKind::Click, "click"},
    {SuspectKind::NoiseBurst, "noise-burst"},
    {SuspectKind::Buzz, "buzz"},
    {SuspectKind::Dropout, "dropout"},
    {SuspectKind::Pronunciation, "pronunciation"},
    {SuspectKind::SkippedWord, "skipped-word"},
    {SuspectKind::RepeatedWord, "repeated-word"},
    {SuspectKind::ExtraSpeech, "extra-speech"},
    {SuspectKind::SubstitutedWord, "substituted-word"},
    {SuspectKind::EarlyEnd, "early-end"},
}};

// Shortest decimal form with at most `decimals` places ("2", "1.5", "0.04").
std::string num(double v, int decimals = 2) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    std::string s = buf;
    if (s.find('.') != std::string::npos) {
        while (s.back() == '0') s.pop_back();
        if (s.back() == '.') s.pop_back();
    }
    if (s == "-0") s = "0";
    return s;
}

// Words quoted for a reason; ';' is the separator of reasons in the CSV, so
// it never appears inside one. Long phrases are shortened in the middle.
std::string quoteWords(const std::vector<std::string>& tokens, std::size_t first, std::size_t last) {
    last = std::min(last, tokens.size() - 1);
    auto join = [&](std::size_t a, std::size_t b) {
        std::string s;
        for (std::size_t i = a; i <= b; ++i) s += (s.empty() ? "" : " ") + tokens[i];
        return s;
    };
    std::string s = join(first, last);
    if (s.size() > 70 && last - first + 1 > 8) s = join(first, first + 3) + " … " + join(last - 3, last);
    std::replace(s.begin(), s.end(), ';', ',');
    return "'" + s + "'";
}

std::string timeSpan(double a, double b) { return num(a) + "–" + num(b) + " s"; }

const std::vector<std::string>& tokensOf(const ProsodyContext& c) { return c.wordTokens(); }

TakeSuspect make(SuspectKind kind, double value, double threshold, const char* unit, double a, double b,
             std::string reason) {
    TakeSuspect s;
    s.kind = kind;
    s.value = value;
    s.threshold = threshold;
    s.unit = unit;
    s.startS = a;
    s.endS = b;
    s.reason = std::string(suspectName(kind)) + ": " + reason;
    return s;
}

// Index of the word containing time t, or -1.
long wordAt(const std::vector<Interval>& words, double t) {
    for (std::size_t i = 0; i < words.size(); ++i)
        if (t >= words[i].startS && t < words[i].endS) return static_cast<long>(i);
    return -1;
}

std::optional<TakeSuspect> flatSuspect(const ProsodyContext& c, const FlatRule& rule) {
    const auto& words = c.transcript().words;
    const auto& act = c.activity();
    const int minVoiced = std::max(c.params().minVoicedFrames, 20);  // ≥ 0.1 s of voicing at a 5 ms hop
    struct Phrase {
        double a, b;
        std::size_t w0, w1;
        bool hasWords;
    };
    std::vector<Phrase> phrases;
    if (!words.empty()) {
        const auto& tok = tokensOf(c);
        std::size_t start = 0;
        for (std::size_t i = 0; i < words.size(); ++i) {
            const bool last = i + 1 == words.size();
            bool split = last;
            if (!last) {
                const double gap = words[i + 1].startS - words[i].endS;
                split = closingPunctuation(tok[i]) != '\0' || gap >= c.params().pause.minPauseSeconds ||
                        act.pauseCovering(words[i].endS, std::max(words[i].endS + 1e-3, words[i + 1].startS), 0.5);
            }
            if (split) {
                if (static_cast<int>(i - start + 1) >= rule.minWords)
                    phrases.push_back({words[start].startS, words[i].endS, start, i, true});
                start = i + 1;
            }
        }
    } else if (act.hasSpeech()) {
        double a = *act.speechStartS;
        for (std::size_t i = 0; i <= act.pauses.size(); ++i) {
            const double b = i < act.pauses.size() ? act.pauses[i].startS : *act.speechEndS;
            if (b - a >= rule.minSecondsWithoutWords) phrases.push_back({a, b, 0, 0, false});
            if (i < act.pauses.size()) a = act.pauses[i].endS;
        }
    }
    std::optional<TakeSuspect> worst;
    for (const auto& p : phrases) {
        auto f0 = detail::voicedF0(c.pitch(), p.a, p.b);
        if (static_cast<int>(f0.size()) < minVoiced) continue;
        const double range = detail::semitones(detail::percentile(f0, 95), detail::percentile(f0, 5));
        if (range >= rule.maxRangeSt || (worst && range >= worst->value)) continue;
        std::string where;
        if (p.hasWords) {
            where = quoteWords(tokensOf(c), p.w0, p.w1);
        } else if (act.pauses.empty() && !tokensOf(c).empty()) {
            where = quoteWords(tokensOf(c), 0, tokensOf(c).size() - 1);  // one phrase: the whole text
        } else {
            where = timeSpan(p.a, p.b);
        }
        worst = make(SuspectKind::Flat, range, rule.maxRangeSt, "st", p.a, p.b,
                     num(range, 1) + " st over " + where + " (< " + num(rule.maxRangeSt) + " st)");
    }
    return worst;
}

std::optional<TakeSuspect> pitchJumpSuspect(const ProsodyContext& c, const PitchJumpRule& rule) {
    const auto& pitch = c.pitch();
    const auto& words = c.transcript().words;
    double best = 0;
    std::size_t at = 0;
    for (std::size_t i = 1; i < pitch.size(); ++i) {
        if (!pitch.voiced(i) || !pitch.voiced(i - 1)) continue;
        if (!words.empty() && wordAt(words, pitch.timeSeconds(i)) < 0) continue;
        const double step = std::fabs(detail::semitones(pitch.f0Hz[i], pitch.f0Hz[i - 1]));
        if (step > best) {
            best = step;
            at = i;
        }
    }
    if (best < rule.minStepSt) return std::nullopt;
    const double a = pitch.timeSeconds(at - 1), b = pitch.timeSeconds(at);
    std::string reason = num(best, 1) + " st between neighbouring frames at " + num(b, 3) + " s";
    if (const long w = wordAt(words, b); w >= 0)
        reason += " in " + quoteWords(tokensOf(c), static_cast<std::size_t>(w), static_cast<std::size_t>(w));
    return make(SuspectKind::PitchJump, best, rule.minStepSt, "st", a, b,
                reason + " (≥ " + num(rule.minStepSt) + " st)");
}

std::optional<TakeSuspect> pauseTooLongSuspect(const ProsodyContext& c, const PauseTooLongRule& rule) {
    const auto& words = c.transcript().words;
    const auto& tok = tokensOf(c);
    std::optional<TakeSuspect> worst;
    for (const auto& p : c.activity().pauses) {
        if (p.seconds() <= rule.maxSeconds || (worst && p.seconds() <= worst->value)) continue;
        std::string where = "at " + timeSpan(p.startS, p.endS);
        if (!words.empty()) {
            // The words on either side; a pause after a sentence end is not "inside a sentence".
            long before = -1;
            for (std::size_t i = 0; i < words.size(); ++i)
                if (0.5 * (words[i].startS + words[i].endS) < p.startS) before = static_cast<long>(i);
            if (before >= 0) {
                const char punct = closingPunctuation(tok[static_cast<std::size_t>(before)]);
                if (punct == '.' || punct == '?' || punct == '!') continue;
            }
            if (before >= 0 && static_cast<std::size_t>(before) + 1 < words.size())
                where += " between " + quoteWords(tok, before, before) + " and " + quoteWords(tok, before + 1, before + 1);
        }
        worst = make(SuspectKind::PauseTooLong, p.seconds(), rule.maxSeconds, "s", p.startS, p.endS,
                     num(p.seconds()) + " s pause " + where + " (> " + num(rule.maxSeconds) + " s)");
    }
    return worst;
}

std::optional<TakeSuspect> pauseMissingSuspect(const ProsodyContext& c, const PauseMissingRule& rule) {
    const auto& words = c.transcript().words;
    const auto& tok = tokensOf(c);
    std::optional<TakeSuspect> worst;
    double worstShortfall = 0;
    for (std::size_t i = 0; i + 1 < words.size(); ++i) {
        const char p = closingPunctuation(tok[i]);
        if (p == '\0') continue;
        const bool stop = p == '.' || p == '?' || p == '!';
        const double expected = stop ? rule.minAfterStopS : rule.minAfterCommaS;
        const double gap = std::max(0.0, words[i + 1].startS - words[i].endS);
        // Silence measured around the boundary, for tiers whose words touch.
        const double silent = c.activity().longestSilenceWithin(words[i].endS - 0.1, words[i + 1].startS + 0.1);
        const double pause = std::max(gap, silent);
        if (pause >= expected) continue;
        const double shortfall = (expected - pause) / expected;
        if (worst && shortfall <= worstShortfall) continue;
        worstShortfall = shortfall;
        worst = make(SuspectKind::PauseMissing, pause, expected, "s", words[i].endS,
                     std::max(words[i].endS, words[i + 1].startS),
                     num(pause) + " s after " + quoteWords(tok, i, i) + " (< " + num(expected) + " s)");
    }
    return worst;
}

std::optional<TakeSuspect> rateSuspect(const TakeMeasures& m, const RateRule& rule, bool rushed, double a, double b) {
    if (!m.articulationSyllablesPerS || m.speechS < rule.minSpeechSeconds) return std::nullopt;
    const double rate = *m.articulationSyllablesPerS;
    if (rushed ? rate <= rule.limitSyllablesPerS : rate >= rule.limitSyllablesPerS) return std::nullopt;
    return make(rushed ? SuspectKind::Rushed : SuspectKind::Dragged, rate, rule.limitSyllablesPerS, "syl/s", a, b,
                num(rate, 1) + " syllables/s articulation rate (" + std::to_string(m.syllables) + " syllables from " +
                    syllableSourceName(m.syllableSource) + " in " + num(m.articulationS) + " s of speech) (" +
                    (rushed ? "> " : "< ") + num(rule.limitSyllablesPerS) + ")");
}

std::optional<TakeSuspect> truncationSuspect(const ProsodyContext& c, const TruncationRule& rule) {
    const auto& act = c.activity();
    if (!act.hasSpeech()) return std::nullopt;
    const double end = c.durationS();
    const double from = std::max(0.0, end - rule.tailSeconds);
    const auto tailDb = detail::energyMaxDb(c.energy(), from, end + 1e-9);
    if (!tailDb) return std::nullopt;
    const double relative = *tailDb - act.speechLevelDb;
    const auto f0 = detail::f0Stats(c.pitch(), from, end + 1e-9);
    const bool voiced = rule.voicedTail && f0.voiced > 0 && *tailDb >= act.thresholdDb;
    if (relative <= rule.maxTailDb && !voiced) return std::nullopt;
    std::string reason = "the last " + num(rule.tailSeconds * 1000, 0) + " ms are " +
                         (relative >= 0 ? num(relative, 1) + " dB above" : num(-relative, 1) + " dB below") +
                         " the speech level" + (f0.voiced > 0 ? " and voiced" : "");
    const auto& words = c.transcript().words;
    if (!words.empty()) reason += ", in " + quoteWords(tokensOf(c), words.size() - 1, words.size() - 1);
    return make(SuspectKind::Truncation, relative, rule.maxTailDb, "dB", std::max(0.0, end - 0.3), end,
                reason + " (> " + num(rule.maxTailDb) + " dB" + (rule.voicedTail ? ", or voiced" : "") + ")");
}

double scaleOf(const TakeSuspect& s) {
    switch (s.kind) {
        case SuspectKind::Clipping: return std::max(1.0, std::fabs(s.threshold));
        case SuspectKind::DcOffset: return std::max(0.001, std::fabs(s.threshold));
        case SuspectKind::Truncation:
        case SuspectKind::NoiseBurst:
        case SuspectKind::Dropout: return std::max(1.0, std::fabs(s.threshold));
        case SuspectKind::SkippedWord:
        case SuspectKind::RepeatedWord:
        case SuspectKind::SubstitutedWord:
        case SuspectKind::EarlyEnd: return 1.0;  // value and threshold are word counts
        case SuspectKind::Pronunciation: return std::max(0.1, std::fabs(s.threshold));
        default: return std::max(1e-9, std::fabs(s.threshold));
    }
}

const RuleSwitch& switchOf(SuspectKind kind, const ScanRules& r) {
    switch (kind) {
        case SuspectKind::Flat: return r.flat;
        case SuspectKind::PitchJump: return r.pitchJump;
        case SuspectKind::PauseTooLong: return r.pauseTooLong;
        case SuspectKind::PauseMissing: return r.pauseMissing;
        case SuspectKind::Rushed: return r.rushed;
        case SuspectKind::Dragged: return r.dragged;
        case SuspectKind::Clipping: return r.clipping;
        case SuspectKind::Truncation: return r.truncation;
        case SuspectKind::LeadingSilence: return r.leadingSilence;
        case SuspectKind::TrailingSilence: return r.trailingSilence;
        case SuspectKind::Loud:
        case SuspectKind::Quiet: return r.loudness;
        case SuspectKind::DcOffset: return r.dcOffset;
        case SuspectKind::Click: return r.click;
        case SuspectKind::NoiseBurst: return r.noiseBurst;
        case SuspectKind::Buzz: return r.buzz;
        case SuspectKind::Dropout: return r.dropout;
        case SuspectKind::Pronunciation: return r.pronunciation;
        case SuspectKind::SkippedWord: return r.skippedWord;
        case SuspectKind::RepeatedWord: return r.repeatedWord;
        case SuspectKind::ExtraSpeech: return r.extraSpeech;
        case SuspectKind::SubstitutedWord: return r.substitutedWord;
        case SuspectKind::EarlyEnd: return r.earlyEnd;
    }
    return r.flat;
}

}  // namespace

const char* suspectName(SuspectKind kind) {
    for (const auto& [k, name] : kNames)
        if (k == kind) return name;
    return "unknown";
}

std::optional<SuspectKind> suspectKindFromName(const std::string& name) {
    for (const auto& [k, n] : kNames)
        if (name == n) return k;
    return std::nullopt;
}

bool isSetLevel(SuspectKind kind) {
    return kind == SuspectKind::Loud || kind == SuspectKind::Quiet || kind == SuspectKind::Pronunciation;
}

std::vector<TakeSuspect> findSuspects(const ProsodyContext& c, const TakeMeasures& m, const ScanRules& rules) {
    rules.validate();
    std::vector<TakeSuspect> out;
    auto add = [&](std::optional<TakeSuspect> s) {
        if (s) out.push_back(std::move(*s));
    };
    const auto& act = c.activity();
    const double speechA = act.speechStartS.value_or(0.0), speechB = act.speechEndS.value_or(c.durationS());
    if (rules.flat.enabled) add(flatSuspect(c, rules.flat));
    if (rules.pitchJump.enabled) add(pitchJumpSuspect(c, rules.pitchJump));
    if (rules.pauseTooLong.enabled) add(pauseTooLongSuspect(c, rules.pauseTooLong));
    if (rules.pauseMissing.enabled) add(pauseMissingSuspect(c, rules.pauseMissing));
    if (rules.rushed.enabled) add(rateSuspect(m, rules.rushed, true, speechA, speechB));
    if (rules.dragged.enabled) add(rateSuspect(m, rules.dragged, false, speechA, speechB));
    if (rules.clipping.enabled && m.level.clippedSamples > rules.clipping.maxClippedSamples) {
        const double a = m.level.firstClipS.value_or(0.0), b = m.level.lastClipS.value_or(m.durationS);
        add(make(SuspectKind::Clipping, static_cast<double>(m.level.clippedSamples),
                 static_cast<double>(rules.clipping.maxClippedSamples), "samples", a, b,
                 std::to_string(m.level.clippedSamples) + " samples at full scale" +
                     (m.level.firstClipS ? " from " + num(a) + " to " + num(b) + " s" : "") + " (> " +
                     std::to_string(rules.clipping.maxClippedSamples) + ")"));
    }
    if (rules.truncation.enabled) add(truncationSuspect(c, rules.truncation));
    if (rules.leadingSilence.enabled && m.leadingSilenceS > rules.leadingSilence.maxSeconds)
        add(make(SuspectKind::LeadingSilence, m.leadingSilenceS, rules.leadingSilence.maxSeconds, "s", 0.0,
                 m.leadingSilenceS,
                 num(m.leadingSilenceS) + " s " + (act.hasSpeech() ? "before the speech" : "without any speech") +
                     " (> " + num(rules.leadingSilence.maxSeconds) + " s)"));
    if (rules.trailingSilence.enabled && act.hasSpeech() && m.trailingSilenceS > rules.trailingSilence.maxSeconds)
        add(make(SuspectKind::TrailingSilence, m.trailingSilenceS, rules.trailingSilence.maxSeconds, "s", speechB,
                 m.durationS,
                 num(m.trailingSilenceS) + " s after the speech (> " + num(rules.trailingSilence.maxSeconds) + " s)"));
    if (rules.dcOffset.enabled && std::fabs(m.level.dcOffset) > rules.dcOffset.maxAbs)
        add(make(SuspectKind::DcOffset, m.level.dcOffset,
                 m.level.dcOffset < 0 ? -rules.dcOffset.maxAbs : rules.dcOffset.maxAbs, "FS", 0.0, m.durationS,
                 "mean sample value " + num(m.level.dcOffset, 4) + " of full scale (beyond ±" +
                     num(rules.dcOffset.maxAbs, 4) + ")"));
    return out;
}

std::vector<TakeSuspect> findArtefactSuspects(const Signal& signal, const ProsodyContext& c, const ScanRules& rules,
                                              Progress progress) {
    rules.validate();
    std::vector<TakeSuspect> out;
    const double level = c.activity().speechLevelDb;
    const auto& words = c.transcript().words;
    // Every event of one detector as a suspect of its own, in time order (a take
    // with three clicks gets three, each with its time and the word it falls in).
    auto add = [&](SuspectKind kind, std::vector<ArtefactEvent> events, double threshold, const char* unit,
                   const std::function<std::string(const ArtefactEvent&)>& what) {
        std::sort(events.begin(), events.end(), [](const auto& a, const auto& b) { return a.startS < b.startS; });
        for (std::size_t k = 0; k < events.size(); ++k) {
            const ArtefactEvent& e = events[k];
            std::string reason = what(e) + " at " + timeSpan(e.startS, e.endS);
            if (const long w = wordAt(words, 0.5 * (e.startS + e.endS)); w >= 0)
                reason += " in " + quoteWords(tokensOf(c), static_cast<std::size_t>(w), static_cast<std::size_t>(w));
            if (events.size() > 1)
                reason += " (" + std::to_string(k + 1) + " of " + std::to_string(events.size()) + " in the take)";
            out.push_back(make(kind, e.value, threshold, unit, e.startS, e.endS, reason));
        }
    };
    if (rules.click.enabled) {
        const auto& p = rules.click.params;
        add(SuspectKind::Click, findClicks(signal, level, p, progress.sub(0.0, 0.5)), p.minRatio, "x",
            [&](const ArtefactEvent& e) {
                return "a sample " + num(e.value, 0) + " times the local prediction error (≥ " + num(p.minRatio) + ")";
            });
    }
    if (rules.noiseBurst.enabled) {
        const auto& p = rules.noiseBurst.params;
        add(SuspectKind::NoiseBurst, findNoiseBursts(signal, c.pitch(), level, p, progress.sub(0.5, 0.7)),
            p.minExcessDb, "dB", [&](const ArtefactEvent& e) {
                return "a burst of noise: the band above " + num(p.bandHz / 1000, 1) + " kHz " + num(e.value, 1) +
                       " dB louder than around it across its width (≥ " + num(p.minExcessDb) + " dB)";
            });
    }
    if (rules.buzz.enabled) {
        const auto& p = rules.buzz.params;
        add(SuspectKind::Buzz, findBuzz(signal, c.pitch(), level, p, progress.sub(0.7, 0.9)), p.minSeconds, "s",
            [&](const ArtefactEvent& e) {
                return num(e.value) + " s of speech-level sound without periodicity (aperiodicity ≥ " +
                       num(p.minAperiodicity) + ", ≥ " + num(p.minSeconds) + " s)";
            });
    }
    if (rules.dropout.enabled) {
        const auto& p = rules.dropout.params;
        add(SuspectKind::Dropout, findDropouts(signal, c.pitch(), level, p, progress.sub(0.9, 1.0)), p.minDepthDb,
            "dB", [&](const ArtefactEvent& e) {
                return num((e.endS - e.startS) * 1000, 0) + " ms drop " + num(e.value, 0) +
                       " dB below the speech level (≥ " + num(p.minDepthDb) + " dB, ≤ " + num(p.maxSeconds) + " s)";
            });
    }
    return out;
}

std::optional<TakeSuspect> loudnessSuspect(double lufs, double setMedianLufs, double durationS, const ScanRules& rules) {
    if (!rules.loudness.enabled || !std::isfinite(lufs) || !std::isfinite(setMedianLufs)) return std::nullopt;
    const double dev = lufs - setMedianLufs;
    const double limit = rules.loudness.maxDeviationLu;
    if (std::fabs(dev) <= limit) return std::nullopt;
    const bool loud = dev > 0;
    return make(loud ? SuspectKind::Loud : SuspectKind::Quiet, dev, loud ? limit : -limit, "LU", 0.0, durationS,
                num(lufs, 1) + " LUFS, " + num(std::fabs(dev), 1) + " LU " + (loud ? "above" : "below") +
                    " the set median " + num(setMedianLufs, 1) + " LUFS (more than " + num(limit) + " LU)");
}

double suspectScore(const TakeSuspect& s, const ScanRules& rules) {
    const double excess = std::fabs(s.value - s.threshold) / scaleOf(s);
    return switchOf(s.kind, rules).weight * (1.0 + std::min(rules.scoreCapPerSuspect - 1.0, excess));
}

double totalScore(const std::vector<TakeSuspect>& suspects, const ScanRules& rules) {
    double total = 0;
    for (const auto& s : suspects) total += suspectScore(s, rules);
    return total;
}

}  // namespace earmark
