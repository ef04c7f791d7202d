// A listening test: its kind, the systems compared (voice builds), the script
// lines every system rendered, and how raters' plans are drawn.
//
// Kinds and their scales:
// - Mos: ITU-T P.800 (1996) absolute category rating, 1 bad … 5 excellent;
//   one take per trial.
// - Cmos: ITU-T P.800 Annex E comparison category rating, −3 … +3; a trial
//   is a system against the reference, in random order. Answers are stored
//   as "system against reference" (positive = the system is better),
//   whatever order the rater heard.
// - Mushra: ITU-R BS.1534-3, 0 … 100 in five labelled intervals; a trial is
//   one line with every system, the hidden reference and the anchors in
//   random order, plus the open reference.
// - Ab: forced-choice preference between two systems (−1 second, +1 first,
//   0 no preference); a trial is one pair of systems on one line.
//
// Errors: validateDesign throws ParamError naming the field for a design
// that cannot be run, and InputError (subject = the design's name) for a
// line without a take of some system.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace earmark::listening {

enum class TestKind { Mos, Cmos, Mushra, Ab };

std::string_view kindName(TestKind kind);  // "mos", "cmos", "mushra", "ab"
std::optional<TestKind> parseKind(std::string_view name);

struct Scale {
    double min = 0, max = 0;
    bool whole = true;  // only whole numbers are valid answers
    std::vector<std::pair<double, std::string>> labels;  // value → label, ascending
};
Scale scaleOf(TestKind kind);

enum class SystemRole {
    Candidate,       // a system under test
    Reference,       // MUSHRA's reference (open and hidden); CMOS's baseline
    LowAnchor,       // MUSHRA low-range anchor (BS.1534-3: 3.5 kHz low-pass)
    MidAnchor,       // MUSHRA mid-range anchor (BS.1534-3: 7 kHz low-pass)
    AttentionCheck,  // a known-bad (or known-good) system whose answers must fall in [acceptMin, acceptMax]
};
std::string_view roleName(SystemRole role);  // "candidate", "reference", "low-anchor", "mid-anchor", "attention"
std::optional<SystemRole> parseRole(std::string_view name);

struct System {
    std::string name;    // never shown to raters
    SystemRole role = SystemRole::Candidate;
    std::string source;  // where its takes came from (a folder or a build tag); informational
    double acceptMin = 0, acceptMax = 0;  // AttentionCheck only: accepted answers (in answer terms)
};

struct Line {
    std::string id;
    std::string text;
    std::vector<std::string> audio;  // one audio path per system (same order as TestDesign::systems)
};

struct PlanParams {
    int raters = 1;                // planned rater slots
    int linesPerRater = 0;         // 0 = every line; fewer = balanced incomplete blocks of lines
    int repeatsPerRater = 0;       // trials heard twice, for the consistency check
    int attentionPerRater = 0;     // attention-check trials (needs an AttentionCheck system)
    std::uint64_t seed = 1;
};

struct TestDesign {
    std::string name;
    TestKind kind = TestKind::Mos;
    std::vector<System> systems;
    std::vector<Line> lines;
    std::string instructions;
    PlanParams plan;

    int systemIndex(std::string_view name) const;  // −1 when absent
    int lineIndex(std::string_view id) const;      // −1 when absent
    int referenceIndex() const;                     // −1 when none
};

void validateDesign(const TestDesign& design);

// The instructions shown before the first trial when the design has none
// (plain words of our own for each kind).
std::string defaultInstructions(TestKind kind);

}  // namespace earmark::listening
