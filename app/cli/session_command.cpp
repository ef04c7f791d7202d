// earmark-cli session: create a listening session, add takes, list the queue,
// set review statuses, attach word timings and relocate moved audio.
#include "actions.hpp"
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/store/session.hpp"
#include "earmark/store/take_list.hpp"
#include "earmark/store/tier_rows.hpp"
#include "earmark/tiers/timings_file.hpp"

#include <cstdio>
#include <filesystem>
#include <functional>
#include <map>

namespace earmark::cli {
namespace {

const std::string& sessionFile(const Arguments& args, std::size_t expected, const char* what) {
    if (args.positionals().size() != expected)
        throw UsageError(std::string("expects ") + what + " (see --help)");
    return args.positionals().front();
}

TakeId requireTake(const Session& session, const Arguments& args) {
    const auto key = args.value("take");
    if (!key) throw UsageError("needs --take ID (a take id, line id or audio file name)");
    const auto id = session.findTake(*key);
    if (!id) throw InputError(session.path(), "has no take '" + *key + "' (see earmark-cli session list)");
    return *id;
}

// Reads a timings file checked against the audio's length, printing its
// warnings. A file without a single interval is refused: storing it would
// only delete the take's tiers.
std::vector<TierRow> loadTierRows(const std::string& timingsPath, double durationSeconds) {
    TimingsReadOptions options;
    options.takeDurationS = durationSeconds;
    const LoadedTimings loaded = loadTimings(timingsPath, options);
    for (const auto& w : loaded.warnings) std::fprintf(stderr, "warning: %s: %s\n", timingsPath.c_str(), w.c_str());
    std::vector<TierRow> rows = toTierRows(loaded.tiers);
    if (rows.empty()) throw InputError(timingsPath, "holds no tiers (not one interval); nothing was stored");
    return rows;
}

// Stores tiers; a row the session refuses (a label with a control
// character…) is a fault of the timings file, so the message names it.
void storeTiers(Session& session, TakeId id, const std::vector<TierRow>& rows, const std::string& timingsPath) {
    try {
        session.setTiers(id, rows);
    } catch (const ParamError& e) {
        throw InputError(timingsPath, e.problem() + "; nothing was stored");
    }
}

int runNew(const Arguments& args) {
    const std::string& file = sessionFile(args, 1, "exactly one session FILE");
    Session::create(file);
    std::printf("created %s\n", file.c_str());
    return kExitOk;
}

int runAdd(const Arguments& args) {
    if (args.positionals().empty()) throw UsageError("expects a session FILE, then AUDIO files (see --help)");
    const std::string& file = args.positionals().front();
    const std::vector<std::string> audio(args.positionals().begin() + 1, args.positionals().end());
    const std::string build = args.valueOr("build", "");
    std::vector<NewTake> takes;
    if (auto csv = args.value("text-file")) takes = readTakeList(*csv, build);
    for (const auto& path : audio)
        takes.push_back({path, "", args.valueOr("text", ""), build});
    if (takes.empty()) throw UsageError("nothing to add: give AUDIO files or --text-file CSV");
    if ((args.has("text") || args.has("timings")) && (audio.size() != 1 || args.has("text-file")))
        throw UsageError("--text and --timings apply to exactly one AUDIO file (without --text-file)");

    // Timings are read before anything is added, so a bad file adds nothing.
    std::vector<TierRow> tiers;
    if (auto timings = args.value("timings")) tiers = loadTierRows(*timings, probeAudio(audio.front()).durationSeconds());

    Session session = Session::open(file);
    std::vector<TakeId> ids;
    session.inOneTransaction("adding takes", [&] {
        ids = session.addTakes(takes);
        if (!tiers.empty()) storeTiers(session, ids.front(), tiers, *args.value("timings"));
    });
    std::printf("added %zu take(s) to %s (ids %lld-%lld)\n", ids.size(), file.c_str(),
                static_cast<long long>(ids.front()), static_cast<long long>(ids.back()));
    return kExitOk;
}

int runList(const Arguments& args) {
    const std::string& file = sessionFile(args, 1, "exactly one session FILE");
    const Session session = Session::open(file, OpenMode::ReadOnly);
    const auto takes = session.takes();
    std::printf("%5s  %-16s %-11s %5s  %-8s %s\n", "id", "line", "status", "marks", "audio", "file");
    int missing = 0;
    for (const Take& t : takes) {
        const bool found = session.audioExists(t.id);
        missing += found ? 0 : 1;
        std::printf("%5lld  %-16s %-11s %5d  %-8s %s\n", static_cast<long long>(t.id),
                    t.lineId.empty() ? "-" : t.lineId.c_str(), std::string(reviewStatusName(t.status)).c_str(),
                    t.markCount, found ? "ok" : "MISSING", t.storedAudioPath.c_str());
    }
    std::fprintf(stderr, "%zu take(s), %d with missing audio\n", takes.size(), missing);
    return kExitOk;
}

int runStatus(const Arguments& args) {
    if (args.positionals().size() != 2) throw UsageError("expects a session FILE and a STATUS (see --help)");
    const std::string& name = args.positionals()[1];
    const auto status = parseReviewStatus(name);
    if (!status) throw UsageError("unknown status '" + name + "' (known: " + reviewStatusNameList() + ")");
    Session session = Session::open(args.positionals().front());
    const TakeId id = requireTake(session, args);
    const ReviewStatus previous = session.setStatus(id, *status);
    std::printf("take %lld: %s -> %s\n", static_cast<long long>(id), std::string(reviewStatusName(previous)).c_str(),
                name.c_str());
    return kExitOk;
}

int runTiers(const Arguments& args) {
    if (args.positionals().size() != 2) throw UsageError("expects a session FILE and a TIMINGS file (see --help)");
    Session session = Session::open(args.positionals().front());
    const TakeId id = requireTake(session, args);
    const std::string& timings = args.positionals()[1];
    const auto rows = loadTierRows(timings, session.take(id).durationSeconds);
    std::size_t replaced = 0;
    session.inOneTransaction("writing tiers", [&] {
        // Checked under the write lock: tiers stored meanwhile by someone else count too.
        replaced = session.tiers(id).size();
        if (replaced > 0 && !args.has("replace"))
            throw UsageError("take " + std::to_string(id) + " of " + session.path() + " already has tiers (" +
                             std::to_string(replaced) + " interval(s)); add --replace to replace them. "
                             "Nothing was changed");
        storeTiers(session, id, rows, timings);
    });
    std::printf("take %lld: stored %zu interval(s)%s\n", static_cast<long long>(id), rows.size(),
                replaced ? (" in place of " + std::to_string(replaced)).c_str() : "");
    return kExitOk;
}

int runRelocate(const Arguments& args) {
    if (args.positionals().empty()) throw UsageError("expects a session FILE (see --help)");
    Session session = Session::open(args.positionals().front());
    if (auto folder = args.value("folder")) {
        if (args.positionals().size() != 1 || args.has("take"))
            throw UsageError("--folder takes no --take and no AUDIO");
        const int moved = session.relocateMissingTakes(*folder);
        std::printf("relocated %d take(s)\n", moved);
        return kExitOk;
    }
    if (args.positionals().size() != 2) throw UsageError("expects FILE --take ID AUDIO, or FILE --folder DIR");
    const TakeId id = requireTake(session, args);
    const std::string previous = session.relocateTake(id, args.positionals()[1]);
    std::printf("take %lld: %s -> %s\n", static_cast<long long>(id), previous.c_str(),
                session.take(id).storedAudioPath.c_str());
    return kExitOk;
}

int runSalvage(const Arguments& args) {
    if (args.positionals().size() != 2)
        throw UsageError("expects the DAMAGED session file and a NEW file to create (see --help)");
    const auto r = Session::salvage(args.positionals()[0], args.positionals()[1]);
    std::printf("salvaged into %s: %d take(s), %d tier interval(s), %d suspect(s), %d mark(s)\n",
                args.positionals()[1].c_str(), r.takes, r.tierIntervals, r.suspects, r.marks);
    const int lost = r.takesUnreadable + r.takesWithTiersLost + r.takesWithSuspectsLost + r.marksUnreadable +
                     r.marksOfLostTakes;
    if (lost > 0)
        std::fprintf(stderr,
                     "not salvaged: %d take id(s) unreadable, %d take(s) without their tiers, %d without their "
                     "suspects, %d mark id(s) unreadable, %d mark(s) of unreadable takes\n",
                     r.takesUnreadable, r.takesWithTiersLost, r.takesWithSuspectsLost, r.marksUnreadable,
                     r.marksOfLostTakes);
    return kExitOk;
}

const std::map<std::string, Action>& actions() {
    static const std::map<std::string, Action> table = {
        {"new", {"FILE", "create an empty session file (refuses an existing file)", {}, runNew}},
        {"add",
         {"FILE [AUDIO...] [OPTIONS]",
          "add takes to the end of the queue (audio paths are stored relative to FILE)",
          {{"text-file", "CSV", "", "takes from a CSV with columns id,audio,text (paths relative to the CSV)"},
           {"build", "LABEL", "", "voice build / recording label for every added take"},
           {"text", "TEXT", "", "script text of the one AUDIO file"},
           {"timings", "FILE", "", "word/phone timings of the one AUDIO file (Earmark JSON, CSV, WebVTT)"}},
          runAdd}},
        {"list", {"FILE", "list the takes in queue order: id, line, status, marks, audio found, file", {}, runList}},
        {"status",
         {"FILE --take ID STATUS", "set a take's review status",
          {{"take", "ID", "", "take id, line id or audio file name"}},
          runStatus}},
        {"tiers",
         {"FILE --take ID TIMINGS [--replace]", "store a timings file as the take's tiers",
          {{"take", "ID", "", "take id, line id or audio file name"},
           {"replace", "", "", "replace the tiers the take already has (refused without it)"}},
          runTiers}},
        {"salvage",
         {"DAMAGED NEW", "copy every take, tier, suspect and mark still readable from a damaged session into "
                         "a new session file",
          {},
          runSalvage}},
        {"relocate",
         {"FILE (--take ID AUDIO | --folder DIR)",
          "point a take at moved audio, or find every missing take's file by name in DIR",
          {{"take", "ID", "", "take id, line id or audio file name"},
           {"folder", "DIR", "", "folder to search for the missing files"}},
          runRelocate}},
    };
    return table;
}

void printActions(std::FILE* to) {
    std::fprintf(to, "usage: earmark-cli session ACTION FILE [OPTIONS]\n\nactions:\n");
    for (const auto& [name, a] : actions()) std::fprintf(to, "  %-9s %s\n", name.c_str(), a.summary);
    std::fprintf(to, "\nstatuses: %s\n'earmark-cli session ACTION --help' lists the options of an action.\n",
                 reviewStatusNameList().c_str());
}

}  // namespace

int runSession(const std::vector<std::string>& argv) {
    return runActions("session", actions(), argv, printActions);
}

}  // namespace earmark::cli
