// earmark-cli export: a session's marks as a defect list (CSV, JSON) and/or
// an example bundle folder (docs/defect-list.md).
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/core/error.hpp"
#include "earmark/export/bundle.hpp"
#include "earmark/export/defect_list.hpp"
#include "earmark/store/session.hpp"

#include <cstdio>

namespace earmark::cli {
namespace {

Arguments makeArguments() {
    return Arguments(
        "export", "FILE (--csv OUT | --json OUT | --bundle DIR) [OPTIONS]",
        {
            {"csv", "OUT|-", "", "defect list as CSV (RFC 4180), one row per mark; - = stdout"},
            {"json", "OUT|-", "", "defect list as JSON (docs/defect-list.schema.json); - = stdout"},
            {"bundle", "DIR", "", "example bundle: manifest.json, manifest.csv, one clipped WAV per mark"},
            {"take", "ID", "", "only the marks of this take (CSV and JSON)"},
            {"pad-ms", "MS", "300", "context kept before and after each mark in bundle clips"},
            {"fade-ms", "MS", "10", "fade in and out at the ends of each clip"},
            {"force", "", "", "replace an existing bundle folder (only an earlier Earmark bundle)"},
            {"progress", "", "", "show progress on stderr even when it is not a terminal"},
        });
}

// writeTextOutput ends the text with '\n'; drop the CSV's own final LF so the
// last record still ends in CRLF (RFC 4180) and no blank line follows.
std::string withoutFinalLf(std::string text) {
    if (!text.empty() && text.back() == '\n') text.pop_back();
    return text;
}

}  // namespace

int runExport(const std::vector<std::string>& argv) {
    Arguments args = makeArguments();
    args.parse(argv);
    if (args.helpRequested()) {
        std::fputs(args.helpText().c_str(), stdout);
        return kExitOk;
    }
    if (args.positionals().size() != 1) throw UsageError("expects exactly one session FILE (see --help)");
    if (!args.has("csv") && !args.has("json") && !args.has("bundle"))
        throw UsageError("needs at least one of --csv OUT, --json OUT, --bundle DIR");
    if (args.value("csv") == "-" && args.value("json") == "-")
        throw UsageError("--csv and --json cannot both write to stdout");
    BundleParams bundle;
    if (auto v = args.number("pad-ms")) bundle.padSeconds = *v / 1000.0;
    if (auto v = args.number("fade-ms")) bundle.fadeSeconds = *v / 1000.0;
    bundle.replaceExisting = args.has("force");
    bundle.validate();

    const Session session = Session::open(args.positionals().front(), OpenMode::ReadOnly);
    std::optional<TakeId> take;
    if (auto key = args.value("take")) {
        take = session.findTake(*key);
        if (!take) throw InputError(session.path(), "has no take '" + *key + "' (see earmark-cli session list)");
    }
    const bool toStdout = args.value("csv") == "-" || args.value("json") == "-";
    if (args.has("csv") || args.has("json")) {
        const DefectList list = collectDefects(session, take);
        if (auto out = args.value("csv")) writeTextOutput(*out, withoutFinalLf(defectListToCsv(list)));
        if (auto out = args.value("json")) writeTextOutput(*out, defectListToJson(list));
        if (!toStdout) std::fprintf(stderr, "exported %zu mark(s)\n", list.rows.size());
    }
    if (auto dir = args.value("bundle")) {
        if (take) throw UsageError("--take applies to --csv and --json only; a bundle holds every mark");
        BundleResult result;
        {
            TerminalProgress bar("exporting bundle", args.has("progress"));
            result = writeBundle(session, *dir, bundle, {}, bar.progress());
        }
        std::fprintf(stderr, "wrote %d clip(s) to %s\n", result.clips, result.folder.c_str());
    }
    return kExitOk;
}

}  // namespace earmark::cli
