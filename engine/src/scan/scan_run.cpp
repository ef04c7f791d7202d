#include "earmark/scan/scan_run.hpp"

#include "earmark/acoustic/evidence_trust.hpp"
#include "earmark/core/error.hpp"
#include "earmark/prosody/take_measures.hpp"
#include "earmark/tiers/timings_file.hpp"

#include <algorithm>
#include <atomic>
#include <chrono>
#include <condition_variable>
#include <mutex>
#include <optional>
#include <thread>

namespace earmark {
namespace {

bool blank(const std::string& s) { return s.find_first_not_of(" \t\r\n") == std::string::npos; }

// Word evidence and the coverage suspects; a text that cannot be aligned is noted in the status.
// Returns the evidence (its tiers give the word times of a take without timings), or nothing.
std::optional<WordEvidenceResult> checkWords(const ScanItem& item, const Signal& signal,
                                             const ScanSettings& settings, ScanRow& row, Progress progress) {
    if (!settings.rules.wordEvidenceEnabled() || blank(item.text)) return std::nullopt;
    WordEvidenceParams params;
    params.voice = item.voice.empty() ? settings.voice : item.voice;
    if (!modelCoversVoice(params.voice)) return std::nullopt;
    params.minExtraSeconds = settings.rules.extraSpeech.minSeconds;
    std::optional<WordEvidenceResult> evidence;
    try {
        evidence = gatherWordEvidence(signal, item.text, params, progress);
    } catch (const InputError& e) {
        row.status += "; words not checked: " + e.subject() + " " + e.problem();
        return std::nullopt;
    }
    // Too few of the script's words placed: every word would read as skipped or extra, and the
    // model's word tier would make the per-word measures (and the rate suspects) wrong. Say so
    // instead, as the window does.
    if (const std::string doubt = evidenceDoubt(*evidence); !doubt.empty()) {
        row.status += "; words not checked: " + doubt;
        return std::nullopt;
    }
    row.words = summariseWords(*evidence);
    return evidence;
}

}  // namespace

AnalysisParams ScanSettings::defaultAnalysis() {
    AnalysisParams p;
    p.tracks.mel = false;
    return p;
}

ScanRow scanTake(const ScanItem& item, const ScanSettings& settings, Progress progress) {
    ScanRow row;
    row.index = item.index;
    row.id = item.id;
    row.file = item.audioPath;
    try {
        const TakeAnalysis analysis = analyseFile(item.audioPath, settings.analysis, progress);
        // Word evidence first: a take with text but no timings gets its per-word measures from the
        // model's word tier.
        const auto evidence = checkWords(item, analysis.signal, settings, row, progress);
        Transcript transcript;
        transcript.text = item.text;
        if (!item.timingsPath.empty()) {
            try {
                TimingsReadOptions options;
                options.takeDurationS = analysis.signal.durationSeconds();
                transcript = transcriptFrom(loadTimings(item.timingsPath, options).tiers, item.text);
                if (transcript.hasWords()) row.wordTimesFrom = "timings";
            } catch (const Error& e) {
                row.status = std::string("ok; timings ignored: ") + e.what() + row.status.substr(2);  // after "ok"
            }
        }
        if (!transcript.hasWords() && evidence) {
            transcript = transcriptFrom(evidence->tiers, item.text);
            if (transcript.hasWords()) row.wordTimesFrom = evidence->method;
        }
        const auto context =
            ProsodyContext::fromAnalysis(analysis, std::move(transcript), settings.rules.prosodyParams());
        row.measures = measureTake(context, measureLevels(analysis));
        row.suspects = findSuspects(context, *row.measures, settings.rules);
        row.wordProsody = measureWords(context);
        if (analysis.signal.durationSeconds() >= settings.rules.longform.scanMinTakeSeconds) {
            try {
                row.findings = analyseLongform(analysis.signal, {}, settings.rules.longform).findings;
            } catch (const InputError& e) {
                row.status += "; long-form not measured: " + e.problem();
            }
        }
        for (auto& s : findArtefactSuspects(analysis.signal, context, settings.rules, progress))
            row.suspects.push_back(std::move(s));
        for (auto& s : coverageSuspects(row.words, settings.rules)) row.suspects.push_back(std::move(s));
    } catch (const Cancelled&) {
        throw;
    } catch (const std::bad_alloc&) {
        throw;  // not a fault of this take: stop the scan
    } catch (const std::exception& e) {
        // A bad file is reported in its row; the scan goes on.
        row.failed = true;
        row.status = std::string("error: ") + e.what();
        row.measures.reset();
        row.suspects.clear();
        row.wordProsody.clear();
        row.wordTimesFrom.clear();
        return row;
    }
    row.takeScore = totalScore(row.suspects, settings.rules);
    row.score = row.takeScore;
    return row;
}

ScanRun runScan(const std::vector<ScanItem>& items, const ScanSettings& settings, const ScanObserver& observer,
                double intervalSeconds) {
    settings.rules.validate();
    if (settings.jobs < 0) throw ParamError("ScanSettings.jobs", "must be >= 0 (0 = all cores)");
    const int jobs = std::max(1, std::min<int>(settings.jobs > 0 ? settings.jobs
                                                                 : static_cast<int>(std::thread::hardware_concurrency()),
                                               static_cast<int>(std::max<std::size_t>(items.size(), 1))));
    std::vector<std::optional<ScanRow>> slots(items.size());
    std::atomic<std::size_t> next{0};
    std::atomic<bool> stop{false};
    std::mutex mutex;
    std::condition_variable wake;
    std::size_t done = 0, observed = 0, running = static_cast<std::size_t>(jobs);
    double audioSeconds = 0.0;
    std::exception_ptr failure;

    auto worker = [&] {
        const Progress progress([&](double) { return !stop.load(std::memory_order_relaxed); });
        try {
            for (;;) {
                if (stop.load()) break;
                const std::size_t i = next.fetch_add(1);
                if (i >= items.size()) break;
                ScanRow row = scanTake(items[i], settings, progress);
                const double seconds = row.measures ? row.measures->durationS : 0.0;
                slots[i] = std::move(row);
                std::unique_lock lock(mutex);
                const std::size_t mine = ++done;
                audioSeconds += seconds;
                wake.notify_all();
                // With an observer, the next take starts only after it has seen
                // this one: a stop it asks for then takes effect at once.
                if (observer) wake.wait(lock, [&] { return observed >= mine || stop.load(); });
            }
        } catch (const Cancelled&) {
            // Stop asked: the take in hand is dropped.
        } catch (...) {
            std::lock_guard lock(mutex);
            if (!failure) failure = std::current_exception();
            stop = true;
        }
        std::lock_guard lock(mutex);
        --running;
        wake.notify_all();
    };
    const auto start = std::chrono::steady_clock::now();
    std::vector<std::thread> pool;
    pool.reserve(static_cast<std::size_t>(jobs));
    for (int j = 0; j < jobs; ++j) pool.emplace_back(worker);

    auto snapshot = [&] {
        ScanProgress p;
        p.done = done;
        p.total = items.size();
        p.audioSeconds = audioSeconds;
        p.elapsedSeconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        return p;
    };
    {
        std::unique_lock lock(mutex);
        const auto interval = std::chrono::duration<double>(std::max(0.01, intervalSeconds));
        while (running > 0) {
            wake.wait_for(lock, interval, [&] { return running == 0 || (observer && done != observed); });
            if (observer && running > 0) {
                const ScanProgress p = snapshot();
                lock.unlock();
                const bool goOn = observer(p);
                lock.lock();
                if (!goOn) stop = true;
                observed = std::max(observed, p.done);
                wake.notify_all();
            }
        }
    }
    for (auto& t : pool) t.join();
    if (failure) std::rethrow_exception(failure);

    ScanRun run;
    run.total = items.size();
    for (auto& slot : slots)
        if (slot) run.rows.push_back(std::move(*slot));
    run.partial = run.rows.size() < items.size();
    if (observer) observer(snapshot());
    return run;
}

}  // namespace earmark
