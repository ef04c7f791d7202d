#include "earmark/acoustic/word_evidence.hpp"

#include "earmark/acoustic/model_features.hpp"
#include "earmark/acoustic/pronunciation_score.hpp"
#include "earmark/acoustic/senone_scorer.hpp"
#include "earmark/core/error.hpp"
#include "earmark/level/energy.hpp"
#include "earmark/prosody/speech_activity.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <memory>
#include <mutex>

namespace earmark {
namespace {

std::shared_ptr<const AcousticModel> sharedModel(const std::filesystem::path& folder) {
    static std::mutex mutex;
    static std::map<std::string, std::shared_ptr<const AcousticModel>> cache;
    std::lock_guard lock(mutex);
    auto& slot = cache[folder.string()];
    if (!slot) slot = std::make_shared<const AcousticModel>(AcousticModel::load(folder));
    return slot;
}

// Frame-weighted median over the path's phones of (best context-free state
// score − the path's score) per frame, nats/frame: 0 where the script's
// phones are the best explanation of the frames. Only phones over sound
// count (most frames best explained by a phone that is not silence or
// filler): script words forced onto silence measure a missing word, not the voice.
double typicalMismatch(const AcousticModel& model, const ForcedAlignment& path, const std::vector<float>& contextFree) {
    const std::size_t perFrame = static_cast<std::size_t>(model.basePhoneCount()) * AcousticModel::kStates;
    std::vector<std::pair<double, std::size_t>> gaps;  // per phone: gap per frame, frames
    std::size_t total = 0;
    for (const PathSegment& s : path.path) {
        if (s.kind != PathSegment::Kind::Phone || s.endFrame <= s.startFrame) continue;
        double best = 0;
        std::size_t sounding = 0;
        for (std::size_t t = s.startFrame; t < s.endFrame; ++t) {
            const auto first = contextFree.begin() + static_cast<std::ptrdiff_t>(t * perFrame);
            const auto top = std::max_element(first, first + static_cast<std::ptrdiff_t>(perFrame));
            best += *top;
            sounding += !model.isFiller(static_cast<int>(top - first) / AcousticModel::kStates);
        }
        const std::size_t frames = s.endFrame - s.startFrame;
        if (sounding * 2 <= frames) continue;
        gaps.emplace_back(std::max(0.0, (best - s.logLikelihood) / static_cast<double>(frames)), frames);
        total += frames;
    }
    if (gaps.empty()) return 0.0;
    std::sort(gaps.begin(), gaps.end());
    std::size_t seen = 0;
    for (const auto& [gap, frames] : gaps)
        if ((seen += frames) * 2 >= total) return gap;
    return gaps.back().first;
}

// Speech that stops less than this before the take's end was cut off, not finished.
constexpr double kCutMarginSeconds = 0.05;

// Where the take has speech by its energy (25 ms frames every 10 ms; a frame
// is speech within the silence threshold of speech_activity.hpp, before any
// bridging), independent of the acoustic model.
class SpeechHeard {
public:
    explicit SpeechHeard(const Signal& take) {
        EnergyParams params;
        params.hopSeconds = 0.01;
        energy_ = analyseEnergy(take, params);
        activity_ = detectSpeech(energy_, take.durationSeconds());
    }
    // The first and last speech frame's edges within [a, b), or nothing.
    std::optional<std::pair<double, double>> speechWithin(double a, double b) const {
        const double hop = activity_.hopSeconds;
        std::optional<std::pair<double, double>> out;
        if (!(hop > 0)) return out;
        for (std::size_t i = 0; i < activity_.rawSpeech.size(); ++i) {
            const double centre = (static_cast<double>(i) + 0.5) * hop;
            if (centre < a || centre >= b || !activity_.rawSpeech[i]) continue;
            if (!out) out = std::pair{centre - 0.5 * hop, centre + 0.5 * hop};
            else out->second = centre + 0.5 * hop;
        }
        return out;
    }

    // Per feature frame: the pause penalty (WordEvidenceParams::loudPausePenalty) for the
    // energy frame nearest the feature frame's centre.
    std::vector<float> pausePenalties(const ModelFeatures& features, double fullPenalty) const {
        std::vector<float> out(features.frames, 0.0f);
        const double hop = activity_.hopSeconds;
        if (!(hop > 0) || energy_.db.empty() || !activity_.hasSpeech()) return out;
        for (std::size_t i = 0; i < features.frames; ++i) {
            const auto e = std::min(energy_.db.size() - 1,
                                    static_cast<std::size_t>(std::lround(features.frameCentre(i) / hop)));
            const double below = activity_.speechLevelDb - energy_.db[e];
            const double share = std::clamp((kQuietPauseDb - below) / (kQuietPauseDb - kLoudPauseDb), 0.0, 1.0);
            out[i] = static_cast<float>(share * fullPenalty);
        }
        return out;
    }

private:
    static constexpr double kLoudPauseDb = 4.0;   // below the speech level: full penalty
    static constexpr double kQuietPauseDb = 8.0;  // below the speech level: none
    EnergyTrack energy_;
    SpeechActivity activity_;
};

// The median score of the words said (0 for none).
double medianWordScore(const std::vector<WordEvidence>& words) {
    std::vector<double> scores;
    for (const WordEvidence& w : words)
        if (w.spoken) scores.push_back(w.score);
    if (scores.empty()) return 0.0;
    std::nth_element(scores.begin(), scores.begin() + static_cast<std::ptrdiff_t>(scores.size() / 2), scores.end());
    return scores[scores.size() / 2];
}

// Which of `candidates` (script words) an unscripted stretch repeats: the one
// whose phones, forced through the stretch, score best against the free
// phone loop (pronunciation_score.hpp), if that is at least `limit`; -1 for none.
int repeatedWord(const AcousticModel& model, const std::vector<float>& contextFree,
                 const std::vector<ScriptWord>& script, const std::vector<int>& candidates, std::size_t start,
                 std::size_t end, double limit, const WordEvidenceParams& params) {
    int best = -1;
    double bestScore = limit;
    for (int k : candidates)
        for (const PhoneSequence& phones : script[static_cast<std::size_t>(k)].pronunciations) {
            const double score = scorePhones(model, contextFree, phones, start, end, params.insertionPenalty).score;
            if (score >= bestScore) {
                bestScore = score;
                best = k;
            }
        }
    return best;
}

double roundMs(double s) { return std::round(s * 1000.0) / 1000.0; }

std::string quoteWords(const std::vector<std::string>& words) {
    std::string out;
    for (std::size_t i = 0; i < words.size(); ++i) out += (i ? " " : "") + words[i];
    return "'" + out + "'";
}

std::string secondsText(double s) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.2f s", s);
    return buf;
}

}  // namespace

void WordEvidenceParams::validate() const {
    search.validate();
    if (!(insertionPenalty >= 0) || !std::isfinite(insertionPenalty))
        throw ParamError("WordEvidenceParams.insertionPenalty", "must be a finite number >= 0");
    if (!(minExtraSeconds >= 0) || !std::isfinite(minExtraSeconds))
        throw ParamError("WordEvidenceParams.minExtraSeconds", "must be a finite number >= 0");
    if (!(repeatMargin >= 0) || !std::isfinite(repeatMargin))
        throw ParamError("WordEvidenceParams.repeatMargin", "must be a finite number >= 0 (nats/frame)");
    if (!(referenceMismatch > 0) || !std::isfinite(referenceMismatch))
        throw ParamError("WordEvidenceParams.referenceMismatch", "must be > 0");
    if (!(loudPausePenalty >= 0) || !std::isfinite(loudPausePenalty))
        throw ParamError("WordEvidenceParams.loudPausePenalty", "must be a finite number >= 0 (nats/frame)");
    if (!(confidenceScale > 0) || !std::isfinite(confidenceScale))
        throw ParamError("WordEvidenceParams.confidenceScale", "must be > 0");
    if (voice.empty()) throw ParamError("WordEvidenceParams.voice", "is empty");
}

const char* coverageKindName(CoverageFinding::Kind kind) {
    switch (kind) {
        case CoverageFinding::Kind::Skipped: return "skipped";
        case CoverageFinding::Kind::Repeated: return "repeated";
        case CoverageFinding::Kind::Extra: return "extra";
        case CoverageFinding::Kind::EarlyEnd: return "early-end";
        case CoverageFinding::Kind::Substituted: return "substituted";
    }
    return "?";
}

bool modelCoversVoice(const std::string& voice) {
    if (!AcousticModel::installedEnglishModel() || !AcousticModel::installedEnglishDictionary()) return false;
    std::string v = voice.substr(0, voice.find('+'));
    for (char& c : v) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return v == "en" || v.rfind("en-", 0) == 0;
}

WordEvidenceResult gatherWordEvidence(const Signal& take, const std::string& text, const WordEvidenceParams& params,
                                      Progress progress) {
    params.validate();
    const auto folder = params.modelFolder ? params.modelFolder : AcousticModel::installedEnglishModel();
    const auto dictPath = params.dictionary ? params.dictionary : AcousticModel::installedEnglishDictionary();
    if (!folder) throw InputError("acoustic model", "not installed (Debian package pocketsphinx-en-us)");
    if (!dictPath) throw InputError("pronouncing dictionary", "not installed (Debian package pocketsphinx-en-us)");
    const auto model = sharedModel(*folder);
    const auto dictionary = sharedDictionary(*dictPath, *model);
    progress.report(0.02);

    const std::vector<ScriptWord> script = scriptWords(text, *dictionary, *model, params.voice);
    const ModelFeatures features = computeModelFeatures(take, model->frontEnd(), progress.sub(0.02, 0.1));
    std::vector<float> contextFree;
    // Pass 1, the script as written: how far the take's voice lies from the
    // model where it says the script. Pass 2 lets the garbage unit win only
    // where the take fits worse than that by the garbage penalty, so a voice
    // the model fits loosely (a formant synthesiser) is not read as unscripted speech.
    const SpeechHeard heard(take);
    ForcedAlignmentParams plain = params.search;
    plain.coverage = false;
    plain.pauseFramePenalty = heard.pausePenalties(features, params.loudPausePenalty);
    // Pass 2 visits mostly the Gaussians pass 1 evaluated: keep them (bounded memory).
    CodebookTopCache codebooks(*model, features.frames, SenoneScorer::kDefaultTopDensities);
    plain.codebookCache = &codebooks;
    const ForcedAlignment first = forceAlign(*model, features, script, contextFree, plain, progress.sub(0.1, 0.45));
    ForcedAlignmentParams search = plain;
    search.coverage = params.search.coverage;
    search.contextFreeGiven = true;  // pass 1 filled contextFree from the same features
    const double mismatch = typicalMismatch(*model, first, contextFree);
    search.garbageFramePenalty += mismatch;
    // Score differences between competing paths grow with the mismatch: the
    // penalties, set for voices within referenceMismatch, grow with it.
    const double scale = std::max(1.0, mismatch / params.referenceMismatch);
    for (double* penalty : {&search.skipPenalty, &search.repeatPenalty, &search.extraPenalty, &search.earlyEndPenalty})
        *penalty *= scale;
    const ForcedAlignment path = forceAlign(*model, features, script, contextFree, search, progress.sub(0.45, 0.85));
    if (!path.reachedEnd) throw InputError("audio", "could not be aligned to the text (no path through the model)");

    const double hop = features.hopSeconds;
    const double takeEnd = take.durationSeconds();
    // The recogniser's convention: a stretch starting at frame f starts at f · hop.
    const auto timeOf = [&](std::size_t frame) { return roundMs(std::min(takeEnd, static_cast<double>(frame) * hop)); };

    WordEvidenceResult out;
    out.tiers.durationS = takeEnd;
    out.logLikelihoodPerFrame = path.logLikelihood / static_cast<double>(std::max<std::size_t>(1, features.frames));
    out.words.resize(script.size());
    for (std::size_t k = 0; k < script.size(); ++k) {
        out.words[k].label = script[k].label;
        out.words[k].index = k;
        out.words[k].guessed = script[k].guessed;
        if (script[k].guessed) out.guessedWords.push_back(script[k].label);
    }

    // Walk the path: visits of words (a run of its phones from the first).
    std::size_t i = 0;
    const auto& segs = path.path;
    int lastSpokenWord = -1;
    std::size_t lastSpeechEnd = 0;
    struct ExtraStretch {
        std::size_t startFrame, endFrame;
        int lastSpoken;  // the script word said last before it (-1: none)
    };
    std::vector<ExtraStretch> extras;
    bool endedInsideWord = false;
    while (i < segs.size()) {
        const PathSegment& s = segs[i];
        if (s.kind == PathSegment::Kind::Pause) {
            ++i;
            continue;
        }
        if (s.kind == PathSegment::Kind::Extra) {
            // Judged once every word's first visit is scored (a repeat is measured against them).
            extras.push_back({s.startFrame, s.endFrame, lastSpokenWord});
            lastSpeechEnd = s.endFrame;
            ++i;
            continue;
        }
        // A visit of word s.word.
        const int k = s.word;
        const std::size_t pronLength = script[static_cast<std::size_t>(k)].pronunciations[static_cast<std::size_t>(s.pronunciation)].size();
        std::size_t j = i;
        while (j < segs.size() && segs[j].kind == PathSegment::Kind::Phone && segs[j].word == k &&
               segs[j].phoneInWord == static_cast<int>(j - i))
            ++j;
        const bool complete = j - i == pronLength;
        WordEvidence& w = out.words[static_cast<std::size_t>(k)];
        ++w.occurrences;
        if (w.occurrences == 2) {
            CoverageFinding f;
            f.kind = CoverageFinding::Kind::Repeated;
            f.words = {w.label};
            f.startS = timeOf(segs[i].startFrame);
            f.endS = timeOf(segs[j - 1].endFrame);
            f.detail = "'" + w.label + "' said again at " + secondsText(f.startS);
            out.coverage.push_back(std::move(f));
        }
        if (w.occurrences == 1) {
            w.spoken = true;
            w.complete = complete;
            w.startS = timeOf(segs[i].startFrame);
            w.endS = timeOf(segs[j - 1].endFrame);
            double weighted = 0;
            std::size_t frames = 0;
            for (std::size_t m = i; m < j; ++m) {
                const PathSegment& ps = segs[m];
                const PhoneScore sc = scorePhone(*model, contextFree, ps.basePhone, ps.startFrame, ps.endFrame,
                                                 params.insertionPenalty);
                PhoneEvidence pe;
                pe.expected = model->basePhoneName(ps.basePhone);
                for (int p : sc.heard) pe.heard.push_back(model->basePhoneName(p));
                pe.startS = timeOf(ps.startFrame);
                pe.endS = timeOf(ps.endFrame);
                pe.score = sc.score;
                weighted += sc.score * static_cast<double>(ps.endFrame - ps.startFrame);
                frames += ps.endFrame - ps.startFrame;
                w.phones.push_back(pe);
            }
            w.score = frames ? weighted / static_cast<double>(frames) : 0.0;
            w.confidence = std::clamp(1.0 + w.score / params.confidenceScale, 0.0, 1.0);
        }
        lastSpokenWord = std::max(lastSpokenWord, k);
        lastSpeechEnd = segs[j - 1].endFrame;
        endedInsideWord = !complete;
        i = j;
    }
    // Unscripted stretches: a repetition of the word said before it, or of the next word when that
    // word is said after it; else speech that is not in the script.
    const double repeatLimit = medianWordScore(out.words) - params.repeatMargin;
    for (const ExtraStretch& x : extras) {
        if (static_cast<double>(x.endFrame - x.startFrame) * hop < params.minExtraSeconds) continue;
        CoverageFinding f;
        f.startS = timeOf(x.startFrame);
        f.endS = timeOf(x.endFrame);
        std::vector<int> candidates;
        if (x.lastSpoken >= 0) candidates.push_back(x.lastSpoken);
        if (x.lastSpoken + 1 < static_cast<int>(script.size()) && out.words[static_cast<std::size_t>(x.lastSpoken + 1)].spoken)
            candidates.push_back(x.lastSpoken + 1);
        const int repeated =
            repeatedWord(*model, contextFree, script, candidates, x.startFrame, x.endFrame, repeatLimit, params);
        if (repeated >= 0) {
            WordEvidence& w = out.words[static_cast<std::size_t>(repeated)];
            if (++w.occurrences > 2) continue;  // one finding per word, as for repeats on the path
            f.kind = CoverageFinding::Kind::Repeated;
            f.words = {w.label};
            f.detail = "'" + w.label + "' said again at " + secondsText(f.startS);
            out.coverage.push_back(std::move(f));
            continue;
        }
        f.kind = CoverageFinding::Kind::Extra;
        if (x.lastSpoken >= 0) f.words.push_back(script[static_cast<std::size_t>(x.lastSpoken)].label);
        if (x.lastSpoken + 1 < static_cast<int>(script.size()))
            f.words.push_back(script[static_cast<std::size_t>(x.lastSpoken + 1)].label);
        const PhoneScore heard =
            scorePhone(*model, contextFree, model->silencePhone(), x.startFrame, x.endFrame, params.insertionPenalty);
        std::string phones;
        for (int p : heard.heard)
            if (p != model->silencePhone()) phones += (phones.empty() ? "" : " ") + model->basePhoneName(p);
        f.detail = "speech that is not in the script at " + secondsText(f.startS) + "–" + secondsText(f.endS) +
                   (f.words.empty() ? "" : ", near " + quoteWords(f.words)) +
                   (phones.empty() ? "" : " (sounds like " + phones + ")");
        out.coverage.push_back(std::move(f));
    }

    // A word the path left out is skipped only where the take is silent. Where its place holds
    // speech (that no unscripted stretch took), the word was said as something its phones do not
    // match: a guessed name is placed there (its phones are only a guess), another word is said as
    // something else.
    const auto extraWithin = [&](double a, double b) {
        return std::any_of(out.coverage.begin(), out.coverage.end(), [&](const CoverageFinding& c) {
            return c.kind == CoverageFinding::Kind::Extra && c.startS < b && a < c.endS;
        });
    };
    for (std::size_t k = 0; k < script.size(); ++k) {
        WordEvidence& w = out.words[k];
        if (w.spoken) continue;
        double from = 0, to = takeEnd;
        for (std::size_t m = k; m-- > 0;)
            if (out.words[m].spoken) {
                from = out.words[m].endS;
                break;
            }
        bool later = false;
        for (std::size_t m = k + 1; m < script.size() && !later; ++m)
            if (out.words[m].spoken) {
                to = out.words[m].startS;
                later = true;
            }
        if (!later) continue;  // trailing words: the early end below
        const auto span = heard.speechWithin(from, to);
        if (!span || span->second - span->first < params.minExtraSeconds || extraWithin(from, to)) continue;
        const auto a = static_cast<std::size_t>(std::floor(span->first / hop));
        const auto b = std::min(features.frames, static_cast<std::size_t>(std::ceil(span->second / hop)));
        double score = -INFINITY;
        for (const PhoneSequence& phones : script[k].pronunciations)
            score = std::max(score, scorePhones(*model, contextFree, phones, a, b, params.insertionPenalty).score);
        w.startS = timeOf(a);
        w.endS = timeOf(b);
        if (script[k].guessed) {
            w.spoken = w.complete = true;
            w.occurrences = 1;
            w.score = std::isfinite(score) ? score : -params.confidenceScale;
            w.confidence = std::clamp(1.0 + w.score / params.confidenceScale, 0.0, 1.0);
            continue;
        }
        w.substituted = true;
        CoverageFinding f;
        f.kind = CoverageFinding::Kind::Substituted;
        f.words = {w.label};
        f.startS = w.startS;
        f.endS = w.endS;
        f.detail = "'" + w.label + "' said as something else at " + secondsText(f.startS);
        out.coverage.push_back(std::move(f));
    }

    // Words never said: trailing ones are an early end, others are skipped.
    std::size_t trailing = script.size();
    while (trailing > 0 && !out.words[trailing - 1].spoken) --trailing;
    for (std::size_t k = 0; k < trailing; ++k) {
        if (out.words[k].spoken || out.words[k].substituted) continue;
        CoverageFinding f;
        f.kind = CoverageFinding::Kind::Skipped;
        f.words = {out.words[k].label};
        // Where it should have been: after the previous spoken word.
        double at = 0;
        for (std::size_t m = k; m-- > 0;)
            if (out.words[m].spoken) {
                at = out.words[m].endS;
                break;
            }
        f.startS = f.endS = at;
        f.detail = "'" + out.words[k].label + "' not said (expected at " + secondsText(at) + ")";
        out.coverage.push_back(std::move(f));
    }
    // An early end needs the speech to end there: where the take goes on speaking after the
    // path's end, and falls silent before the take ends, the last words were said as something
    // their phones do not match. (Speech running into the take's last frames is a cut.)
    const double pathEnd = timeOf(lastSpeechEnd);
    const auto after = heard.speechWithin(pathEnd, takeEnd);
    const bool speechGoesOn = after && after->second - after->first >= params.minExtraSeconds &&
                              after->second < takeEnd - kCutMarginSeconds && !extraWithin(pathEnd, takeEnd);
    if (speechGoesOn && (trailing < script.size() || endedInsideWord)) {
        if (endedInsideWord && lastSpokenWord >= 0) {
            WordEvidence& w = out.words[static_cast<std::size_t>(lastSpokenWord)];
            if (trailing == script.size() || script[static_cast<std::size_t>(lastSpokenWord)].guessed) {
                w.complete = true;  // said to its end, only not as its phones go
                if (trailing == script.size()) w.endS = roundMs(after->second);
            }
        }
        std::vector<std::string> unsaid;
        for (std::size_t k = trailing; k < script.size(); ++k) {
            out.words[k].substituted = true;
            out.words[k].startS = roundMs(after->first);
            out.words[k].endS = roundMs(after->second);
            unsaid.push_back(out.words[k].label);
        }
        if (!unsaid.empty()) {
            CoverageFinding f;
            f.kind = CoverageFinding::Kind::Substituted;
            f.words = unsaid;
            f.startS = roundMs(after->first);
            f.endS = roundMs(after->second);
            f.detail = quoteWords(unsaid) + " said as something else at " + secondsText(f.startS);
            out.coverage.push_back(std::move(f));
        }
    } else if (trailing < script.size() || endedInsideWord) {
        CoverageFinding f;
        f.kind = CoverageFinding::Kind::EarlyEnd;
        std::vector<std::string> unsaid;
        for (std::size_t k = trailing; k < script.size(); ++k) unsaid.push_back(out.words[k].label);
        f.startS = timeOf(lastSpeechEnd);
        f.endS = roundMs(takeEnd);
        std::string cut;
        if (endedInsideWord && lastSpokenWord >= 0) {
            cut = out.words[static_cast<std::size_t>(lastSpokenWord)].label;
            f.words.push_back(cut);
        }
        f.words.insert(f.words.end(), unsaid.begin(), unsaid.end());
        f.detail = "speech ends early at " + secondsText(f.startS) +
                   (cut.empty() ? "" : ", inside '" + cut + "'") +
                   (unsaid.empty() ? "" : "; never said: " + quoteWords(unsaid));
        out.coverage.push_back(std::move(f));
    }
    // A word not said with unscripted speech where it belongs was said as
    // something else: one substitution, named by the word, not a skip (or
    // an early end) plus an extra.
    for (std::size_t a = 0; a < out.coverage.size(); ++a) {
        CoverageFinding& extra = out.coverage[a];
        if (extra.kind != CoverageFinding::Kind::Extra) continue;
        for (std::size_t b = 0; b < out.coverage.size(); ++b) {
            CoverageFinding& gap = out.coverage[b];
            if (b == a || (gap.kind != CoverageFinding::Kind::Skipped && gap.kind != CoverageFinding::Kind::EarlyEnd))
                continue;
            if (gap.kind == CoverageFinding::Kind::EarlyEnd && gap.words.size() != 1) continue;
            if (std::fabs(gap.startS - extra.startS) > 0.05 && std::fabs(gap.startS - extra.endS) > 0.05) continue;
            const std::string word = gap.words.front();
            const std::string heard = extra.detail.find("(sounds like ") != std::string::npos
                                          ? extra.detail.substr(extra.detail.find("(sounds like ") + 13)
                                          : std::string();
            extra.kind = CoverageFinding::Kind::Substituted;
            extra.words = {word};
            extra.detail = "'" + word + "' said as something else at " + secondsText(extra.startS) +
                           (heard.empty() ? "" : " (heard " + heard.substr(0, heard.size() - 1) + ")");
            for (WordEvidence& w : out.words)
                if (w.label == word && !w.spoken) {
                    w.substituted = true;
                    w.startS = extra.startS;
                    w.endS = extra.endS;
                    break;
                }
            out.coverage.erase(out.coverage.begin() + static_cast<std::ptrdiff_t>(b));
            if (b < a) --a;
            break;
        }
    }
    std::stable_sort(out.coverage.begin(), out.coverage.end(),
                     [](const CoverageFinding& a, const CoverageFinding& b) { return a.startS < b.startS; });

    // Tiers from first occurrences, in time order.
    out.tiers.getOrAdd(kWordsTier);
    out.tiers.getOrAdd(kPhonesTier);
    Tier& wordTier = *out.tiers.find(kWordsTier);
    Tier& phoneTier = *out.tiers.find(kPhonesTier);
    double confidenceSum = 0;
    std::size_t spoken = 0;
    std::vector<const WordEvidence*> order;
    for (const WordEvidence& w : out.words)
        if (w.spoken) order.push_back(&w);
    std::stable_sort(order.begin(), order.end(), [](auto* a, auto* b) { return a->startS < b->startS; });
    double lastEnd = 0;
    for (const WordEvidence* w : order) {
        if (w->startS < lastEnd || w->endS <= w->startS) continue;  // a repeat overlapping an earlier word
        wordTier.intervals.push_back({w->startS, w->endS, w->label, w->confidence});
        for (const PhoneEvidence& p : w->phones)
            if (p.endS > p.startS) phoneTier.intervals.push_back({p.startS, p.endS, p.expected, std::nullopt});
        lastEnd = w->endS;
        confidenceSum += w->confidence;
        ++spoken;
    }
    out.meanConfidence = spoken ? confidenceSum / static_cast<double>(spoken) : 0.0;
    progress.report(1.0);
    return out;
}

}  // namespace earmark
