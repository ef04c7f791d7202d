#include "earmark/listening/test_design.hpp"

#include "earmark/core/error.hpp"

#include <algorithm>
#include <array>
#include <set>

namespace earmark::listening {
namespace {

constexpr std::array<std::pair<TestKind, std::string_view>, 4> kKinds = {{
    {TestKind::Mos, "mos"}, {TestKind::Cmos, "cmos"}, {TestKind::Mushra, "mushra"}, {TestKind::Ab, "ab"}}};

constexpr std::array<std::pair<SystemRole, std::string_view>, 5> kRoles = {{
    {SystemRole::Candidate, "candidate"},
    {SystemRole::Reference, "reference"},
    {SystemRole::LowAnchor, "low-anchor"},
    {SystemRole::MidAnchor, "mid-anchor"},
    {SystemRole::AttentionCheck, "attention"},
}};

int countRole(const TestDesign& d, SystemRole role) {
    return static_cast<int>(std::count_if(d.systems.begin(), d.systems.end(),
                                          [&](const System& s) { return s.role == role; }));
}

}  // namespace

std::string_view kindName(TestKind kind) {
    for (const auto& [k, name] : kKinds)
        if (k == kind) return name;
    return "?";
}

std::optional<TestKind> parseKind(std::string_view name) {
    for (const auto& [k, n] : kKinds)
        if (n == name) return k;
    return std::nullopt;
}

std::string_view roleName(SystemRole role) {
    for (const auto& [r, name] : kRoles)
        if (r == role) return name;
    return "?";
}

std::optional<SystemRole> parseRole(std::string_view name) {
    for (const auto& [r, n] : kRoles)
        if (n == name) return r;
    return std::nullopt;
}

Scale scaleOf(TestKind kind) {
    switch (kind) {
    case TestKind::Mos:  // ITU-T P.800 Annex B, listening-quality scale
        return {1, 5, true, {{1, "Bad"}, {2, "Poor"}, {3, "Fair"}, {4, "Good"}, {5, "Excellent"}}};
    case TestKind::Cmos:  // ITU-T P.800 Annex E, comparison category rating
        return {-3, 3, true,
                {{-3, "Much worse"}, {-2, "Worse"}, {-1, "Slightly worse"}, {0, "About the same"},
                 {1, "Slightly better"}, {2, "Better"}, {3, "Much better"}}};
    case TestKind::Mushra:  // ITU-R BS.1534-3: five intervals of 20 points
        return {0, 100, false, {{10, "Bad"}, {30, "Poor"}, {50, "Fair"}, {70, "Good"}, {90, "Excellent"}}};
    case TestKind::Ab:
        return {-1, 1, true, {{-1, "Second"}, {0, "No preference"}, {1, "First"}}};
    }
    return {};
}

int TestDesign::systemIndex(std::string_view n) const {
    for (std::size_t i = 0; i < systems.size(); ++i)
        if (systems[i].name == n) return static_cast<int>(i);
    return -1;
}

int TestDesign::lineIndex(std::string_view id) const {
    for (std::size_t i = 0; i < lines.size(); ++i)
        if (lines[i].id == id) return static_cast<int>(i);
    return -1;
}

int TestDesign::referenceIndex() const {
    for (std::size_t i = 0; i < systems.size(); ++i)
        if (systems[i].role == SystemRole::Reference) return static_cast<int>(i);
    return -1;
}

void validateDesign(const TestDesign& d) {
    if (d.name.empty()) throw ParamError("TestDesign.name", "must not be empty");
    std::set<std::string> names;
    for (const System& s : d.systems) {
        if (s.name.empty()) throw ParamError("TestDesign.systems", "a system has no name");
        if (!names.insert(s.name).second)
            throw ParamError("TestDesign.systems", "system '" + s.name + "' is listed twice");
        if (s.role == SystemRole::AttentionCheck && !(s.acceptMin <= s.acceptMax))
            throw ParamError("TestDesign.systems", "attention system '" + s.name + "' accepts an empty range");
    }
    const int candidates = countRole(d, SystemRole::Candidate);
    const int references = countRole(d, SystemRole::Reference);
    const int anchors = countRole(d, SystemRole::LowAnchor) + countRole(d, SystemRole::MidAnchor);
    const int attention = countRole(d, SystemRole::AttentionCheck);
    switch (d.kind) {
    case TestKind::Mos:
        if (candidates < 1) throw ParamError("TestDesign.systems", "a MOS test needs at least one system");
        if (references + anchors > 0)
            throw ParamError("TestDesign.systems", "a MOS test has no reference or anchors; make them candidates");
        break;
    case TestKind::Cmos:
        if (references != 1 || candidates < 1)
            throw ParamError("TestDesign.systems", "a CMOS test needs one reference and at least one other system");
        if (anchors > 0) throw ParamError("TestDesign.systems", "a CMOS test has no anchors");
        break;
    case TestKind::Mushra:
        if (references != 1) throw ParamError("TestDesign.systems", "a MUSHRA test needs exactly one reference");
        if (anchors < 1)
            throw ParamError("TestDesign.systems", "a MUSHRA test needs at least one anchor (ITU-R BS.1534-3)");
        if (candidates < 1) throw ParamError("TestDesign.systems", "a MUSHRA test needs a system under test");
        if (attention > 0)
            throw ParamError("TestDesign.systems",
                             "a MUSHRA test screens with its hidden reference and anchors, not attention systems");
        break;
    case TestKind::Ab:
        if (candidates < 2) throw ParamError("TestDesign.systems", "an A/B test needs at least two systems");
        if (references + anchors > 0) throw ParamError("TestDesign.systems", "an A/B test has no reference or anchors");
        break;
    }
    if (d.lines.empty()) throw ParamError("TestDesign.lines", "the test has no lines");
    std::set<std::string> ids;
    for (const Line& line : d.lines) {
        if (line.id.empty()) throw ParamError("TestDesign.lines", "a line has no id");
        if (!ids.insert(line.id).second) throw ParamError("TestDesign.lines", "line '" + line.id + "' is listed twice");
        if (line.audio.size() != d.systems.size())
            throw InputError(d.name, "line '" + line.id + "' does not list one take per system");
        for (std::size_t s = 0; s < d.systems.size(); ++s)
            if (line.audio[s].empty())
                throw InputError(d.name, "line '" + line.id + "' has no take of system '" + d.systems[s].name + "'");
    }
    const PlanParams& p = d.plan;
    if (p.raters < 1 || p.raters > 10000) throw ParamError("PlanParams.raters", "must be 1 … 10000");
    if (p.linesPerRater < 0 || p.linesPerRater > static_cast<int>(d.lines.size()))
        throw ParamError("PlanParams.linesPerRater", "must be 0 (all) … the number of lines");
    if (p.repeatsPerRater < 0) throw ParamError("PlanParams.repeatsPerRater", "must not be negative");
    if (p.attentionPerRater < 0) throw ParamError("PlanParams.attentionPerRater", "must not be negative");
    if (p.attentionPerRater > 0 && attention == 0)
        throw ParamError("PlanParams.attentionPerRater", "needs a system with the attention role");
}

std::string defaultInstructions(TestKind kind) {
    switch (kind) {
    case TestKind::Mos:
        return "Listen to each sentence and rate its overall quality from 1 (bad) to 5 (excellent).";
    case TestKind::Cmos:
        return "Listen to both versions of each sentence and rate how the second compares with the first, "
               "from -3 (much worse) to +3 (much better).";
    case TestKind::Mushra:
        return "Listen to the reference, then rate every version of the sentence from 0 to 100 against it. "
               "One of the versions is the reference itself: give it 100.";
    case TestKind::Ab:
        return "Listen to both versions of each sentence and choose the one you prefer.";
    }
    return {};
}

}  // namespace earmark::listening
