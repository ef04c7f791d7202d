// earmark-cli merge: combine the outputs of sharded scans into one ranking.
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"

#include "earmark/store/session_address.hpp"
#include "earmark/scan/scan_report.hpp"
#include "earmark/scan/scan_session.hpp"

#include <cstdio>

namespace earmark::cli {
int runMerge(const std::vector<std::string>& argv) {
    Arguments args("merge", "OUT PARTS...   (OUT: the merged CSV, - = stdout; PARTS: scan outputs, CSV or JSON)",
                   {
                       {"json", "FILE|-", "", "also write the merged ranking as JSON"},
                       {"rules", "FILE", "built in", "thresholds as JSON; use the scan's rules file"},
                       {"session", "FILE", "", "also write the merged queue into this session file"},
                   });
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    const auto& pos = args.positionals();
    if (pos.size() < 2) throw UsageError("expects OUT and at least one PART (see earmark-cli merge --help)");
    const ScanRules rules = args.value("rules") ? loadRules(*args.value("rules")) : ScanRules{};
    std::vector<ScanReport> parts;
    for (std::size_t i = 1; i < pos.size(); ++i) parts.push_back(readReport(pos[i]));
    const ScanReport merged = mergeReports(std::move(parts), rules);
    const auto json = args.value("json");
    if (json && *json == "-" && pos[0] == "-") throw UsageError("OUT and --json cannot both be stdout");
    std::vector<std::string> inputs(pos.begin() + 1, pos.end());
    inputs.push_back(args.valueOr("rules", "-"));
    refuseClobbering({{"OUT", pos[0]}, {"--json", json.value_or("-")}, {"--session", args.valueOr("session", "-")}},
                     inputs);
    writeCsvOutput(pos[0], reportToCsv(merged));
    if (json) writeTextOutput(*json, reportToJson(merged, rules));
    std::fprintf(stderr, "merge: %zu take(s) from %zu part(s)%s\n", merged.rows.size(), pos.size() - 1,
                 merged.partial ? " (some parts were partial)" : "");
    if (auto session = args.value("session")) {
        const auto s = writeScanSession(*session, merged);
        std::fprintf(stderr, "merge: session %s: %d take(s) added, %d updated, %d unreadable left out\n",
                     shownSessionAddress(*session).c_str(), s.added, s.updated, s.skipped);
    }
    return kExitOk;
}

}  // namespace earmark::cli
