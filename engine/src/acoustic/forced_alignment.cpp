#include "earmark/acoustic/forced_alignment.hpp"

#include "earmark/acoustic/senone_scorer.hpp"
#include "earmark/core/error.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <memory>

namespace earmark {
namespace {

constexpr float kNone = -std::numeric_limits<float>::infinity();
constexpr int S = AcousticModel::kStates;

struct Unit {
    PathSegment::Kind kind = PathSegment::Kind::Phone;
    int model = -1;  // phone model; for Extra the silence model's transitions are used
    int word = -1, pronunciation = 0, phoneInWord = 0, basePhone = -1;
};

struct Arc {
    bool toNull = false;
    int target = 0;
    float weight = 0;
};

struct Record {
    int prev;
    int unit;
    std::size_t startFrame;
    float startScore;
};

// Back-trace records in fixed blocks: growing never copies what is kept
// (one vector's reallocations cost more than the records on long takes).
class RecordStore {
public:
    int add(const Record& r) {
        if ((size_ & kMask) == 0) blocks_.push_back(std::make_unique<Record[]>(kBlock));
        blocks_.back()[size_ & kMask] = r;
        return static_cast<int>(size_++);
    }
    const Record& operator[](int i) const {
        const auto k = static_cast<std::size_t>(i);
        return blocks_[k >> kShift][k & kMask];
    }

private:
    static constexpr std::size_t kShift = 16, kBlock = std::size_t{1} << kShift, kMask = kBlock - 1;
    std::vector<std::unique_ptr<Record[]>> blocks_;
    std::size_t size_ = 0;
};

struct Graph {
    std::vector<Unit> units;
    std::vector<std::vector<Arc>> unitArcs;  // from a unit's exit
    std::vector<std::vector<Arc>> nullArcs;  // from a junction (only to later junctions or units)
    int start = 0, end = 0;                  // junctions
};

void addArc(std::vector<std::vector<Arc>>& from, int source, bool toNull, int target, double weight) {
    from[static_cast<std::size_t>(source)].push_back({toNull, target, static_cast<float>(-weight)});
}

Graph buildGraph(const AcousticModel& model, const std::vector<ScriptWord>& words, const ForcedAlignmentParams& p) {
    Graph g;
    const int n = static_cast<int>(words.size());
    const int sil = model.silencePhone() >= 0 ? model.silencePhone() : 0;
    const auto in = [](int k) { return 2 * k; };
    const auto out = [](int k) { return 2 * k + 1; };
    // Junctions in order: in(0), out(0), …, in(n), out(n), then the tail
    // (an early end: only silence may follow) and the end.
    const int tail = 2 * (n + 1), finish = tail + 1;
    g.nullArcs.resize(static_cast<std::size_t>(finish + 1));
    g.start = in(0);
    g.end = finish;
    auto addUnit = [&](Unit u) {
        g.units.push_back(u);
        g.unitArcs.emplace_back();
        return static_cast<int>(g.units.size()) - 1;
    };
    // The phone a neighbouring word shows at its edge (first pronunciation).
    const auto edgePhone = [&](int k, bool last) {
        if (k < 0 || k >= n) return sil;
        const PhoneSequence& ph = words[static_cast<std::size_t>(k)].pronunciations.front();
        return last ? ph.back() : ph.front();
    };
    for (int k = 0; k <= n; ++k) {
        addArc(g.nullArcs, in(k), true, out(k), 0.0);
        const int pause = addUnit({PathSegment::Kind::Pause, sil, -1, 0, 0, sil});
        addArc(g.nullArcs, in(k), false, pause, p.silencePenalty);
        addArc(g.unitArcs, pause, true, out(k), 0.0);
        if (p.coverage) {
            const int extra = addUnit({PathSegment::Kind::Extra, sil, -1, 0, 0, -1});
            addArc(g.nullArcs, in(k), false, extra, p.extraPenalty);
            addArc(g.unitArcs, extra, true, out(k), 0.0);
        }
        if (k == n) break;
        // Word k+1 (index k) between out(k) and in(k+1).
        const ScriptWord& w = words[static_cast<std::size_t>(k)];
        for (std::size_t pr = 0; pr < w.pronunciations.size(); ++pr) {
            const PhoneSequence& ph = w.pronunciations[pr];
            int previous = -1;
            for (std::size_t i = 0; i < ph.size(); ++i) {
                const int left = i > 0 ? ph[i - 1] : edgePhone(k - 1, true);
                const int right = i + 1 < ph.size() ? ph[i + 1] : edgePhone(k + 1, false);
                const WordPosition pos = ph.size() == 1 ? WordPosition::Single
                                         : i == 0       ? WordPosition::Begin
                                         : i + 1 == ph.size() ? WordPosition::End
                                                              : WordPosition::Internal;
                const int u = addUnit({PathSegment::Kind::Phone, model.phoneModel(ph[i], left, right, pos), k,
                                       static_cast<int>(pr), static_cast<int>(i), ph[i]});
                if (previous < 0) addArc(g.nullArcs, out(k), false, u, 0.0);
                else addArc(g.unitArcs, previous, false, u, 0.0);
                if (p.coverage && i + 1 < ph.size()) addArc(g.unitArcs, u, true, tail, p.earlyEndPenalty);
                previous = u;
            }
            addArc(g.unitArcs, previous, true, in(k + 1), 0.0);
            if (p.coverage) addArc(g.unitArcs, previous, true, out(k), p.repeatPenalty);
        }
        if (p.coverage) {
            addArc(g.nullArcs, out(k), true, in(k + 1), p.skipPenalty);
            if (k + 1 < n) addArc(g.nullArcs, in(k + 1), true, tail, p.earlyEndPenalty);
        }
    }
    addArc(g.nullArcs, out(n), true, finish, 0.0);
    if (p.coverage) {
        addArc(g.nullArcs, in(0), true, tail, p.earlyEndPenalty);
        addArc(g.nullArcs, tail, true, finish, 0.0);
        const int tailPause = addUnit({PathSegment::Kind::Pause, sil, -1, 0, 0, sil});
        addArc(g.nullArcs, tail, false, tailPause, 0.0);
        addArc(g.unitArcs, tailPause, true, finish, 0.0);
    }
    return g;
}

}  // namespace

void ForcedAlignmentParams::validate() const {
    const auto check = [](double v, const char* field) {
        if (!(v >= 0) || !std::isfinite(v))
            throw ParamError(std::string("ForcedAlignmentParams.") + field, "must be a finite number >= 0");
    };
    check(skipPenalty, "skipPenalty");
    check(repeatPenalty, "repeatPenalty");
    check(extraPenalty, "extraPenalty");
    check(garbageFramePenalty, "garbageFramePenalty");
    check(earlyEndPenalty, "earlyEndPenalty");
    check(silencePenalty, "silencePenalty");
    if (!(beam > 0) || !std::isfinite(beam)) throw ParamError("ForcedAlignmentParams.beam", "must be > 0");
    for (float v : pauseFramePenalty)
        if (!(v >= 0) || !std::isfinite(v))
            throw ParamError("ForcedAlignmentParams.pauseFramePenalty", "must hold finite numbers >= 0");
}

ForcedAlignment forceAlign(const AcousticModel& model, const ModelFeatures& features,
                           const std::vector<ScriptWord>& words, std::vector<float>& contextFree,
                           const ForcedAlignmentParams& params, Progress progress) {
    params.validate();
    ForcedAlignment result;
    const std::size_t T = features.frames;
    if (T == 0 || words.empty()) {
        result.reachedEnd = false;
        return result;
    }
    const Graph g = buildGraph(model, words, params);
    const std::size_t nUnits = g.units.size();
    const std::size_t ciPerFrame = static_cast<std::size_t>(model.basePhoneCount()) * S;
    if (!params.contextFreeGiven) contextFree.assign(T * ciPerFrame, 0.0f);
    else if (contextFree.size() != T * ciPerFrame)
        throw ParamError("ForcedAlignmentParams.contextFreeGiven", "the given context-free scores do not match the features");

    if (!params.pauseFramePenalty.empty() && params.pauseFramePenalty.size() != T)
        throw ParamError("ForcedAlignmentParams.pauseFramePenalty", "must hold one value per feature frame");
    const bool gatedPauses = !params.pauseFramePenalty.empty();
    std::vector<float> score(nUnits * S, kNone);
    std::vector<int> hist(nUnits * S, -1);
    std::vector<float> entry(nUnits, kNone);
    std::vector<int> entryHist(nUnits, -1);
    std::vector<std::size_t> queuedFor(nUnits, 0);  // 1 + the frame a unit is queued for
    std::vector<int> activeList, nextList;
    std::vector<float> nullScore(g.nullArcs.size(), kNone);
    std::vector<int> nullHist(g.nullArcs.size(), -1);
    RecordStore records;

    std::size_t frameAhead = 1;  // 1 + the frame that entries scheduled now belong to
    auto schedule = [&](int u, float s, int h) {
        const auto ui = static_cast<std::size_t>(u);
        if (s > entry[ui]) {
            entry[ui] = s;
            entryHist[ui] = h;
        }
        if (queuedFor[ui] != frameAhead) {
            queuedFor[ui] = frameAhead;
            nextList.push_back(u);
        }
    };
    auto relaxNulls = [&]() {
        for (std::size_t n = 0; n < g.nullArcs.size(); ++n) {
            if (nullScore[n] == kNone) continue;
            for (const Arc& a : g.nullArcs[n]) {
                const float s = nullScore[n] + a.weight;
                if (a.toNull) {
                    auto& t = nullScore[static_cast<std::size_t>(a.target)];
                    if (s > t) {
                        t = s;
                        nullHist[static_cast<std::size_t>(a.target)] = nullHist[n];
                    }
                } else {
                    schedule(a.target, s, nullHist[n]);
                }
            }
        }
    };

    nullScore[static_cast<std::size_t>(g.start)] = 0;
    relaxNulls();
    float finalScore = kNone;
    int finalHist = -1;
    SenoneScorer scorer(model, features, SenoneScorer::kDefaultTopDensities, params.codebookCache);
    std::vector<float> fresh(S);
    std::vector<int> freshHist(S);
    for (std::size_t t = 0; t < T; ++t) {
        if ((t & 255) == 0) progress.report(static_cast<double>(t) / static_cast<double>(T));
        scorer.setFrame(t);
        frameAhead = t + 2;
        activeList.swap(nextList);
        nextList.clear();
        std::fill(nullScore.begin(), nullScore.end(), kNone);
        float best = kNone;
        float* ci = contextFree.data() + t * ciPerFrame;
        if (!params.contextFreeGiven)
            for (int p = 0; p < model.basePhoneCount(); ++p)
                for (int j = 0; j < S; ++j)
                    ci[static_cast<std::size_t>(p * S + j)] = scorer.score(model.states(p)[static_cast<std::size_t>(j)]);
        float garbage = kNone;
        for (std::size_t k = 0; k < ciPerFrame; ++k) garbage = std::max(garbage, ci[k]);
        garbage -= static_cast<float>(params.garbageFramePenalty);
        // 1. Emit: every active unit moves its tokens one frame.
        for (int u : activeList) {
            const auto ui = static_cast<std::size_t>(u);
            const Unit& unit = g.units[ui];
            const auto& A = model.transitions(unit.model);
            float* sc = &score[ui * S];
            int* hs = &hist[ui * S];
            for (int j = 0; j < S; ++j) {
                float bestIn = kNone;
                int bestHist = -1;
                for (int i = 0; i <= j; ++i) {
                    if (sc[i] == kNone || A[static_cast<std::size_t>(i)][static_cast<std::size_t>(j)] == kNone) continue;
                    const float s = sc[i] + A[static_cast<std::size_t>(i)][static_cast<std::size_t>(j)];
                    if (s > bestIn) {
                        bestIn = s;
                        bestHist = hs[i];
                    }
                }
                if (j == 0 && entry[ui] > bestIn) {
                    bestIn = entry[ui];
                    bestHist = records.add({entryHist[ui], u, t, entry[ui]});
                }
                if (bestIn == kNone) {
                    fresh[static_cast<std::size_t>(j)] = kNone;
                    continue;
                }
                float emit;
                if (unit.kind == PathSegment::Kind::Extra) emit = garbage;
                else if (unit.kind == PathSegment::Kind::Pause)
                    emit = ci[static_cast<std::size_t>(unit.model * S + j)] -
                           (gatedPauses ? params.pauseFramePenalty[t] : 0.0f);
                else if (unit.model < model.basePhoneCount())
                    emit = ci[static_cast<std::size_t>(unit.model * S + j)];
                else emit = scorer.score(model.states(unit.model)[static_cast<std::size_t>(j)]);
                fresh[static_cast<std::size_t>(j)] = bestIn + emit;
                freshHist[static_cast<std::size_t>(j)] = bestHist;
            }
            for (int j = 0; j < S; ++j) {
                sc[j] = fresh[static_cast<std::size_t>(j)];
                hs[j] = freshHist[static_cast<std::size_t>(j)];
                best = std::max(best, sc[j]);
            }
            entry[ui] = kNone;
        }
        // 2. Prune, and pass exits on (to junctions now, to units next frame).
        const float threshold = best - static_cast<float>(params.beam);
        for (int u : activeList) {
            const auto ui = static_cast<std::size_t>(u);
            float* sc = &score[ui * S];
            bool alive = false;
            for (int j = 0; j < S; ++j) {
                if (sc[j] < threshold) sc[j] = kNone;
                alive = alive || sc[j] != kNone;
            }
            if (!alive) continue;
            if (queuedFor[ui] != frameAhead) {
                queuedFor[ui] = frameAhead;
                nextList.push_back(u);
            }
            const auto& A = model.transitions(g.units[ui].model);
            float exitScore = kNone;
            int exitHist = -1;
            for (int j = 0; j < S; ++j) {
                if (sc[j] == kNone || A[static_cast<std::size_t>(j)][S] == kNone) continue;
                const float s = sc[j] + A[static_cast<std::size_t>(j)][S];
                if (s > exitScore) {
                    exitScore = s;
                    exitHist = hist[ui * S + static_cast<std::size_t>(j)];
                }
            }
            if (exitScore == kNone || exitScore < threshold) continue;
            for (const Arc& a : g.unitArcs[ui]) {
                const float s = exitScore + a.weight;
                if (a.toNull) {
                    auto& target = nullScore[static_cast<std::size_t>(a.target)];
                    if (s > target) {
                        target = s;
                        nullHist[static_cast<std::size_t>(a.target)] = exitHist;
                    }
                } else {
                    schedule(a.target, s, exitHist);
                }
            }
        }
        if (t + 1 == T) {
            // The end junction after the last frame; no further entries.
            for (std::size_t n = 0; n < g.nullArcs.size(); ++n) {
                if (nullScore[n] == kNone) continue;
                for (const Arc& a : g.nullArcs[n])
                    if (a.toNull && nullScore[n] + a.weight > nullScore[static_cast<std::size_t>(a.target)]) {
                        nullScore[static_cast<std::size_t>(a.target)] = nullScore[n] + a.weight;
                        nullHist[static_cast<std::size_t>(a.target)] = nullHist[n];
                    }
            }
            finalScore = nullScore[static_cast<std::size_t>(g.end)];
            finalHist = nullHist[static_cast<std::size_t>(g.end)];
        } else {
            relaxNulls();
        }
    }
    progress.report(1.0);
    if (finalScore == kNone) {
        result.reachedEnd = false;
        return result;
    }
    result.logLikelihood = finalScore;
    std::vector<const Record*> chain;
    for (int h = finalHist; h >= 0; h = records[h].prev) chain.push_back(&records[h]);
    std::reverse(chain.begin(), chain.end());
    for (std::size_t i = 0; i < chain.size(); ++i) {
        const Record& r = *chain[i];
        const Unit& u = g.units[static_cast<std::size_t>(r.unit)];
        PathSegment seg;
        seg.kind = u.kind;
        seg.word = u.word;
        seg.pronunciation = u.pronunciation;
        seg.phoneInWord = u.phoneInWord;
        seg.basePhone = u.basePhone;
        seg.startFrame = r.startFrame;
        seg.endFrame = i + 1 < chain.size() ? chain[i + 1]->startFrame : T;
        const double endScore = i + 1 < chain.size() ? chain[i + 1]->startScore : finalScore;
        seg.logLikelihood = endScore - r.startScore;
        result.path.push_back(seg);
    }
    return result;
}

}  // namespace earmark
