// Scanning takes: each take is analysed (F0, energy, loudness; no mel),
// measured and checked against the per-take rules; many takes run on a pool
// of threads, each with its own analysis, and results keep the input order.
// Memory holds one take's audio and tracks per thread plus one small row per
// take, so it does not grow with the audio of the whole set.
#pragma once

#include "earmark/analysis/take_analysis.hpp"
#include "earmark/longform/findings.hpp"
#include "earmark/prosody/suspects.hpp"
#include "earmark/prosody/word_measures.hpp"
#include "earmark/scan/scan_input.hpp"
#include "earmark/scan/word_checks.hpp"

#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace earmark {

struct ScanRow {
    std::size_t index = 0;          // ScanItem::index
    std::string id;
    std::string file;               // the audio path as listed
    bool failed = false;            // the audio could not be read or analysed
    std::string status = "ok";      // "ok", "ok; timings ignored: …", or "error: …"
    std::optional<TakeMeasures> measures;  // empty when failed
    std::vector<TakeSuspect> suspects;     // per-take suspects, then set-level ones (loud/quiet)
    std::vector<Finding> findings;         // long-form findings, for takes of at least
                                           // rules.longform.scanMinTakeSeconds (not scored)
    TakeWords words;                // word evidence, for takes with text in a voice the model covers
    // Per-word prosody of the word tier the measures used, and where its times came from:
    // "timings" (the take's timings file), "model" (the word evidence's word tier) or "" (no word tier).
    // The report writes both (CSV column `word_times`; JSON `word_times` and `word_measures`).
    std::vector<WordMeasures> wordProsody;
    std::string wordTimesFrom;
    double takeScore = 0.0;         // score of the per-take suspects
    double score = 0.0;             // takeScore + set-level suspects (applySetRules)
};

struct ScanSettings {
    ScanRules rules;
    int jobs = 0;                   // worker threads; 0 = std::thread::hardware_concurrency()
    AnalysisParams analysis = defaultAnalysis();
    std::string voice = "en-us";    // voice of takes whose manifest row names none (word evidence)

    // F0, energy and loudness on; the mel spectrogram off (the scan does not use it).
    static AnalysisParams defaultAnalysis();
};

// Analyses and checks one take. Read errors become a failed row (never
// thrown); a bad timings file is noted in the status and the take is
// measured without it. Takes of at least rules.longform.scanMinTakeSeconds
// also get the long-form findings (longform/findings.hpp, no chunk list);
// when those cannot be measured the status says why. A take with text whose
// voice (its own, else settings.voice) the acoustic model covers gets word
// evidence and the coverage suspects (word_checks.hpp) when any word rule is
// on; text that cannot be aligned, or evidence that placed under half of
// the script's words (acoustic/evidence_trust.hpp), is noted in the status
// ("ok; words not checked: …") and not used. The per-word measures and suspects use the timings file's
// word tier, else the word evidence's (the model's) word tier. Throws Cancelled when `progress` asks to stop.
ScanRow scanTake(const ScanItem& item, const ScanSettings& settings, Progress progress = {});

struct ScanProgress {
    std::size_t done = 0;           // rows finished
    std::size_t total = 0;          // items to scan
    double audioSeconds = 0.0;      // audio in the finished rows
    double elapsedSeconds = 0.0;
};

// Called on the calling thread about every `intervalSeconds` and once at the
// end; returning false asks the scan to stop (running takes are abandoned,
// finished rows are kept).
using ScanObserver = std::function<bool(const ScanProgress&)>;

struct ScanRun {
    std::vector<ScanRow> rows;      // finished rows in input order
    std::size_t total = 0;          // items given
    bool partial = false;           // stopped before every item was scanned
};

// Runs scanTake over the items on settings.jobs threads. The observer is
// called on the calling thread after every finished take and at least every
// intervalSeconds; when it returns false no further take is started and the
// takes in hand are dropped. Rows have no
// set-level suspects yet (see applySetRules). Throws ParamError for invalid
// rules or analysis parameters before any work starts.
ScanRun runScan(const std::vector<ScanItem>& items, const ScanSettings& settings,
                const ScanObserver& observer = {}, double intervalSeconds = 0.25);

}  // namespace earmark
