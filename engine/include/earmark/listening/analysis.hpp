// Analysis of a listening test's answers: per-system means with confidence
// intervals, pairwise comparisons with Holm's correction, A/B preference
// shares, and the per-line values behind box plots.
//
// What is computed (main answers of kept raters; repeats serve screening
// only, attention systems are left out):
// - MOS / MUSHRA / CMOS per system: mean over rater×line answers, 95 % t
//   interval over those answers, and a percentile bootstrap that resamples
//   raters and lines (both with replacement, the same draw for every
//   system), since answers of one rater or one line are not independent.
//   Resampling both ways over-covers when there is no rater or line effect
//   (Owen 2007, Ann. Appl. Statist. 1:386–411 — from memory): conservative.
//   CMOS values are "system against reference".
// - MOS / MUSHRA pairs of systems: the rater×line answers both systems got,
//   paired; Wilcoxon signed-rank and paired t on the differences a − b. The
//   test used for the decision (`chosen`): as asked, or with Auto the paired
//   t when the design is balanced (every rater×line cell has every system)
//   and Wilcoxon otherwise. Holm over all pairs. Effect sizes: Cohen's d_z
//   and the matched-pairs rank-biserial correlation.
// - CMOS: each system against the reference, one-sample tests of the CMOS
//   answers against 0; Holm over systems.
// - A/B: for each pair, how often `a` was preferred among decisive answers,
//   exact binomial test against 1/2, Clopper–Pearson interval, Holm over
//   pairs. Effect: the share − 1/2.
//
// Reproducible: the bootstrap draws from bootstrapSeed with our own mapping
// of std::mt19937_64 (the same numbers on every platform). Reports progress
// over the bootstrap rounds and can be cancelled (Cancelled).
// Errors: ParamError for bad parameters; the answers must have passed
// checkAnswers.
#pragma once

#include "earmark/core/progress.hpp"
#include "earmark/listening/answers.hpp"
#include "earmark/listening/hypothesis_tests.hpp"
#include "earmark/listening/screening.hpp"

#include <cstdint>
#include <string>
#include <vector>

namespace earmark::listening {

enum class PairedTest { Auto, Wilcoxon, PairedT };
std::string_view pairedTestName(PairedTest t);  // "auto", "wilcoxon", "paired-t"
std::optional<PairedTest> parsePairedTest(std::string_view name);

struct AnalysisParams {
    double alpha = 0.05;
    int bootstrapRounds = 2000;   // 0 = no bootstrap
    std::uint64_t bootstrapSeed = 1;
    PairedTest test = PairedTest::Auto;
};

struct SystemSummary {
    std::string system;
    SystemRole role = SystemRole::Candidate;
    int raters = 0, lines = 0;
    MeanInterval t;                       // n = answers
    double bootLow = 0, bootHigh = 0;     // NaN without bootstrap
};

struct PairComparison {
    std::string a, b;
    int n = 0;                 // pairs
    double meanDifference = 0; // mean of a − b
    TestResult pairedT, wilcoxon;
    std::string chosen;        // "paired-t" or "wilcoxon"
    double p = 0, pHolm = 0;   // of the chosen test; NaN when it is undefined
};

struct Preference {
    std::string a, b;
    int aPreferred = 0, bPreferred = 0, none = 0;
    BinomialResult test;       // successes = aPreferred of decisive answers
    double pHolm = 0;
};

struct LineValues {
    std::string line, system;
    std::vector<double> values;  // the kept raters' answers, ascending
};

struct Report {
    TestKind kind = TestKind::Mos;
    AnalysisParams params;
    Screening screening;
    int answersUsed = 0;
    bool balanced = false;
    std::vector<SystemSummary> systems;
    std::vector<PairComparison> pairs;
    std::vector<Preference> preferences;
    std::vector<LineValues> perLine;
};

Report analyse(const TestDesign& design, const std::vector<Answer>& answers, const AnalysisParams& params,
               const ScreeningParams& screening, const std::vector<std::string>& expectedRaters = {},
               Progress progress = {});

// Percentile bootstrap of per-system means over raters and lines. `cells` is
// raters × lines × systems (row-major), NaN where there is no answer. Returns
// per system {low, high} at 1 − alpha (NaN when never defined), and the
// bootstrap standard deviation of the mean (for checks).
struct BootstrapResult {
    std::vector<double> low, high, sd;
};
BootstrapResult bootstrapMeans(const std::vector<double>& cells, int raters, int lines, int systems, double alpha,
                               int rounds, std::uint64_t seed, Progress progress = {});

// Box-plot figures of ascending values (numpy's linear quantiles).
struct BoxFigures {
    double min = 0, q1 = 0, median = 0, q3 = 0, max = 0;
};
BoxFigures boxFigures(const std::vector<double>& ascending);
double quantileSorted(const std::vector<double>& ascending, double q);

}  // namespace earmark::listening
