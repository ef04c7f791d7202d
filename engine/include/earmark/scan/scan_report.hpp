// The scan's ranked output: set-level rules, ranking, CSV and JSON forms,
// reading them back and merging the outputs of shards. Column and field
// meanings: docs/scan.md.
#pragma once

#include "earmark/scan/scan_run.hpp"

#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct ScanReport {
    std::vector<ScanRow> rows;
    bool partial = false;              // some listed takes were not scanned (interrupted)
    std::size_t takesListed = 0;       // takes given to the run(s) that made these rows
    std::optional<double> setMedianLufs;  // median loudness of the measured takes, when the rule ran
    std::optional<WordScoreCalibration> wordCalibration;  // of the pronunciation rule, when it ran
};

// Loudness against the set: drops any earlier loud/quiet suspects, takes the
// median integrated loudness over measured rows (when at least
// rules.loudness.minTakes have one), adds Loud/Quiet suspects and sets
// score = takeScore + their scores.
// Pronunciation against the set: the word scores of every row that keeps
// them are calibrated (word_checks.hpp) — or `calibration` is used when
// given — and each such row gets its pronunciation suspect anew. Rows read
// back from a CSV have no word scores: they keep the pronunciation suspect
// they came with, counted at its rule's weight.
void applySetRules(ScanReport& report, const ScanRules& rules,
                   const std::optional<WordScoreCalibration>& calibration = std::nullopt);

// Order of the queue: measured rows by score (highest first, compared at the
// 0.001 written to the CSV), ties by input index; failed rows last, by input index.
void rankRows(std::vector<ScanRow>& rows);

// applySetRules + rankRows over a finished run.
ScanReport makeReport(ScanRun run, const ScanRules& rules,
                      const std::optional<WordScoreCalibration>& calibration = std::nullopt);

// The word-score calibration stored in a scan JSON (its
// "word_score_calibration"), marked as supplied. Throws InputError(path, …)
// when the file is not a scan JSON or holds no calibration.
WordScoreCalibration readWordCalibration(const std::string& path);

// One header line, then one CRLF-terminated record per row in ranking order.
std::string reportToCsv(const ScanReport& report);
std::string reportToJson(const ScanReport& report, const ScanRules& rules);

// Reads a report written by reportToCsv or reportToJson (JSON when the first
// non-blank character is '{'). Rows read from CSV keep each suspect's name
// and reason; value, threshold and span are NaN there (the JSON keeps all).
// Throws InputError(path, …) naming the line, row or field.
ScanReport readReport(const std::string& path);

// All rows of all parts, set-level rules applied again over the whole set,
// ranked. partial if any part was; takesListed is the sum. Throws
// InputError("merge", …) when a take id appears in two parts.
ScanReport mergeReports(std::vector<ScanReport> parts, const ScanRules& rules);

}  // namespace earmark
