// earmark-cli longform: measures of one long take over time, seams at chunk
// joins, drifts and stretches (docs/longform.md).
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/io/audio_file.hpp"
#include "earmark/longform/longform_json.hpp"
#include "earmark/prosody/rules.hpp"

#include <cstdio>

namespace earmark::cli {
namespace {

Arguments makeArguments() {
    return Arguments("longform", "TAKE [OPTIONS]",
                     {
                         {"json", "OUT|-", "", "write findings, per-window series, trends and joins as JSON "
                                               "to OUT, or to stdout with -"},
                         {"chunks", "FILE", "", "known join times, one per line in seconds (else pauses are "
                                                "the candidate joins)"},
                         {"rules", "FILE", "built in", "thresholds as JSON (sections longform, seam, "
                                                       "level_drift, … of docs/rules-default.json)"},
                         {"progress", "", "", "show progress on stderr even when it is not a terminal"},
                     });
}

void printSummary(const std::string& path, const LongformReport& report) {
    const auto& s = report.analysis.series;
    std::size_t measured = 0;
    for (const auto& w : s.windows) measured += w.measured;
    std::printf("file:      %s\n", path.c_str());
    std::printf("take:      %.1f s, %zu windows of %.0f s every %.0f s (%zu measured), %zu joins\n", s.durationS,
                s.windows.size(), s.windowSeconds, s.windowHopSeconds, measured, report.joins.size());
    for (const auto& t : s.trends)
        if (t.fit.valid)
            std::printf("trend:     %-18s %+.3f %s [%+.3f, %+.3f]%s\n", t.measure.c_str(), t.fit.slope, t.unit.c_str(),
                        t.fit.slopeLow, t.fit.slopeHigh, t.fit.significant() ? " significant" : "");
    std::printf("findings:  %zu\n", report.findings.size());
    for (const auto& f : report.findings)
        std::printf("  %9.2f-%-9.2f %s\n", f.startS, f.endS, f.reason.c_str());
}

}  // namespace

int runLongform(const std::vector<std::string>& argv) {
    Arguments args = makeArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1)
        throw UsageError("expects exactly one TAKE audio file (see earmark-cli longform --help)");
    const std::string path = args.positionals().front();
    const ScanRules rules = args.has("rules") ? loadRules(*args.value("rules")) : ScanRules{};
    std::vector<double> joins;
    const std::string chunks = args.valueOr("chunks", "");
    if (!chunks.empty()) joins = readChunkList(chunks);

    LongformReport report;
    LoadedAudio audio;
    {
        TerminalProgress bar("long-form " + path, args.has("progress"));
        const Progress progress = bar.progress();
        audio = loadAudio(path, {}, {}, progress.sub(0.0, 0.1));
        report = analyseLongform(audio.signal, joins, rules.longform, progress.sub(0.1, 1.0),
                                 chunks.empty() ? "chunks" : chunks);
    }
    const auto json = args.value("json");
    if (json)
        writeTextOutput(*json, longformToJson(report, rules.longform,
                                              {path, audio.info.sampleRate, audio.info.channels}));
    if (!json || *json != "-") printSummary(path, report);
    return kExitOk;
}

}  // namespace earmark::cli
