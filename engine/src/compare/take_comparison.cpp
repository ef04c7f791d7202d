#include "earmark/compare/take_comparison.hpp"

#include "earmark/align/reference_tiers.hpp"
#include "earmark/align/speech_span.hpp"
#include "earmark/compare/mcd.hpp"
#include "earmark/core/error.hpp"
#include "earmark/prosody/word_measures.hpp"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <limits>

namespace earmark {
namespace {

const char* sideName(int side) { return side == 0 ? "A" : "B"; }
std::string wordsSubject(int side) { return side == 0 ? "wordsA" : "wordsB"; }

// A word's label for matching: without surrounding punctuation, ASCII letters lower-cased.
std::string matchLabel(const std::string& label) {
    std::string s = tokenLabel(label);
    for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return s;
}

void checkSameWords(const Tier& a, const Tier& b) {
    const auto& wa = a.intervals;
    const auto& wb = b.intervals;
    if (wa.size() != wb.size())
        throw InputError("wordsB", "has " + std::to_string(wb.size()) + " words, take A has " +
                                       std::to_string(wa.size()) + ": the pair must say the same words");
    for (std::size_t i = 0; i < wa.size(); ++i)
        if (matchLabel(wa[i].label) != matchLabel(wb[i].label))
            throw InputError("wordsB", "word " + std::to_string(i + 1) + " is '" + wb[i].label + "' but take A has '" +
                                           wa[i].label + "' there: the pair must say the same words");
}

// The first `dims` coefficients, each with its mean over the take removed.
FeatureMatrix pathFeatures(const FeatureMatrix& c, int dims) {
    FeatureMatrix out;
    out.frames = c.frames;
    out.dims = dims;
    out.hopSeconds = c.hopSeconds;
    out.values.resize(static_cast<std::size_t>(c.frames) * dims);
    std::vector<double> mean(static_cast<std::size_t>(dims), 0.0);
    for (int f = 0; f < c.frames; ++f)
        for (int d = 0; d < dims; ++d) mean[d] += c.row(f)[d];
    for (double& m : mean) m /= std::max(1, c.frames);
    for (int f = 0; f < c.frames; ++f)
        for (int d = 0; d < dims; ++d) out.row(f)[d] = c.row(f)[d] - static_cast<float>(mean[d]);
    return out;
}

std::size_t pitchFrameAt(const PitchTrack& p, double t) {
    const auto i = static_cast<long>(std::lround(t / p.hopSeconds));
    return static_cast<std::size_t>(std::clamp<long>(i, 0, static_cast<long>(p.size()) - 1));
}

struct SideWork {
    const TakeInput* input = nullptr;
    TakeSide side;
    EnergyTrack energy;
    FeatureMatrix cepstra;
};

void findWordsFromText(SideWork& w, int index, const std::string& text, const AlignParams& params, Progress progress) {
    try {
        AlignResult r = alignText(w.input->audio, text, params, progress);
        w.side.words = *r.tiers.find(kWordsTier);
        w.side.wordSource = WordSource::FromText;
    } catch (const InputError& e) {
        if (e.subject() == "audio") throw InputError(sideName(index), e.problem());
        throw;
    }
}

void setSpeechSpan(SideWork& w, int index) {
    if (!w.side.words.intervals.empty()) {
        w.side.speechStartS = w.side.words.intervals.front().startS;
        w.side.speechEndS = w.side.words.intervals.back().endS;
        return;
    }
    const SpeechSpan span = findSpeechSpan(w.input->audio);
    if (!span.found) throw InputError(sideName(index), "holds no speech (silence or steady noise)");
    w.side.speechStartS = span.startS;
    w.side.speechEndS = span.endS;
}

std::vector<WordMeasures> measure(const SideWork& w, const std::string& text, const ProsodyParams& params) {
    TierSet tiers;
    tiers.durationS = w.side.durationS;
    tiers.tiers.push_back(w.side.words);
    const ProsodyContext context(w.side.pitch, w.energy, w.side.durationS, transcriptFrom(tiers, text), params);
    return measureWords(context);
}

}  // namespace

const char* wordSourceName(WordSource s) {
    switch (s) {
    case WordSource::None: return "none";
    case WordSource::Given: return "given";
    case WordSource::FromText: return "text";
    case WordSource::Carried: return "carried";
    }
    return "none";
}

void CompareParams::validate() const {
    cepstra.validate();
    if (cepstra.coefficients < 2)
        throw ParamError("CompareParams.cepstra.coefficients", "MCD needs at least c0 and c1");
    if (dtwCoefficients < 1 || dtwCoefficients > cepstra.coefficients)
        throw ParamError("CompareParams.dtwCoefficients", "must be 1 … cepstra.coefficients");
    alignment.validate();
    text.validate();
    pitch.validate();
    prosody.validate();
    flags.validate();
    if (!(energy.hopSeconds > 0)) throw ParamError("CompareParams.energy.hopSeconds", "must be positive");
    if (!(energy.windowSeconds > 0)) throw ParamError("CompareParams.energy.windowSeconds", "must be positive");
}

TakeComparison compareTakes(const TakeInput& a, const TakeInput& b, const std::string& text,
                            const CompareParams& params, Progress progress) {
    params.validate();
    SideWork work[2];
    work[0].input = &a;
    work[1].input = &b;
    for (int s = 0; s < 2; ++s) {
        const Signal& audio = work[s].input->audio;
        if (!(audio.sampleRate > 0)) throw ParamError("Signal.sampleRate", "must be positive");
        if (audio.empty()) throw InputError(sideName(s), "is empty");
        work[s].side.durationS = audio.durationSeconds();
        if (const auto& given = work[s].input->words) {
            TierSet set;
            set.tiers.push_back(*given);
            set.tiers.back().name = std::string(kWordsTier);
            validateTierSet(set, wordsSubject(s), work[s].side.durationS);
            work[s].side.words = set.tiers.back();
            work[s].side.wordSource = set.tiers.back().intervals.empty() ? WordSource::None : WordSource::Given;
        }
    }

    // Tracks and cepstra of each take.
    for (int s = 0; s < 2; ++s) {
        SideWork& w = work[s];
        const double base = 0.2 * s;
        w.side.pitch = analysePitch(w.input->audio, params.pitch, progress.sub(base, base + 0.12));
        w.side.pitchSummary = summarisePitch(w.side.pitch);
        w.energy = analyseEnergy(w.input->audio, params.energy, progress.sub(base + 0.12, base + 0.14));
        w.cepstra = mcdCepstra(w.input->audio, params.cepstra, progress.sub(base + 0.14, base + 0.2));
        if (w.cepstra.frames < 2) throw InputError(sideName(s), "is too short to compare");
    }

    TakeComparison out;
    // Words from the text for takes without timings.
    const bool haveText =
        std::any_of(text.begin(), text.end(), [](char c) { return !std::isspace(static_cast<unsigned char>(c)); });
    for (int s = 0; s < 2; ++s) {
        if (work[s].side.wordSource != WordSource::None || !haveText) continue;
        findWordsFromText(work[s], s, text, params.text, progress.sub(0.4 + 0.2 * s, 0.6 + 0.2 * s));
        out.notes.push_back(std::string("take ") + sideName(s) + "'s words aligned from the text (reference voice " +
                            params.text.speech.voice + ")");
    }
    for (int s = 0; s < 2; ++s) setSpeechSpan(work[s], s);

    // The alignment.
    const FeatureMatrix pa = pathFeatures(work[0].cepstra, params.dtwCoefficients);
    const FeatureMatrix pb = pathFeatures(work[1].cepstra, params.dtwCoefficients);
    const bool wordsA = !work[0].side.words.intervals.empty(), wordsB = !work[1].side.words.intervals.empty();
    const Progress alignProgress = progress.sub(0.8, 0.95);
    if (wordsA && wordsB) {
        checkSameWords(work[0].side.words, work[1].side.words);
        out.alignment =
            alignWordByWord(pa, pb, work[0].side.words, work[1].side.words, params.alignment, alignProgress);
        out.notes.push_back("aligned word by word (" + std::to_string(work[0].side.words.intervals.size()) +
                            " words), warped inside each word");
    } else {
        out.alignment =
            alignFrameWise(pa, pb, work[0].side.speechStartS, work[0].side.speechEndS, work[1].side.speechStartS,
                           work[1].side.speechEndS, params.alignment, alignProgress);
        if (wordsA || wordsB) {
            const int from = wordsA ? 0 : 1, to = 1 - from;
            work[to].side.words = carryTier(work[from].side.words, out.alignment, work[to].side.durationS, from == 1);
            work[to].side.wordSource = WordSource::Carried;
            out.notes.push_back(std::string("aligned frame-wise over the speech; take ") + sideName(to) +
                                "'s words carried from take " + sideName(from) + " through that alignment");
        } else {
            out.notes.push_back("no word timings and no text: compared frame-wise over the speech, no per-word table");
        }
    }

    // Figures over the aligned pairs.
    const std::vector<double> mcd = mcdPerPairDb(work[0].cepstra, work[1].cepstra, out.alignment.pairs);
    const double hop = out.alignment.hopSeconds;
    double mcdSum = 0.0, f0Sum = 0.0, f0AbsSum = 0.0;
    int voiced = 0;
    out.pairMcdDb.reserve(mcd.size());
    out.pairF0DiffSt.reserve(mcd.size());
    for (std::size_t k = 0; k < out.alignment.pairs.size(); ++k) {
        const FramePair& p = out.alignment.pairs[k];
        mcdSum += mcd[k];
        out.pairMcdDb.push_back(static_cast<float>(mcd[k]));
        const PitchTrack& fa = work[0].side.pitch;
        const PitchTrack& fb = work[1].side.pitch;
        float diff = std::numeric_limits<float>::quiet_NaN();
        if (fa.size() > 0 && fb.size() > 0) {
            const float f0a = fa.f0Hz[pitchFrameAt(fa, p.a * hop)], f0b = fb.f0Hz[pitchFrameAt(fb, p.b * hop)];
            if (f0a > 0 && f0b > 0) {
                const double st = 12.0 * std::log2(static_cast<double>(f0b) / f0a);
                diff = static_cast<float>(st);
                f0Sum += st;
                f0AbsSum += std::abs(st);
                ++voiced;
            }
        }
        out.pairF0DiffSt.push_back(diff);
    }
    OverallFigures& o = out.overall;
    o.alignedPairs = static_cast<int>(out.alignment.pairs.size());
    o.voicedPairs = voiced;
    o.mcdDb = mcdSum / std::max(1, o.alignedPairs);
    if (voiced > 0) o.f0MeanDiffSt = f0Sum / voiced, o.f0MeanAbsDiffSt = f0AbsSum / voiced;
    // Ranges over the same (paired, voiced in both) frames, so frames only one
    // take voices do not move a percentile.
    PitchTrack pairedA, pairedB;
    for (std::size_t k = 0; k < out.alignment.pairs.size(); ++k) {
        if (std::isnan(out.pairF0DiffSt[k])) continue;
        const FramePair& p = out.alignment.pairs[k];
        pairedA.f0Hz.push_back(work[0].side.pitch.f0Hz[pitchFrameAt(work[0].side.pitch, p.a * hop)]);
        pairedB.f0Hz.push_back(work[1].side.pitch.f0Hz[pitchFrameAt(work[1].side.pitch, p.b * hop)]);
    }
    const auto ra = summarisePitch(pairedA).rangeSemitones, rb = summarisePitch(pairedB).rangeSemitones;
    if (ra && rb) o.f0RangeDiffSt = *rb - *ra;
    const double spanA = work[0].side.speechEndS - work[0].side.speechStartS;
    const double spanB = work[1].side.speechEndS - work[1].side.speechStartS;
    o.durationRatio = spanB / std::max(spanA, hop);

    // The per-word table.
    const std::size_t na = work[0].side.words.intervals.size(), nb = work[1].side.words.intervals.size();
    if (na > 0 && na == nb)
        out.words =
            compareWords(measure(work[0], text, params.prosody), measure(work[1], text, params.prosody), params.flags);
    else if (na != nb)
        out.notes.push_back("only " + std::to_string(std::min(na, nb)) + " of " + std::to_string(std::max(na, nb)) +
                            " words could be carried (the other take ends first): no per-word table");
    out.a = std::move(work[0].side);
    out.b = std::move(work[1].side);
    progress.report(1.0);
    return out;
}

}  // namespace earmark
