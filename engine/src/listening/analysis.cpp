#include "earmark/listening/analysis.hpp"

#include "earmark/core/error.hpp"
#include "earmark/core/numeric.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <set>

namespace earmark::listening {
namespace {

// Kept main answers as a dense raters × lines × systems table (NaN = none).
struct Table {
    std::vector<std::string> raters;
    std::vector<std::string> lines;
    std::vector<int> systems;  // design indices of the systems analysed
    std::vector<double> cells;
    double at(std::size_t r, std::size_t l, std::size_t s) const {
        return cells[(r * lines.size() + l) * systems.size() + s];
    }
};

Table tableOf(const TestDesign& d, const std::vector<const Answer*>& used, const std::vector<int>& systems) {
    Table t;
    t.systems = systems;
    std::set<std::string> raters;
    for (const Answer* a : used) raters.insert(a->rater);
    t.raters.assign(raters.begin(), raters.end());
    for (const Line& line : d.lines) t.lines.push_back(line.id);
    t.cells.assign(t.raters.size() * t.lines.size() * systems.size(), kNaN);
    std::map<std::string, std::size_t> rIndex, sIndex;
    for (std::size_t i = 0; i < t.raters.size(); ++i) rIndex[t.raters[i]] = i;
    for (std::size_t i = 0; i < systems.size(); ++i) sIndex[d.systems[static_cast<std::size_t>(systems[i])].name] = i;
    for (const Answer* a : used) {
        const auto s = sIndex.find(a->system);
        if (s == sIndex.end()) continue;
        const auto l = static_cast<std::size_t>(d.lineIndex(a->line));
        t.cells[(rIndex[a->rater] * t.lines.size() + l) * systems.size() + s->second] = *a->score;
    }
    return t;
}

bool isBalanced(const Table& t) {
    for (std::size_t r = 0; r < t.raters.size(); ++r)
        for (std::size_t l = 0; l < t.lines.size(); ++l) {
            int present = 0;
            for (std::size_t s = 0; s < t.systems.size(); ++s) present += !std::isnan(t.at(r, l, s));
            if (present != 0 && present != static_cast<int>(t.systems.size())) return false;
        }
    return true;
}

void fillPair(PairComparison& pc, const std::vector<double>& differences, PairedTest asked, bool balanced) {
    pc.n = static_cast<int>(differences.size());
    double sum = 0;
    for (double x : differences) sum += x;
    pc.meanDifference = differences.empty() ? kNaN : sum / static_cast<double>(differences.size());
    pc.pairedT = pairedT(differences);
    pc.wilcoxon = wilcoxonSignedRank(differences);
    const bool useT = asked == PairedTest::PairedT || (asked == PairedTest::Auto && balanced);
    pc.chosen = useT ? "paired-t" : "wilcoxon";
    const TestResult& r = useT ? pc.pairedT : pc.wilcoxon;
    pc.p = r.defined ? r.p : kNaN;
}

void summarise(const TestDesign& d, const Table& t, const AnalysisParams& p, Report& rep, Progress progress) {
    const BootstrapResult boot = bootstrapMeans(t.cells, static_cast<int>(t.raters.size()),
                                                static_cast<int>(t.lines.size()), static_cast<int>(t.systems.size()),
                                                p.alpha, t.raters.empty() ? 0 : p.bootstrapRounds, p.bootstrapSeed,
                                                progress);
    for (std::size_t s = 0; s < t.systems.size(); ++s) {
        const System& sys = d.systems[static_cast<std::size_t>(t.systems[s])];
        std::vector<double> values;
        std::set<std::size_t> raters, lines;
        for (std::size_t r = 0; r < t.raters.size(); ++r)
            for (std::size_t l = 0; l < t.lines.size(); ++l)
                if (const double v = t.at(r, l, s); !std::isnan(v)) {
                    values.push_back(v);
                    raters.insert(r);
                    lines.insert(l);
                }
        SystemSummary sum;
        sum.system = sys.name;
        sum.role = sys.role;
        sum.raters = static_cast<int>(raters.size());
        sum.lines = static_cast<int>(lines.size());
        sum.t = meanInterval(values, p.alpha);
        sum.bootLow = boot.low.empty() ? kNaN : boot.low[s];
        sum.bootHigh = boot.high.empty() ? kNaN : boot.high[s];
        rep.systems.push_back(sum);
        for (std::size_t l = 0; l < t.lines.size(); ++l) {
            LineValues lv{t.lines[l], sys.name, {}};
            for (std::size_t r = 0; r < t.raters.size(); ++r)
                if (const double v = t.at(r, l, s); !std::isnan(v)) lv.values.push_back(v);
            std::sort(lv.values.begin(), lv.values.end());
            if (!lv.values.empty()) rep.perLine.push_back(std::move(lv));
        }
    }
}

void comparePairs(const TestDesign& d, const Table& t, const AnalysisParams& p, Report& rep) {
    for (std::size_t a = 0; a < t.systems.size(); ++a)
        for (std::size_t b = a + 1; b < t.systems.size(); ++b) {
            std::vector<double> diff;
            for (std::size_t r = 0; r < t.raters.size(); ++r)
                for (std::size_t l = 0; l < t.lines.size(); ++l) {
                    const double x = t.at(r, l, a), y = t.at(r, l, b);
                    if (!std::isnan(x) && !std::isnan(y)) diff.push_back(x - y);
                }
            PairComparison pc;
            pc.a = d.systems[static_cast<std::size_t>(t.systems[a])].name;
            pc.b = d.systems[static_cast<std::size_t>(t.systems[b])].name;
            fillPair(pc, diff, p.test, rep.balanced);
            rep.pairs.push_back(std::move(pc));
        }
}

void compareWithReference(const TestDesign& d, const Table& t, const AnalysisParams& p, Report& rep) {
    for (std::size_t s = 0; s < t.systems.size(); ++s) {
        std::vector<double> values;
        for (std::size_t r = 0; r < t.raters.size(); ++r)
            for (std::size_t l = 0; l < t.lines.size(); ++l)
                if (const double v = t.at(r, l, s); !std::isnan(v)) values.push_back(v);
        PairComparison pc;
        pc.a = d.systems[static_cast<std::size_t>(t.systems[s])].name;
        pc.b = d.systems[static_cast<std::size_t>(d.referenceIndex())].name;
        fillPair(pc, values, p.test, rep.balanced);
        rep.pairs.push_back(std::move(pc));
    }
}

void preferences(const TestDesign& d, const std::vector<const Answer*>& used, const AnalysisParams& p, Report& rep) {
    std::map<std::pair<int, int>, Preference> byPair;
    for (const Answer* a : used) {
        const int x = d.systemIndex(a->system), y = d.systemIndex(a->versus);
        Preference& pr = byPair[{x, y}];
        pr.a = a->system;
        pr.b = a->versus;
        if (*a->score > 0) ++pr.aPreferred;
        else if (*a->score < 0) ++pr.bPreferred;
        else ++pr.none;
    }
    for (auto& [key, pr] : byPair) {
        pr.test = binomialTest(pr.aPreferred, pr.aPreferred + pr.bPreferred, 0.5, p.alpha);
        rep.preferences.push_back(pr);
    }
    std::vector<double> ps;
    for (const Preference& pr : rep.preferences) ps.push_back(pr.test.p);
    const auto adjusted = holmAdjust(ps);
    for (std::size_t i = 0; i < adjusted.size(); ++i) rep.preferences[i].pHolm = adjusted[i];
}

}  // namespace

std::string_view pairedTestName(PairedTest t) {
    switch (t) {
    case PairedTest::Auto: return "auto";
    case PairedTest::Wilcoxon: return "wilcoxon";
    case PairedTest::PairedT: return "paired-t";
    }
    return "?";
}

std::optional<PairedTest> parsePairedTest(std::string_view name) {
    for (PairedTest t : {PairedTest::Auto, PairedTest::Wilcoxon, PairedTest::PairedT})
        if (pairedTestName(t) == name) return t;
    return std::nullopt;
}

Report analyse(const TestDesign& d, const std::vector<Answer>& answers, const AnalysisParams& p,
               const ScreeningParams& sp, const std::vector<std::string>& expectedRaters, Progress progress) {
    validateDesign(d);
    if (!(p.alpha > 0 && p.alpha < 1)) throw ParamError("AnalysisParams.alpha", "must be in (0, 1)");
    if (p.bootstrapRounds < 0 || p.bootstrapRounds > 1000000)
        throw ParamError("AnalysisParams.bootstrapRounds", "must be 0 … 1000000");
    Report rep;
    rep.kind = d.kind;
    rep.params = p;
    rep.screening = screenRaters(d, answers, sp, expectedRaters);

    std::vector<const Answer*> used;
    for (const Answer& a : answers) {
        if (a.kind == TrialKind::Repeat || !a.score || !rep.screening.isKept(a.rater)) continue;
        const auto role = [&](const std::string& n) {
            const int i = n.empty() ? -1 : d.systemIndex(n);
            return i < 0 ? SystemRole::Candidate : d.systems[static_cast<std::size_t>(i)].role;
        };
        if (role(a.system) == SystemRole::AttentionCheck || role(a.versus) == SystemRole::AttentionCheck) continue;
        used.push_back(&a);
    }
    rep.answersUsed = static_cast<int>(used.size());

    if (d.kind == TestKind::Ab) {
        preferences(d, used, p, rep);
        progress.report(1.0);
        return rep;
    }
    std::vector<int> systems;
    for (std::size_t i = 0; i < d.systems.size(); ++i) {
        const SystemRole role = d.systems[i].role;
        if (role == SystemRole::AttentionCheck) continue;
        if (d.kind == TestKind::Cmos && role == SystemRole::Reference) continue;
        systems.push_back(static_cast<int>(i));
    }
    const Table table = tableOf(d, used, systems);
    rep.balanced = isBalanced(table);
    summarise(d, table, p, rep, progress);
    if (d.kind == TestKind::Cmos) compareWithReference(d, table, p, rep);
    else comparePairs(d, table, p, rep);
    std::vector<double> ps;
    for (const PairComparison& pc : rep.pairs) ps.push_back(pc.p);
    const auto adjusted = holmAdjust(ps);
    for (std::size_t i = 0; i < adjusted.size(); ++i) rep.pairs[i].pHolm = adjusted[i];
    return rep;
}

}  // namespace earmark::listening
