// The plan of a listening test: for every rater slot, the trials in the order
// they are heard, each with its takes in the order they are shown and a blind
// label per take. Drawn from the design's seed, so the same design always
// gives the same plan; the plan is stored with the test so the order every
// rater heard is on record.
//
// How the plan is drawn:
// - Lines: with linesPerRater < all, the lines (in a seeded random order) are
//   dealt to raters in consecutive cyclic blocks, so every line is heard by
//   the same number of raters ±1 (a cyclic balanced incomplete-block layout).
// - Trials: MOS one take per trial (every system on each of the rater's
//   lines); CMOS one system against the reference per trial; A/B one pair of
//   systems; MUSHRA one line with every system. Trial order: a seeded shuffle
//   per rater.
// - Order within a trial: MUSHRA takes follow rows of a cyclic Latin square
//   used in turn over all raters' trials (rows and system order shuffled by
//   the seed), so each system sits in each position equally often ±1 over
//   the plan. Pairs alternate their order per pair, and the first order of
//   each pair follows the balanced round-robin rule, so each system is first
//   and second equally often ±1.
// - Repeats: repeatsPerRater of a rater's trials are heard again later with
//   a fresh take order; attention trials put an attention system on a random
//   line. Neither counts in the balance above.
// - Blind labels: "A", "B", … by position (MOS: "A"); names and files of
//   systems never appear in what a rater is shown (see blindView).
//
// Thread-safety: pure function of the design. Errors: as validateDesign.
#pragma once

#include "earmark/listening/test_design.hpp"

#include <string>
#include <vector>

namespace earmark::listening {

struct Stimulus {
    int system = 0;     // index into TestDesign::systems
    std::string label;  // the blind label shown to the rater
};

enum class TrialKind { Main, Repeat, Attention };
std::string_view trialKindName(TrialKind kind);  // "main", "repeat", "attention"

struct Trial {
    int line = 0;                     // index into TestDesign::lines
    std::vector<Stimulus> stimuli;    // in the order shown
    TrialKind kind = TrialKind::Main;
    int repeatOf = -1;                // Repeat: position of the first hearing in the rater's list
};

struct RaterPlan {
    int slot = 0;
    std::vector<Trial> trials;  // in the order heard
};

struct Plan {
    std::uint64_t seed = 0;
    std::vector<RaterPlan> raters;
};

Plan makePlan(const TestDesign& design);

// What a rater may see of one slot's plan: trial number, line id and text,
// and the blind labels — one line per trial. No system names, no file names.
std::string blindView(const TestDesign& design, const RaterPlan& plan);

}  // namespace earmark::listening
