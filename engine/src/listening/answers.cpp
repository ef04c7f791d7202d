#include "earmark/listening/answers.hpp"

#include "earmark/core/error.hpp"
#include "earmark/export/defect_list.hpp"  // csvRecord, formatNumber
#include "earmark/store/take_list.hpp"     // parseCsv

#include <charconv>
#include <cmath>
#include <fstream>
#include <map>
#include <sstream>
#include <tuple>

namespace earmark::listening {
namespace {

std::string describe(const Answer& a) {
    return (a.origin.empty() ? std::string() : a.origin + ": ") + "rater '" + a.rater + "', line '" + a.line +
           "', system '" + a.system + "'";
}

void checkOne(const TestDesign& d, const Scale& scale, Answer& a, const std::string& source) {
    if (a.rater.empty()) throw InputError(source, describe(a) + ": the rater is empty");
    if (d.lineIndex(a.line) < 0) throw InputError(source, describe(a) + ": no such line in the test");
    const int s = d.systemIndex(a.system);
    if (s < 0) throw InputError(source, describe(a) + ": no such system in the test");
    if (a.score && (!std::isfinite(*a.score) || *a.score < scale.min || *a.score > scale.max ||
                    (scale.whole && *a.score != std::floor(*a.score))))
        throw InputError(source, describe(a) + ": score " + formatNumber(*a.score) + " is not on the " +
                                     std::string(kindName(d.kind)) + " scale (" + formatNumber(scale.min) +
                                     " … " + formatNumber(scale.max) + (scale.whole ? ", whole numbers" : "") + ")");
    const bool paired = d.kind == TestKind::Cmos || d.kind == TestKind::Ab;
    if (!paired) {
        if (!a.versus.empty()) throw InputError(source, describe(a) + ": 'versus' is only for CMOS and A/B tests");
        return;
    }
    if (d.kind == TestKind::Cmos && a.versus.empty()) a.versus = d.systems[d.referenceIndex()].name;
    const int v = d.systemIndex(a.versus);
    if (v < 0) throw InputError(source, describe(a) + ": no such system '" + a.versus + "' to compare with");
    if (v == s) throw InputError(source, describe(a) + ": a system cannot be compared with itself");
    const bool swap = d.kind == TestKind::Cmos ? s == d.referenceIndex() : v < s;
    if (d.kind == TestKind::Cmos && !swap && v != d.referenceIndex())
        throw InputError(source, describe(a) + ": CMOS answers compare a system with the reference");
    if (swap) {
        std::swap(a.system, a.versus);
        if (a.score && *a.score != 0) a.score = -*a.score;
    }
}

}  // namespace

void checkAnswers(const TestDesign& d, std::vector<Answer>& answers, const std::string& source) {
    const Scale scale = scaleOf(d.kind);
    std::map<std::tuple<std::string, std::string, std::string, std::string, TrialKind>, std::string> seen;
    for (Answer& a : answers) {
        checkOne(d, scale, a, source);
        if (a.kind == TrialKind::Attention) a.kind = TrialKind::Main;
        const auto key = std::make_tuple(a.rater, a.line, a.system, a.versus, a.kind);
        const auto [it, fresh] = seen.emplace(key, a.origin);
        if (!fresh)
            throw InputError(source, describe(a) + ": duplicate answer" +
                                         (it->second.empty() ? std::string() : " (first at " + it->second + ")") +
                                         (a.kind == TrialKind::Repeat ? " for the repeated trial" : ""));
    }
}

std::vector<Answer> readAnswersCsv(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    if (!in) throw InputError(path, "cannot be read");
    std::stringstream buffer;
    buffer << in.rdbuf();
    std::string text = buffer.str();
    if (text.rfind("\xEF\xBB\xBF", 0) == 0) text.erase(0, 3);
    const auto records = parseCsv(text, path);
    if (records.empty()) throw InputError(path, "is empty; expected a header row rater,line,system,score");
    std::map<std::string, std::size_t> column;
    for (std::size_t i = 0; i < records[0].size(); ++i) column[records[0][i]] = i;
    for (const char* needed : {"rater", "line", "system", "score"})
        if (!column.count(needed)) throw InputError(path, std::string("has no column '") + needed + "'");
    auto field = [&](const std::vector<std::string>& row, const char* name) -> std::string {
        const auto it = column.find(name);
        return it != column.end() && it->second < row.size() ? row[it->second] : std::string();
    };
    std::vector<Answer> out;
    for (std::size_t r = 1; r < records.size(); ++r) {
        const auto& row = records[r];
        if (row.size() == 1 && row[0].empty()) continue;  // blank line
        Answer a;
        a.origin = "row " + std::to_string(r + 1);
        if (row.size() < records[0].size())
            throw InputError(path, a.origin + ": has " + std::to_string(row.size()) + " fields, the header has " +
                                       std::to_string(records[0].size()));
        a.rater = field(row, "rater");
        a.line = field(row, "line");
        a.system = field(row, "system");
        a.versus = field(row, "versus");
        const std::string score = field(row, "score");
        if (!score.empty()) {
            double v = 0;
            const auto [end, ec] = std::from_chars(score.data(), score.data() + score.size(), v);
            if (ec != std::errc() || end != score.data() + score.size())
                throw InputError(path, a.origin + ": score '" + score + "' is not a number");
            a.score = v;
        }
        const std::string kind = field(row, "kind");
        if (kind == "repeat") a.kind = TrialKind::Repeat;
        else if (!kind.empty() && kind != "main")
            throw InputError(path, a.origin + ": kind '" + kind + "' is neither main nor repeat");
        out.push_back(std::move(a));
    }
    return out;
}

std::string answersToCsv(const std::vector<Answer>& answers) {
    std::string out = csvRecord({"rater", "line", "system", "versus", "score", "kind"});
    for (const Answer& a : answers)
        out += csvRecord({a.rater, a.line, a.system, a.versus, a.score ? formatNumber(*a.score) : "",
                          std::string(trialKindName(a.kind == TrialKind::Repeat ? TrialKind::Repeat : TrialKind::Main))});
    return out;
}

std::vector<Answer> answersOfTrial(const TestDesign& d, const Trial& t, const std::string& rater,
                                   const std::vector<double>& ratings) {
    const bool paired = d.kind == TestKind::Cmos || d.kind == TestKind::Ab;
    const std::size_t expected = paired ? 1 : t.stimuli.size();
    if (ratings.size() != expected || (paired && t.stimuli.size() != 2))
        throw ParamError("answersOfTrial.ratings", "expected " + std::to_string(expected) + " rating(s) for this trial");
    const std::string& lineId = d.lines[static_cast<std::size_t>(t.line)].id;
    const TrialKind kind = t.kind == TrialKind::Repeat ? TrialKind::Repeat : TrialKind::Main;
    std::vector<Answer> out;
    auto name = [&](std::size_t k) { return d.systems[static_cast<std::size_t>(t.stimuli[k].system)].name; };
    if (!paired) {
        for (std::size_t k = 0; k < t.stimuli.size(); ++k) out.push_back({rater, lineId, name(k), "", ratings[k], kind, {}});
    } else if (d.kind == TestKind::Cmos) {
        out.push_back({rater, lineId, name(1), name(0), ratings[0], kind, {}});  // second against first
    } else {
        out.push_back({rater, lineId, name(0), name(1), ratings[0], kind, {}});  // +1 = first preferred
    }
    return out;
}

}  // namespace earmark::listening
