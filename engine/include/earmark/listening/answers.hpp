// Answers of a listening test, from the window, the store or a CSV file
// gathered elsewhere, and their checks.
//
// An answer is about one system on one line: MOS and MUSHRA the score of
// that take; CMOS the score of `system` against `versus` (the reference),
// positive = `system` better; A/B +1 when `system` was preferred over
// `versus`, −1 when `versus` was, 0 no preference. checkAnswers rewrites
// CMOS and A/B answers into one canonical direction (see below), so the order
// a rater heard never matters.
//
// CSV (RFC 4180, UTF-8, header row; columns in any order, others ignored):
//   rater,line,system,score[,versus][,kind]
// `score` empty = not rated (kept so a rater who rated nothing is reported);
// `kind` is main (default) or repeat. See docs/listening-tests.md.
//
// Errors: InputError whose subject is the source (file) and whose problem
// names the row: unknown line or system, a score off the scale, a duplicate
// answer (naming both rows), a missing column.
#pragma once

#include "earmark/listening/plan.hpp"
#include "earmark/listening/test_design.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark::listening {

struct Answer {
    std::string rater;
    std::string line;    // line id
    std::string system;  // system name
    std::string versus;  // CMOS / A/B: the other system; "" otherwise
    std::optional<double> score;  // empty = not rated
    TrialKind kind = TrialKind::Main;  // Attention is derived from the system's role
    std::string origin;  // where it came from, for messages ("row 12")
};

// Validates every answer against the design and its scale and puts CMOS and
// A/B answers in canonical form: CMOS `versus` is always the reference (an
// answer written the other way round is negated; an empty versus means the
// reference); A/B `system` comes before `versus` in the design's order (the
// score is negated when swapped). Throws InputError(source, …).
void checkAnswers(const TestDesign& design, std::vector<Answer>& answers, const std::string& source);

std::vector<Answer> readAnswersCsv(const std::string& path);
std::string answersToCsv(const std::vector<Answer>& answers);

// The answer a rater gave on one trial of the plan, in answer terms: for a
// CMOS pair the rating is of the second take against the first; for A/B the
// rating is +1 first, −1 second, 0 none; for MUSHRA one score per take.
// `ratings` holds one value per stimulus for MOS/MUSHRA, one for CMOS/AB.
// ParamError when the count does not fit the trial.
std::vector<Answer> answersOfTrial(const TestDesign& design, const Trial& trial, const std::string& rater,
                                   const std::vector<double>& ratings);

}  // namespace earmark::listening
