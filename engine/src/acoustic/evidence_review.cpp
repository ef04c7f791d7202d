#include "earmark/acoustic/evidence_review.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace earmark {

const char* wordScoreClassName(WordScoreClass c) {
    switch (c) {
        case WordScoreClass::Good: return "good";
        case WordScoreClass::Doubtful: return "doubtful";
        case WordScoreClass::Poor: return "poor";
        case WordScoreClass::Unspoken: return "unspoken";
    }
    return "?";
}

void ScoreBands::validate() const {
    if (!std::isfinite(doubtfulBelow) || doubtfulBelow > 0)
        throw ParamError("ScoreBands.doubtfulBelow", "must be a finite score <= 0 nats/frame");
    if (!std::isfinite(poorBelow) || !(poorBelow < doubtfulBelow))
        throw ParamError("ScoreBands.poorBelow", "must be finite and below doubtfulBelow");
}

WordScoreClass classifyWord(const WordEvidence& word, const ScoreBands& bands) {
    bands.validate();
    if (!word.spoken || word.substituted) return WordScoreClass::Unspoken;
    if (word.score < bands.poorBelow) return WordScoreClass::Poor;
    if (word.score < bands.doubtfulBelow) return WordScoreClass::Doubtful;
    return WordScoreClass::Good;
}

std::vector<WordScoreSpan> wordScoreSpans(const WordEvidenceResult& evidence, const ScoreBands& bands) {
    std::vector<WordScoreSpan> out;
    for (std::size_t i = 0; i < evidence.words.size(); ++i) {
        const WordEvidence& w = evidence.words[i];
        if ((w.spoken || w.substituted) && w.endS > w.startS) out.push_back({i, w.startS, w.endS, classifyWord(w, bands)});
    }
    return out;
}

std::vector<PhoneRow> phoneRows(const WordEvidence& word) {
    std::vector<PhoneRow> rows;
    rows.reserve(word.phones.size());
    std::size_t worst = 0;
    for (std::size_t i = 0; i < word.phones.size(); ++i) {
        const PhoneEvidence& p = word.phones[i];
        PhoneRow r{.expected = p.expected, .score = p.score, .startS = p.startS, .endS = p.endS};
        for (const std::string& h : p.heard) r.heard += (r.heard.empty() ? "" : " ") + h;
        r.matches = p.heard.size() == 1 && p.heard.front() == p.expected;
        if (p.score < word.phones[worst].score) worst = i;
        rows.push_back(std::move(r));
    }
    if (!rows.empty()) rows[worst].worst = true;
    return rows;
}

int wordAt(const WordEvidenceResult& evidence, double t) {
    for (std::size_t i = 0; i < evidence.words.size(); ++i) {
        const WordEvidence& w = evidence.words[i];
        if ((w.spoken || w.substituted) && t >= w.startS && t < w.endS) return static_cast<int>(i);
    }
    return -1;
}

std::string coverageSuspectName(CoverageFinding::Kind kind) {
    // The scan's names (prosody/suspects.cpp), so a scanned session's own are recognised.
    switch (kind) {
        case CoverageFinding::Kind::Skipped: return "skipped-word";
        case CoverageFinding::Kind::Repeated: return "repeated-word";
        case CoverageFinding::Kind::Extra: return "extra-speech";
        case CoverageFinding::Kind::EarlyEnd: return "early-end";
        case CoverageFinding::Kind::Substituted: return "substituted-word";
    }
    return coverageKindName(kind);
}

namespace {

std::string number(double v, int decimals) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    return buf;
}

// "expected AE heard AO, expected D heard T": the phones furthest off first (at most two).
std::string phonesOff(const WordEvidence& w) {
    std::vector<PhoneRow> rows = phoneRows(w);
    std::erase_if(rows, [](const PhoneRow& r) { return r.matches; });
    std::stable_sort(rows.begin(), rows.end(), [](const PhoneRow& a, const PhoneRow& b) { return a.score < b.score; });
    std::string out;
    for (std::size_t i = 0; i < rows.size() && i < 2; ++i)
        out += (i ? ", " : "") + ("expected " + rows[i].expected + " heard " + (rows[i].heard.empty() ? "nothing" : rows[i].heard));
    return out;
}

bool namedByCoverage(const WordEvidenceResult& e, const std::string& word) {
    for (const CoverageFinding& c : e.coverage)
        if (std::find(c.words.begin(), c.words.end(), word) != c.words.end()) return true;
    return false;
}

}  // namespace

std::vector<Suspect> evidenceSuspects(const WordEvidenceResult& evidence, const ScoreBands& bands) {
    bands.validate();
    std::vector<Suspect> out;
    for (const CoverageFinding& c : evidence.coverage)
        out.push_back({.name = coverageSuspectName(c.kind), .value = c.endS - c.startS, .threshold = 0.0,
                       .startSeconds = c.startS, .endSeconds = std::max(c.startS, c.endS), .reason = c.detail});
    for (const WordEvidence& w : evidence.words) {
        if (classifyWord(w, bands) != WordScoreClass::Poor || namedByCoverage(evidence, w.label)) continue;
        std::string reason = "'" + w.label + "' pronounced poorly: score " + number(w.score, 2) +
                             " nats/frame (below " + number(bands.poorBelow, 2) + ")";
        if (const std::string off = phonesOff(w); !off.empty()) reason += "; " + off;
        if (w.guessed) reason += "; its phones were guessed (not in the dictionary)";
        out.push_back({.name = kWordScoreSuspect, .value = w.score, .threshold = bands.poorBelow,
                       .startSeconds = w.startS, .endSeconds = w.endS, .reason = reason});
    }
    std::stable_sort(out.begin(), out.end(),
                     [](const Suspect& a, const Suspect& b) { return a.startSeconds < b.startSeconds; });
    return out;
}

std::vector<Suspect> mergeSuspects(std::vector<Suspect> stored, const std::vector<Suspect>& computed) {
    const std::size_t storedCount = stored.size();
    for (const Suspect& c : computed) {
        const bool repeats = std::any_of(stored.begin(), stored.begin() + static_cast<std::ptrdiff_t>(storedCount),
                                         [&](const Suspect& s) {
                                             return s.name == c.name && s.startSeconds <= c.endSeconds &&
                                                    c.startSeconds <= s.endSeconds;
                                         });
        if (!repeats) stored.push_back(c);
    }
    return stored;
}

}  // namespace earmark
