#include "earmark/scan/word_checks.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>

namespace earmark {
namespace {

std::string num(double v, int decimals = 2) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    return buf;
}

// Words quoted for a reason; ';' separates reasons in the CSV, so it never appears inside one.
std::string quoted(const std::vector<std::string>& words) {
    std::string s;
    for (const auto& w : words) s += (s.empty() ? "'" : ", '") + w + "'";
    std::replace(s.begin(), s.end(), ';', ',');
    return s;
}

TakeSuspect suspect(SuspectKind kind, double value, double threshold, const char* unit, double a, double b,
                    const std::string& reason) {
    TakeSuspect s;
    s.kind = kind;
    s.value = value;
    s.threshold = threshold;
    s.unit = unit;
    s.startS = a;
    s.endS = b;
    s.reason = std::string(suspectName(kind)) + ": " + reason;
    std::replace(s.reason.begin(), s.reason.end(), ';', ',');
    return s;
}

double median(std::vector<double> v) {
    const std::size_t n = v.size();
    std::sort(v.begin(), v.end());
    return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

// The two phones scoring lowest, as "IH heard as AA"; phones above −0.5 nats/frame are left out
// (our choice: there the free loop found a near tie, not another sound).
std::string offPhones(const WordEvidence& w) {
    std::vector<const PhoneEvidence*> phones;
    for (const auto& p : w.phones)
        if (p.score < -0.5) phones.push_back(&p);
    std::sort(phones.begin(), phones.end(), [](auto* a, auto* b) { return a->score < b->score; });
    std::string out;
    for (std::size_t i = 0; i < phones.size() && i < 2; ++i) {
        std::string heard;
        for (const auto& h : phones[i]->heard) heard += (heard.empty() ? "" : " ") + h;
        out += (out.empty() ? "" : ", ") + phones[i]->expected + " heard as " + (heard.empty() ? "silence" : heard);
    }
    return out;
}

}  // namespace

const ScannedWord* TakeWords::lowest() const {
    const ScannedWord* best = nullptr;
    for (const auto& w : words)
        if (!best || w.score < best->score) best = &w;
    return best;
}

std::vector<std::string> TakeWords::wordsOf(CoverageFinding::Kind kind) const {
    std::vector<std::string> out;
    for (const auto& c : coverage) {
        const bool missing = kind == CoverageFinding::Kind::Skipped && c.kind == CoverageFinding::Kind::Substituted;
        if (c.kind == kind || missing) out.insert(out.end(), c.words.begin(), c.words.end());
    }
    return out;
}

TakeWords summariseWords(const WordEvidenceResult& evidence) {
    TakeWords out;
    out.method = evidence.method;
    out.scoresKnown = true;
    for (const WordEvidence& w : evidence.words) {
        if (!w.spoken) continue;
        out.words.push_back({w.label, w.startS, w.endS, w.score, offPhones(w)});
    }
    out.coverage = evidence.coverage;
    return out;
}

std::vector<TakeSuspect> coverageSuspects(const TakeWords& words, const ScanRules& rules) {
    using Kind = CoverageFinding::Kind;
    std::vector<TakeSuspect> out;
    auto findingsOf = [&](Kind kind) {
        std::vector<const CoverageFinding*> f;
        for (const auto& c : words.coverage)
            if (c.kind == kind) f.push_back(&c);
        return f;
    };
    // One suspect per kind: the first finding's time, every finding's detail.
    auto add = [&](Kind kind, SuspectKind suspectKind, const RuleSwitch& rule) {
        if (!rule.enabled) return;
        const auto found = findingsOf(kind);
        if (found.empty()) return;
        std::vector<std::string> named;
        std::string details;
        double seconds = 0;
        for (const auto* c : found) {
            named.insert(named.end(), c->words.begin(), c->words.end());
            details += (details.empty() ? "" : ", ") + c->detail;
            seconds += std::isfinite(c->endS - c->startS) ? c->endS - c->startS : 0.0;
        }
        const double a = found.front()->startS, b = found.back()->endS;
        if (kind == Kind::Extra) {
            out.push_back(suspect(suspectKind, seconds, rules.extraSpeech.minSeconds, "s", a, b, details));
            return;
        }
        out.push_back(suspect(suspectKind, static_cast<double>(named.size()), 0.0, "words", a, b,
                              details.empty() ? quoted(named) : details));
    };
    add(Kind::Skipped, SuspectKind::SkippedWord, rules.skippedWord);
    add(Kind::Repeated, SuspectKind::RepeatedWord, rules.repeatedWord);
    add(Kind::Extra, SuspectKind::ExtraSpeech, rules.extraSpeech);
    add(Kind::Substituted, SuspectKind::SubstitutedWord, rules.substitutedWord);
    add(Kind::EarlyEnd, SuspectKind::EarlyEnd, rules.earlyEnd);
    return out;
}

double WordScoreCalibration::limit(const PronunciationRule& rule) const {
    return medianScore - rule.maxMadsBelow * std::max(mad, rule.minMad);
}

double WordScoreCalibration::shortWordAllowance(double seconds) const {
    if (!(typicalWordSeconds > 0) || !(seconds > 0) || seconds >= typicalWordSeconds) return 1.0;
    return std::sqrt(typicalWordSeconds / seconds);
}

namespace {
std::string lowerCase(std::string s) {
    for (char& ch : s) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
    return s;
}
}  // namespace

const WordScoreCalibration::SameWord* WordScoreCalibration::sameWord(const std::string& label) const {
    if (label.empty()) return nullptr;
    const auto it = sameWords.find(lowerCase(label));
    return it == sameWords.end() ? nullptr : &it->second;
}

double WordScoreCalibration::spreadFor(const PronunciationRule& rule, const std::string& label) const {
    const SameWord* own = sameWord(label);
    return std::max({mad, rule.minMad, own ? own->mad : 0.0});
}

double WordScoreCalibration::limitFor(const PronunciationRule& rule, double seconds, const std::string& label) const {
    return medianScore - rule.maxMadsBelow * spreadFor(rule, label) * shortWordAllowance(seconds);
}

std::optional<WordScoreCalibration> calibrateWordScores(std::vector<double> scores, const PronunciationRule& rule,
                                                        std::vector<double> seconds, std::vector<std::string> labels) {
    std::map<std::string, std::vector<double>> byWord;
    if (labels.size() == scores.size())
        for (std::size_t i = 0; i < scores.size(); ++i)
            if (std::isfinite(scores[i])) byWord[lowerCase(labels[i])].push_back(scores[i]);
    std::erase_if(scores, [](double s) { return !std::isfinite(s); });
    if (scores.size() < static_cast<std::size_t>(std::max(1, rule.minWords))) return std::nullopt;
    WordScoreCalibration c;
    for (auto& [word, own] : byWord) {
        if (own.size() < static_cast<std::size_t>(std::max(3, rule.minSameWord))) continue;
        const std::size_t count = own.size();
        const double m = median(own);
        for (double& s : own) s = std::fabs(s - m);
        c.sameWords[word] = {median(std::move(own)), count};
    }
    c.words = scores.size();
    c.medianScore = median(scores);
    for (double& s : scores) s = std::fabs(s - c.medianScore);
    c.mad = median(std::move(scores));
    std::erase_if(seconds, [](double s) { return !(s > 0) || !std::isfinite(s); });
    if (!seconds.empty()) c.typicalWordSeconds = median(std::move(seconds));
    return c;
}

std::optional<TakeSuspect> pronunciationSuspect(const TakeWords& words, const WordScoreCalibration& calibration,
                                                const ScanRules& rules) {
    if (!rules.pronunciation.enabled) return std::nullopt;
    const auto secondsOf = [](const ScannedWord& w) { return w.endS - w.startS; };
    // How far below its own limit a word lies, in units of that limit's distance from the median.
    const auto shortfall = [&](const ScannedWord& w) {
        const double allowed = calibration.medianScore - calibration.limitFor(rules.pronunciation, secondsOf(w), w.label);
        return (calibration.medianScore - w.score) / allowed;
    };
    const ScannedWord* worst = nullptr;
    std::vector<std::string> below;
    for (const auto& w : words.words) {
        if (!(w.score < calibration.limitFor(rules.pronunciation, secondsOf(w), w.label))) continue;
        below.push_back(w.label);
        if (!worst || shortfall(w) > shortfall(*worst)) worst = &w;
    }
    if (!worst) return std::nullopt;
    std::vector<std::string> others;
    for (const auto& label : below)
        if (label != worst->label) others.push_back(label);
    const double limit = calibration.limitFor(rules.pronunciation, secondsOf(*worst), worst->label);
    const auto* own = calibration.sameWord(worst->label);
    const bool ownSpread = own && own->mad > std::max(calibration.mad, rules.pronunciation.minMad);
    const double allowance = calibration.shortWordAllowance(secondsOf(*worst));
    std::string reason = "'" + worst->label + "' scores " + num(worst->score) + " nats/frame at " + num(worst->startS) +
                         "–" + num(worst->endS) + " s" +
                         (worst->offPhones.empty() ? "" : " (" + worst->offPhones + ")") + ", below the set's " +
                         num(limit) + " (median " + num(calibration.medianScore) + " − " +
                         num(rules.pronunciation.maxMadsBelow, 1) + " × MAD " +
                         num(calibration.spreadFor(rules.pronunciation, worst->label)) +
                         (ownSpread ? " of '" + worst->label + "', said " + std::to_string(own->count) + " times in the set"
                                    : std::string()) +
                         (allowance > 1.0 ? " × " + num(allowance) + " for a word shorter than the set's typical " +
                                                num(calibration.typicalWordSeconds) + " s"
                                          : "") +
                         (calibration.supplied ? ", supplied" : "") + ")";
    if (!others.empty()) reason += ", also below: " + quoted(others);
    return suspect(SuspectKind::Pronunciation, worst->score, limit, "nats/frame", worst->startS, worst->endS, reason);
}

}  // namespace earmark
