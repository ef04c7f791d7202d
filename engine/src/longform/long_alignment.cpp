#include "earmark/longform/long_alignment.hpp"

#include "earmark/acoustic/model_aligner.hpp"

#include "earmark/align/reference_tiers.hpp"
#include "earmark/core/error.hpp"
#include "earmark/level/energy.hpp"
#include "earmark/longform/text_outline.hpp"
#include "earmark/prosody/speech_activity.hpp"
#include "earmark/prosody/syllables.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

namespace earmark {
namespace {

constexpr double kLastChunkFactor = 1.25;      // the last chunk's audio: expected length × this …
constexpr double kLastChunkSlackSeconds = 3.0;  // … + this

struct Sentence {
    std::string text;
    std::size_t paragraph = 0;
    int syllables = 1;
    std::size_t firstToken = 0, endToken = 0;  // into the token list
};

struct Token {
    std::string label;
    std::size_t sentence = 0;
};

std::string excerpt(const std::string& s) {
    return "'" + (s.size() > 40 ? s.substr(0, 37) + "..." : s) + "'";
}

std::string seconds(double s) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.1f s", s);
    return buf;
}

// Speech seconds of the take in [a, b).
double speechIn(const SpeechActivity& speech, double a, double b) {
    const double hop = speech.hopSeconds;
    double total = 0;
    for (std::size_t i = 0; i < speech.speech.size(); ++i) {
        const double t = static_cast<double>(i) * hop;
        if (t >= a && t < b && speech.speech[i]) total += hop;
    }
    return total;
}

// The middle of the pause nearest to t after `after`, or the end of the
// speech (+ 0.3 s) when that is nearer; t itself when there is neither.
double nearestPauseMiddle(const SpeechActivity& speech, double t, double after) {
    double best = t, distance = INFINITY;
    if (speech.speechEndS) {
        best = std::min(speech.durationS, *speech.speechEndS + 0.3);
        distance = std::fabs(best - t);
    }
    for (const Pause& p : speech.pauses) {
        const double m = 0.5 * (p.startS + p.endS);
        if (m > after && std::fabs(m - t) < distance) {
            distance = std::fabs(m - t);
            best = m;
        }
    }
    return best;
}

}  // namespace

void LongAlignParams::validate() const {
    const auto check = [](bool ok, const char* field, const char* problem) {
        if (!ok) throw ParamError(std::string("LongAlignParams.") + field, problem);
    };
    check(chunkTargetSeconds >= 5 && chunkTargetSeconds <= 600, "chunkTargetSeconds", "must be 5…600 s");
    check(lookaheadSentences >= 0 && lookaheadSentences <= 10, "lookaheadSentences", "must be 0…10");
    check(spanFactor >= 0.5 && spanFactor <= 4, "spanFactor", "must be 0.5…4");
    check(spanSlackSeconds >= 0 && spanSlackSeconds <= 60, "spanSlackSeconds", "must be 0…60 s");
    check(initialSecondsPerSyllable > 0 && initialSecondsPerSyllable <= 2, "initialSecondsPerSyllable",
          "must be in (0, 2] s");
    check(maxUncoveredSeconds > 0 && std::isfinite(maxUncoveredSeconds), "maxUncoveredSeconds", "must be positive");
}

ChunkAligner referenceWarpingAligner(const AlignParams& params) {
    return [params](const Signal& audio, const std::string& text, Progress progress) {
        return alignText(audio, text, params, progress);
    };
}

ChunkAligner modelChunkAligner(const std::string& voice) {
    return [voice](const Signal& audio, const std::string& text, Progress progress) {
        return alignWithModelOrReference(audio, text, voice, progress);
    };
}

ChunkAligner chunkAlignerFor(const std::string& method, const std::string& voice) {
    if (method == "model") return modelChunkAligner(voice);
    if (method == "reference") {
        AlignParams params;
        params.speech.voice = voice;
        return referenceWarpingAligner(params);
    }
    throw ParamError("method", "expects model or reference, not '" + method + "'");
}

LongAlignResult alignLongText(const Signal& take, const std::string& text, const ChunkAligner& aligner,
                              const LongAlignParams& params, Progress progress) {
    params.validate();
    if (!aligner) throw ParamError("alignLongText.aligner", "is empty");
    const TextOutline outline = outlineText(text);
    std::vector<Sentence> sentences;
    std::vector<Token> tokens;
    for (std::size_t p = 0; p < outline.paragraphs.size(); ++p)
        for (const TextSentence& ts : outline.paragraphs[p].sentences) {
            Sentence s;
            s.text = ts.text;
            s.paragraph = p;
            s.syllables = std::max(1, countSyllablesInText(ts.text));
            s.firstToken = tokens.size();
            std::istringstream words(ts.text);
            std::string token;
            while (words >> token) tokens.push_back({tokenLabel(token), sentences.size()});
            s.endToken = tokens.size();
            sentences.push_back(std::move(s));
        }
    if (sentences.empty()) throw InputError("text", "has no words to align");

    const double duration = take.durationSeconds();
    EnergyParams energyParams;
    energyParams.hopSeconds = 0.01;
    const SpeechActivity speech = detectSpeech(analyseEnergy(take, energyParams), duration);
    if (!speech.hasSpeech()) throw InputError("audio", "has no speech (silence or steady noise)");

    LongAlignResult result;
    result.tiers.durationS = duration;
    Tier words{std::string(kWordsTier), {}}, phones{std::string(kPhonesTier), {}};
    std::vector<double> sentenceStart(sentences.size(), NAN), sentenceEnd(sentences.size(), NAN);

    const double firstAnchor = std::max(0.0, *speech.speechStartS - 0.2);
    double anchor = firstAnchor;
    double secondsPerSyllable = params.initialSecondsPerSyllable;
    int syllablesDone = 0;
    std::size_t s = 0;
    while (s < sentences.size()) {
        // The chunk: whole sentences up to about the target length.
        std::size_t e = s;
        int chunkSyllables = 0;
        while (e < sentences.size() && (e == s || chunkSyllables * secondsPerSyllable < params.chunkTargetSeconds))
            chunkSyllables += sentences[e++].syllables;
        const std::size_t look = std::min(sentences.size(), e + static_cast<std::size_t>(params.lookaheadSentences));
        int lookSyllables = 0;
        for (std::size_t k = e; k < look; ++k) lookSyllables += sentences[k].syllables;

        if (speechIn(speech, anchor, duration) < 0.5)
            throw InputError("text", "is longer than the take: no speech is left for sentence " + std::to_string(s + 1) +
                                         " " + excerpt(sentences[s].text) + " and after");
        const double expected = (chunkSyllables + lookSyllables) * secondsPerSyllable;
        // The last chunk has no sentences after it to soak up the error: it gets a margin instead.
        const bool last = look == sentences.size();
        const double reach = last ? expected * kLastChunkFactor + kLastChunkSlackSeconds
                                  : expected * params.spanFactor + params.spanSlackSeconds;
        const double spanEnd = std::min(duration, nearestPauseMiddle(speech, anchor + reach, anchor + 1.0));
        Signal part;
        part.sampleRate = take.sampleRate;
        const auto a = static_cast<std::size_t>(std::llround(anchor * take.sampleRate));
        const auto b = std::min(take.size(), static_cast<std::size_t>(std::llround(spanEnd * take.sampleRate)));
        part.samples.assign(take.samples.begin() + static_cast<std::ptrdiff_t>(a),
                            take.samples.begin() + static_cast<std::ptrdiff_t>(b));
        std::string chunkText;
        for (std::size_t k = s; k < look; ++k) chunkText += (k > s ? " " : "") + sentences[k].text;

        AlignResult aligned;
        try {
            aligned = aligner(part, chunkText, progress.sub(anchor / duration, std::min(1.0, spanEnd / duration)));
        } catch (const InputError& err) {
            throw InputError("text", "sentences " + std::to_string(s + 1) + "–" + std::to_string(e) + " (from " +
                                         excerpt(sentences[s].text) + ") at " + seconds(anchor) + ": " + err.problem());
        }
        ++result.chunks;
        result.referenceChunks += aligned.method == "reference";
        // Match the aligner's words to the text's tokens in order; keep the chunk's own.
        const Tier* got = aligned.tiers.find(kWordsTier);
        std::size_t token = sentences[s].firstToken;
        const std::size_t chunkEndToken = sentences[e - 1].endToken, lookEndToken = sentences[look - 1].endToken;
        double lastEnd = NAN;
        if (got)
            for (const Interval& w : got->intervals) {
                std::size_t t = token;
                while (t < lookEndToken && tokens[t].label != w.label) ++t;
                if (t >= lookEndToken) continue;  // not a word of this text: leave it out
                token = t + 1;
                if (t >= chunkEndToken) break;
                Interval shifted = w;
                shifted.startS += anchor;
                shifted.endS += anchor;
                words.intervals.push_back(shifted);
                const std::size_t si = tokens[t].sentence;
                if (std::isnan(sentenceStart[si])) sentenceStart[si] = shifted.startS;
                sentenceEnd[si] = shifted.endS;
                lastEnd = shifted.endS;
            }
        if (std::isnan(lastEnd))
            throw InputError("text", "sentences " + std::to_string(s + 1) + "–" + std::to_string(e) + " (from " +
                                         excerpt(sentences[s].text) + ") could not be placed after " + seconds(anchor));
        if (const Tier* ph = aligned.tiers.find(kPhonesTier))
            for (const Interval& p : ph->intervals) {
                if (p.startS + anchor >= lastEnd) break;
                Interval shifted = p;
                shifted.startS += anchor;
                shifted.endS = std::min(p.endS + anchor, lastEnd);
                if (shifted.endS > shifted.startS) phones.intervals.push_back(shifted);
            }
        syllablesDone += chunkSyllables;
        anchor = lastEnd;
        secondsPerSyllable = std::max(0.02, (anchor - firstAnchor) / syllablesDone);
        s = e;
        progress.report(std::min(1.0, anchor / duration));
    }

    // Speech after the last word: the text stops short of the take.
    const double uncovered = speechIn(speech, anchor + 0.3, duration);
    if (uncovered > params.maxUncoveredSeconds)
        throw InputError("text", "covers only the take's first " + seconds(anchor) + ": " + seconds(uncovered) +
                                     " of speech follow its last word");

    Tier paragraphs{std::string(kParagraphsTier), {}}, sentenceTier{std::string(kSentencesTier), {}};
    for (std::size_t i = 0; i < sentences.size(); ++i) {
        if (std::isnan(sentenceStart[i])) continue;  // no word of it was placed
        sentenceTier.intervals.push_back({sentenceStart[i], sentenceEnd[i], sentences[i].text, std::nullopt});
        auto& ps = paragraphs.intervals;
        const bool same = i > 0 && sentences[i - 1].paragraph == sentences[i].paragraph && !ps.empty();
        if (same) ps.back().endS = sentenceEnd[i];
        else ps.push_back({sentenceStart[i], sentenceEnd[i], sentences[i].text, std::nullopt});
    }
    double confidence = 0;
    int counted = 0;
    for (const Interval& w : words.intervals)
        if (w.confidence) {
            confidence += *w.confidence;
            ++counted;
        }
    result.meanConfidence = counted ? confidence / counted : 0.0;
    if (result.referenceChunks == 0) result.method = "model";
    else if (result.referenceChunks == result.chunks) result.method = "reference";
    else
        result.method = "model, reference for " + std::to_string(result.referenceChunks) + " of " +
                        std::to_string(result.chunks) + " chunks";
    result.tiers.tiers = {std::move(paragraphs), std::move(sentenceTier), std::move(words), std::move(phones)};
    progress.report(1.0);
    return result;
}

}  // namespace earmark
