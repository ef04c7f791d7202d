// earmark-cli session: create a listening session, add takes, list the queue,
// set review statuses, attach word timings and relocate moved audio.
#include "actions.hpp"
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "rater_option.hpp"

#include "earmark/agreement/assignment.hpp"
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/store/session.hpp"
#include "earmark/store/session_address.hpp"
#include "earmark/store/take_list.hpp"
#include "earmark/store/tier_rows.hpp"
#include "earmark/tiers/timings_file.hpp"

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <functional>
#include <map>
#include <set>
#include <sstream>

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
    const Session session = Session::create(file);
    std::printf("created %s\n", session.path().c_str());  // a URI without its password
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
    std::printf("added %zu take(s) to %s (ids %lld-%lld)\n", ids.size(), session.path().c_str(),
                static_cast<long long>(ids.front()), static_cast<long long>(ids.back()));
    return kExitOk;
}

int runList(const Arguments& args) {
    const std::string& file = sessionFile(args, 1, "exactly one session FILE");
    const Session session = Session::open(file, OpenMode::ReadOnly);
    auto takes = session.takes();
    if (const auto rater = args.value("rater")) {
        std::set<TakeId> mine;
        for (const Assignment& a : session.assignments())
            if (a.rater == *rater) mine.insert(a.takeId);
        std::erase_if(takes, [&](const Take& t) { return !mine.count(t.id); });
    }
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
    actAsRater(session, args);
    const TakeId id = requireTake(session, args);
    const ReviewStatus previous = session.setStatus(id, *status);
    std::printf("take %lld: %s -> %s\n", static_cast<long long>(id), std::string(reviewStatusName(previous)).c_str(),
                name.c_str());
    return kExitOk;
}

int runTiers(const Arguments& args) {
    if (args.positionals().size() != 2) throw UsageError("expects a session FILE and a TIMINGS file (see --help)");
    Session session = Session::open(args.positionals().front());
    actAsRater(session, args);
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

std::vector<std::string> splitNames(const std::string& list) {
    std::vector<std::string> out;
    std::stringstream in(list);
    for (std::string name; std::getline(in, name, ',');) {
        const auto first = name.find_first_not_of(' ');
        out.push_back(first == std::string::npos ? "" : name.substr(first, name.find_last_not_of(' ') - first + 1));
    }
    return out;
}

int runAssign(const Arguments& args) {
    const std::string& file = sessionFile(args, 1, "exactly one session FILE");
    const auto raters = args.value("raters");
    if (!raters) throw UsageError("needs --raters NAME,NAME,... (who reviews the takes)");
    agreement::AssignmentParams params;
    params.raters = splitNames(*raters);
    params.overlapFraction = args.number("overlap").value_or(0.0);
    const double perTake = args.number("per-take").value_or(0.0);
    const double seed = args.number("seed").value_or(1.0);
    if (perTake < 0 || std::floor(perTake) != perTake) throw UsageError("--per-take expects a whole number of raters");
    if (seed < 0 || std::floor(seed) != seed || seed > 9.0e15) throw UsageError("--seed expects a whole number >= 0");
    params.ratersPerSharedTake = static_cast<int>(perTake);
    params.seed = static_cast<std::uint64_t>(seed);
    Session session = Session::open(file);
    std::vector<TakeId> queue;
    for (const Take& t : session.takes()) queue.push_back(t.id);
    const std::vector<Assignment> drawn = agreement::assignTakes(queue, params);  // ParamError: exit 2
    session.setAssignments(drawn);
    std::map<std::string, int> load;
    std::map<TakeId, int> ratersOf;
    for (const Assignment& a : drawn) ++load[a.rater], ++ratersOf[a.takeId];
    int shared = 0;
    for (const auto& [take, n] : ratersOf) shared += n > 1;
    std::printf("assigned %zu take(s) of %s, %d of them to several raters (seed %llu)\n", queue.size(),
                session.path().c_str(),
                shared, static_cast<unsigned long long>(params.seed));
    for (const auto& [rater, n] : load) std::printf("  %-20s %d take(s)\n", rater.c_str(), n);
    return kExitOk;
}

int runHistory(const Arguments& args) {
    const std::string& file = sessionFile(args, 1, "exactly one session FILE");
    const Session session = Session::open(file, OpenMode::ReadOnly);
    std::optional<TakeId> take;
    if (args.has("take")) take = requireTake(session, args);
    const auto history = session.history(take);
    std::printf("%-24s  %-16s %5s %5s  %-12s %s\n", "when (UTC)", "rater", "take", "mark", "action", "detail");
    for (const HistoryEntry& h : history)
        std::printf("%-24s  %-16s %5lld %5s  %-12s %s\n", h.atUtc.c_str(), h.rater.empty() ? "-" : h.rater.c_str(),
                    static_cast<long long>(h.takeId), h.markId ? std::to_string(*h.markId).c_str() : "-",
                    std::string(historyActionName(h.action)).c_str(), h.detail.c_str());
    std::fprintf(stderr, "%zu change(s)\n", history.size());
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
                shownSessionAddress(args.positionals()[1]).c_str(), r.takes, r.tierIntervals, r.suspects, r.marks);
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

int runCopy(const Arguments& args) {
    if (args.positionals().size() != 2)
        throw UsageError("expects the session to copy and a NEW session to create (see --help)");
    const auto counts = Session::copy(args.positionals()[0], args.positionals()[1]);
    std::printf("copied %s into %s:", shownSessionAddress(args.positionals()[0]).c_str(),
                shownSessionAddress(args.positionals()[1]).c_str());
    for (const char* table : {"takes", "marks", "tier_intervals", "suspects", "review_history", "assignments",
                              "listening_answers"})
        std::printf(" %d %s", counts.at(table), table);
    std::printf("\n");
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
        {"list",
         {"FILE [--rater NAME]", "list the takes in queue order: id, line, status, marks, audio found, file",
          {{"rater", "NAME", "", "only the takes assigned to this rater (see session assign)"}},
          runList}},
        {"status",
         {"FILE --take ID STATUS", "set a take's review status",
          {{"take", "ID", "", "take id, line id or audio file name"}, raterOption()},
          runStatus}},
        {"tiers",
         {"FILE --take ID TIMINGS [--replace]", "store a timings file as the take's tiers",
          {{"take", "ID", "", "take id, line id or audio file name"},
           {"replace", "", "", "replace the tiers the take already has (refused without it)"},
           raterOption()},
          runTiers}},
        {"assign",
         {"FILE --raters A,B,... [--overlap F] [--per-take K] [--seed N]",
          "divide the queue among raters (replaces earlier assignments); a share F of the takes goes to "
          "several raters, for agreement ([agreement](docs/agreement.md))",
          {{"raters", "A,B,...", "", "the raters, comma-separated"},
           {"overlap", "F", "0", "share of the takes (0 to 1) that several raters review"},
           {"per-take", "K", "0 = all", "raters on each shared take (2 to the number of raters)"},
           {"seed", "N", "1", "seed of the draw: the same seed gives the same assignment"}},
          runAssign}},
        {"history",
         {"FILE [--take ID]", "who changed what and when: marks, statuses, tiers (oldest first)",
          {{"take", "ID", "", "only the changes of this take"}},
          runHistory}},
        {"salvage",
         {"DAMAGED NEW", "copy every take, tier, suspect and mark still readable from a damaged session into "
                         "a new session file",
          {},
          runSalvage}},
        {"copy",
         {"FROM NEW", "copy a whole session to a new one, between a file and a PostgreSQL server either way "
                      "(every row and id; [team sessions](docs/team-sessions.md))",
          {},
          runCopy}},
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
