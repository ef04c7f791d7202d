#include "earmark/listening/plan.hpp"

#include "earmark/core/error.hpp"
#include "seeded_random.hpp"

#include <algorithm>
#include <map>
#include <numeric>

namespace earmark::listening {
namespace {

// "A" … "Z", then "AA", "AB", …
std::string blindLabel(std::size_t position) {
    std::string label;
    std::size_t n = position + 1;
    while (n > 0) {
        label.insert(label.begin(), static_cast<char>('A' + (n - 1) % 26));
        n = (n - 1) / 26;
    }
    return label;
}

std::vector<int> withRole(const TestDesign& d, std::initializer_list<SystemRole> roles) {
    std::vector<int> out;
    for (std::size_t i = 0; i < d.systems.size(); ++i)
        if (std::find(roles.begin(), roles.end(), d.systems[i].role) != roles.end()) out.push_back(static_cast<int>(i));
    return out;
}

void labelStimuli(Trial& t) {
    for (std::size_t k = 0; k < t.stimuli.size(); ++k) t.stimuli[k].label = blindLabel(k);
}

Trial trialOf(int line, const std::vector<int>& systems, TrialKind kind = TrialKind::Main) {
    Trial t;
    t.line = line;
    t.kind = kind;
    for (int s : systems) t.stimuli.push_back({s, {}});
    return t;
}

// What one main trial compares, before its order is drawn.
using Unit = std::vector<int>;

std::vector<Unit> unitsOf(const TestDesign& d) {
    const std::vector<int> candidates = withRole(d, {SystemRole::Candidate});
    std::vector<Unit> units;
    switch (d.kind) {
    case TestKind::Mos:
        for (int c : candidates) units.push_back({c});
        break;
    case TestKind::Cmos:
        for (int c : candidates) units.push_back({std::min(c, d.referenceIndex()), std::max(c, d.referenceIndex())});
        break;
    case TestKind::Ab:
        for (std::size_t i = 0; i < candidates.size(); ++i)
            for (std::size_t j = i + 1; j < candidates.size(); ++j) units.push_back({candidates[i], candidates[j]});
        break;
    case TestKind::Mushra:
        units.push_back(withRole(d, {SystemRole::Candidate, SystemRole::Reference, SystemRole::LowAnchor,
                                     SystemRole::MidAnchor}));
        break;
    }
    return units;
}

// Orders the takes of main trials, counting over all raters in turn.
class Orderer {
public:
    Orderer(const TestDesign& d, SeededRandom& rng) {
        const Unit all = withRole(d, {SystemRole::Candidate, SystemRole::Reference, SystemRole::LowAnchor,
                                      SystemRole::MidAnchor});
        Unit shuffled = all;
        rng.shuffle(shuffled);
        for (std::size_t r = 0; r < shuffled.size(); ++r) rank_[shuffled[r]] = static_cast<int>(r);
        if (d.kind == TestKind::Mushra) {
            square_ = shuffled;  // column order of the Latin square
            rows_.resize(square_.size());
            std::iota(rows_.begin(), rows_.end(), 0);
            rng.shuffle(rows_);
        }
    }

    void order(Trial& t) {
        if (t.stimuli.size() == 2) {
            const int x = t.stimuli[0].system, y = t.stimuli[1].system;
            const int u = std::min(rank_[x], rank_[y]), v = std::max(rank_[x], rank_[y]);
            // Balanced round robin: the lower rank goes first when the ranks' sum is odd.
            bool lowerFirst = (u + v) % 2 == 1;
            if (pairUses_[{x, y}]++ % 2 == 1) lowerFirst = !lowerFirst;
            const bool xFirst = (rank_[x] == u) == lowerFirst;
            if (!xFirst) std::swap(t.stimuli[0], t.stimuli[1]);
        } else if (t.stimuli.size() > 2) {
            const std::size_t m = square_.size();
            const std::size_t row = rows_[used_++ % m];
            for (std::size_t k = 0; k < m; ++k) t.stimuli[k].system = square_[(row + k) % m];
        }
        labelStimuli(t);
    }

private:
    std::map<int, int> rank_;
    std::map<std::pair<int, int>, long> pairUses_;
    std::vector<int> square_;
    std::vector<std::size_t> rows_;
    std::size_t used_ = 0;
};

struct Draft {
    Trial trial;
    int id = 0;
    int repeatOfId = -1;
};

void insertAttention(const TestDesign& d, const std::vector<int>& lines, std::vector<Draft>& list,
                     SeededRandom& rng, int& nextId) {
    const std::vector<int> attention = withRole(d, {SystemRole::AttentionCheck});
    const std::vector<int> candidates = withRole(d, {SystemRole::Candidate});
    for (int i = 0; i < d.plan.attentionPerRater; ++i) {
        const int line = lines[rng.below(lines.size())];
        const int check = attention[rng.below(attention.size())];
        std::vector<int> systems{check};
        if (d.kind == TestKind::Cmos) systems.push_back(d.referenceIndex());
        if (d.kind == TestKind::Ab) systems.push_back(candidates[rng.below(candidates.size())]);
        Trial t = trialOf(line, systems, TrialKind::Attention);
        if (t.stimuli.size() == 2 && rng.below(2) == 1) std::swap(t.stimuli[0], t.stimuli[1]);
        labelStimuli(t);
        list.insert(list.begin() + static_cast<long>(rng.below(list.size() + 1)), {std::move(t), nextId++, -1});
    }
}

void insertRepeats(const TestDesign& d, std::vector<Draft>& list, SeededRandom& rng, int& nextId) {
    std::vector<int> mains;
    for (const Draft& dr : list)
        if (dr.trial.kind == TrialKind::Main) mains.push_back(dr.id);
    if (d.plan.repeatsPerRater > static_cast<int>(mains.size()))
        throw ParamError("PlanParams.repeatsPerRater",
                         "is more than the " + std::to_string(mains.size()) + " trials a rater hears");
    rng.shuffle(mains);
    for (int r = 0; r < d.plan.repeatsPerRater; ++r) {
        const auto at = std::find_if(list.begin(), list.end(), [&](const Draft& x) { return x.id == mains[r]; });
        Trial copy = at->trial;
        copy.kind = TrialKind::Repeat;
        if (copy.stimuli.size() > 1) {
            rng.shuffle(copy.stimuli);
            labelStimuli(copy);
        }
        const std::size_t after = static_cast<std::size_t>(at - list.begin()) + 1;
        const std::size_t pos = after + rng.below(list.size() - after + 1);
        list.insert(list.begin() + static_cast<long>(pos), {std::move(copy), nextId++, mains[r]});
    }
}

}  // namespace

std::string_view trialKindName(TrialKind kind) {
    switch (kind) {
    case TrialKind::Main: return "main";
    case TrialKind::Repeat: return "repeat";
    case TrialKind::Attention: return "attention";
    }
    return "?";
}

Plan makePlan(const TestDesign& d) {
    validateDesign(d);
    SeededRandom rng(d.plan.seed);
    const int lineCount = static_cast<int>(d.lines.size());
    std::vector<int> lineOrder(d.lines.size());
    std::iota(lineOrder.begin(), lineOrder.end(), 0);
    rng.shuffle(lineOrder);
    const int perRater = d.plan.linesPerRater > 0 ? d.plan.linesPerRater : lineCount;
    const std::vector<Unit> units = unitsOf(d);
    Orderer orderer(d, rng);

    Plan plan;
    plan.seed = d.plan.seed;
    for (int slot = 0; slot < d.plan.raters; ++slot) {
        std::vector<int> lines;
        for (int i = 0; i < perRater; ++i)
            lines.push_back(lineOrder[static_cast<std::size_t>((static_cast<long>(slot) * perRater + i) % lineCount)]);
        std::vector<Draft> list;
        int nextId = 0;
        for (int line : lines)
            for (const Unit& u : units) list.push_back({trialOf(line, u), nextId++, -1});
        rng.shuffle(list);
        for (Draft& dr : list) orderer.order(dr.trial);
        insertAttention(d, lines, list, rng, nextId);
        insertRepeats(d, list, rng, nextId);

        RaterPlan rp;
        rp.slot = slot;
        std::map<int, int> positionOf;
        for (std::size_t i = 0; i < list.size(); ++i) positionOf[list[i].id] = static_cast<int>(i);
        for (Draft& dr : list) {
            if (dr.repeatOfId >= 0) dr.trial.repeatOf = positionOf[dr.repeatOfId];
            rp.trials.push_back(std::move(dr.trial));
        }
        plan.raters.push_back(std::move(rp));
    }
    return plan;
}

std::string blindView(const TestDesign& d, const RaterPlan& plan) {
    std::string out;
    for (std::size_t i = 0; i < plan.trials.size(); ++i) {
        const Trial& t = plan.trials[i];
        const Line& line = d.lines[static_cast<std::size_t>(t.line)];
        out += std::to_string(i + 1) + "\t" + line.id + "\t";
        for (std::size_t k = 0; k < t.stimuli.size(); ++k) out += (k ? " " : "") + t.stimuli[k].label;
        out += "\t" + line.text + "\n";
    }
    return out;
}

}  // namespace earmark::listening
