// earmark-cli scan: measure every take of a folder or manifest, raise
// suspects and write the takes ranked by suspicion (docs/scan.md).
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/store/session_address.hpp"
#include "earmark/core/error.hpp"
#include "earmark/scan/scan_report.hpp"
#include "earmark/scan/scan_session.hpp"
#include "earmark/scan/shard_environment.hpp"

#include <unistd.h>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <optional>
#include <string>

namespace earmark::cli {
namespace {

Arguments scanArguments() {
    return Arguments(
        "scan", "INPUT [OPTIONS]   (INPUT: a folder of audio files, or a manifest CSV id,audio[,text][,timings][,voice])",
        {
            {"out", "FILE|-", "-", "ranked takes as CSV (RFC 4180); - = stdout"},
            {"json", "FILE|-", "", "also write the ranked takes as JSON, with every suspect's value and span"},
            {"jobs", "N", "all cores", "takes analysed at once (one thread each)"},
            {"shard", "K/N|auto", "1/1", "scan only part K of N (split by a hash of each take's id); auto[/N] = "
                                         "this task of a Slurm job array or Kubernetes indexed job"},
            {"rules", "FILE", "built in", "thresholds as JSON (see docs/rules-default.json)"},
            {"voice", "NAME", "en-us", "voice of takes whose manifest row names none; English voices get word "
                                       "evidence (pronunciation and script coverage)"},
            {"calibration", "FILE", "this set", "judge pronunciation against the word-score calibration of an "
                                                "earlier scan's JSON (e.g. of the whole set, for --shard)"},
            {"session", "FILE", "", "also write the ranked queue and suspects into this session file "
                                    "(created when missing)"},
            {"progress", "", "", "show progress on stderr even when it is not a terminal"},
        });
}

std::string clock(double seconds) {
    if (!std::isfinite(seconds) || seconds < 0) return "--:--";
    const long s = std::lround(seconds);
    char buf[32];
    if (s >= 3600) std::snprintf(buf, sizeof buf, "%ld:%02ld:%02ld", s / 3600, s / 60 % 60, s % 60);
    else std::snprintf(buf, sizeof buf, "%ld:%02ld", s / 60, s % 60);
    return buf;
}

}  // namespace

int runScan(const std::vector<std::string>& argv) {
    Arguments args = scanArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1)
        throw UsageError("expects exactly one INPUT folder or manifest (see earmark-cli scan --help)");
    ScanSettings settings;
    if (auto rules = args.value("rules")) settings.rules = loadRules(*rules);
    settings.voice = args.valueOr("voice", settings.voice);
    std::optional<WordScoreCalibration> calibration;
    if (auto c = args.value("calibration")) calibration = readWordCalibration(*c);
    if (auto jobs = args.number("jobs")) {
        if (*jobs < 1 || std::floor(*jobs) != *jobs) throw UsageError("--jobs expects a whole number >= 1");
        settings.jobs = static_cast<int>(*jobs);
    }
    Shard shard;
    std::string shardSource;
    if (auto s = args.value("shard")) {
        try {
            if (isAutoShard(*s)) {
                const auto fromEnvironment = shardFromEnvironment(*s, [](const std::string& name) {
                    const char* v = std::getenv(name.c_str());
                    return v ? std::optional<std::string>(v) : std::nullopt;
                });
                shard = fromEnvironment.shard;
                shardSource = ", from " + fromEnvironment.source;
            } else {
                shard = Shard::parse(*s);
            }
        } catch (const ParamError& e) {
            throw UsageError("--shard " + e.problem());
        }
    }
    const std::string out = args.valueOr("out", "-");
    const auto json = args.value("json");
    if (json && *json == "-" && out == "-") throw UsageError("--out and --json cannot both be stdout");
    const auto session = args.value("session");
    refuseClobbering({{"--out", out}, {"--json", json.value_or("-")}, {"--session", session.value_or("-")}},
                     {args.positionals().front(), args.valueOr("rules", "-")});

    const auto listed = listScanInput(args.positionals().front());
    const auto items = selectShard(listed, shard);
    const bool show = args.has("progress") || isatty(STDERR_FILENO);
    bool drew = false;
    auto observer = [&](const ScanProgress& p) {
        if (show) {
            const double hoursPerMinute = p.elapsedSeconds > 0 ? p.audioSeconds / 3600.0 / (p.elapsedSeconds / 60.0) : 0;
            const double eta = p.done > 0 ? p.elapsedSeconds * static_cast<double>(p.total - p.done) / p.done : NAN;
            std::fprintf(stderr, "\rscan  %zu/%zu takes  %.2f h audio/min  elapsed %s  ETA %s   ", p.done, p.total,
                         hoursPerMinute, clock(p.elapsedSeconds).c_str(), clock(eta).c_str());
            std::fflush(stderr);
            drew = true;
        }
        return !interruptRequested();
    };
    ScanRun run = earmark::runScan(items, settings, observer);
    if (drew) std::fputc('\n', stderr);
    const ScanReport report = makeReport(std::move(run), settings.rules, calibration);

    writeCsvOutput(out, reportToCsv(report));
    if (json) writeTextOutput(*json, reportToJson(report, settings.rules));
    int failed = 0, flagged = 0;
    for (const auto& r : report.rows) {
        failed += r.failed;
        flagged += !r.failed && !r.suspects.empty();
    }
    std::fprintf(stderr, "scan: %zu of %zu take(s) scanned%s: %d with suspects, %d unreadable\n",
                 report.rows.size(), items.size(),
                 shard.parts > 1 ? (" (shard " + std::to_string(shard.part) + "/" + std::to_string(shard.parts) +
                                    " of " + std::to_string(listed.size()) + shardSource + ")").c_str()
                                 : "",
                 flagged, failed);
    if (report.partial) {
        std::fprintf(stderr, "scan: interrupted; the output holds the %zu take(s) done so far (partial = yes)\n",
                     report.rows.size());
        return kExitCancelled;
    }
    if (session) {
        const auto s = writeScanSession(*session, report, items);
        std::fprintf(stderr, "scan: session %s: %d take(s) added, %d updated, %d unreadable left out\n",
                     shownSessionAddress(*session).c_str(), s.added, s.updated, s.skipped);
    }
    return kExitOk;
}

}  // namespace earmark::cli
