// earmark-cli mark: add, list and delete marks in a session. A new mark
// carries a snapshot of its span's measures (earmark/marks/mark_measures.hpp).
#include "actions.hpp"
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "rater_option.hpp"

#include "earmark/core/error.hpp"
#include "earmark/export/defect_list.hpp"
#include "earmark/marks/mark_measures.hpp"
#include "earmark/prosody/transcript.hpp"
#include "earmark/store/session.hpp"
#include "earmark/store/tier_rows.hpp"

#include <cmath>
#include <cstdio>
#include <functional>
#include <map>

namespace earmark::cli {
namespace {

const std::string& onlyFile(const Arguments& args) {
    if (args.positionals().size() != 1) throw UsageError("expects exactly one session FILE (see --help)");
    return args.positionals().front();
}

TakeId requireTake(const Session& session, const std::string& key) {
    const auto id = session.findTake(key);
    if (!id) throw InputError(session.path(), "has no take '" + key + "' (see earmark-cli session list)");
    return *id;
}

double requireNumber(const Arguments& args, const char* name) {
    const auto v = args.number(name);
    if (!v) throw UsageError(std::string("needs --") + name + " SECONDS");
    return *v;
}

// Measures of the span from the take's audio, word tier and text; only the
// duration when the audio is missing (the mark is still worth keeping).
MeasureSnapshot snapshotFor(const Session& session, const Take& take, double start, double end) {
    if (!session.audioExists(take.id)) {
        std::fprintf(stderr, "warning: %s is missing; the mark keeps only its duration as a measure\n",
                     take.audioPath.c_str());
        return {{"duration_s", end - start}};
    }
    const TakeAnalysis analysis = analyseFile(take.audioPath, markMeasureAnalysisParams());
    const TierSet tiers = toTierSet(session.tiers(take.id), analysis.info.durationSeconds());
    const ProsodyContext context = ProsodyContext::fromAnalysis(analysis, transcriptFrom(tiers, take.text));
    return measureMarkSpan(context, start, end);
}

std::string spanText(const Mark& m) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.3f-%.3f s", m.startSeconds, m.endSeconds);
    return buf;
}

std::string kindText(const Mark& m) {
    std::string kind(categoryName(m.category));
    if (!m.subtype.empty()) kind += "/" + m.subtype;
    return kind;
}

int runAdd(const Arguments& args) {
    const std::string& file = onlyFile(args);
    MarkDraft draft;
    const std::string categoryText = args.valueOr("category", "");
    if (categoryText.empty()) throw UsageError("needs --category (" + categoryNameList() + ")");
    const auto category = parseCategory(categoryText);
    if (!category)
        throw UsageError("unknown category '" + categoryText + "' (known: " + categoryNameList() + ")");
    draft.category = *category;
    draft.subtype = args.valueOr("subtype", "");
    const std::string severityText = args.valueOr("severity", "minor");
    const auto severity = parseSeverity(severityText);
    if (!severity)
        throw UsageError("unknown severity '" + severityText + "' (known: " + severityNameList() + ")");
    draft.severity = *severity;
    draft.startSeconds = requireNumber(args, "start");
    draft.endSeconds = requireNumber(args, "end");
    draft.note = args.valueOr("note", "");

    Session session = Session::open(file);
    actAsRater(session, args);
    draft.rater = session.rater();
    const auto key = args.value("take");
    if (!key) throw UsageError("needs --take ID (a take id, line id or audio file name)");
    const Take take = session.take(requireTake(session, *key));
    draft.validate(take.durationSeconds);  // before the analysis, so a bad span fails fast
    draft.measures = snapshotFor(session, take, draft.startSeconds, draft.endSeconds);
    const MarkEdit edit = session.addMark(take.id, draft);
    std::printf("%lld\n", static_cast<long long>(edit.markId()));
    std::fprintf(stderr, "added mark %lld to take %lld (%s), %s, %s%s%s\n", static_cast<long long>(edit.markId()),
                 static_cast<long long>(take.id), take.lineId.c_str(), spanText(*edit.after).c_str(),
                 kindText(*edit.after).c_str(), edit.after->words.empty() ? "" : ": ",
                 edit.after->words.c_str());
    return kExitOk;
}

int runList(const Arguments& args) {
    const Session session = Session::open(onlyFile(args), OpenMode::ReadOnly);
    std::optional<TakeId> take;
    if (auto key = args.value("take")) take = requireTake(session, *key);
    std::map<TakeId, std::string> lineOf;
    for (const Take& t : session.takes()) lineOf[t.id] = t.lineId.empty() ? t.storedAudioPath : t.lineId;
    if (auto json = args.value("json")) {
        writeTextOutput(*json, defectListToJson(collectDefects(session, take)));
        if (*json == "-") return kExitOk;  // stdout holds the JSON instead of the table
    }
    const auto marks = session.marks(take);
    std::printf("%5s  %5s  %-14s %-19s %-26s %-8s %-12s %s\n", "id", "take", "line", "span", "category", "severity",
                "rater", "words / note");
    for (const Mark& m : marks) {
        std::string detail = m.words;
        if (!m.note.empty()) detail += (detail.empty() ? "" : " / ") + m.note;
        for (char& c : detail)
            if (c == '\n' || c == '\r' || c == '\t') c = ' ';
        std::string rater = m.rater.empty() ? "-" : m.rater;
        for (char& c : rater)
            if (c == '\n' || c == '\r' || c == '\t') c = ' ';
        std::printf("%5lld  %5lld  %-14s %-19s %-26s %-8s %-12s %s\n", static_cast<long long>(m.id),
                    static_cast<long long>(m.takeId), lineOf[m.takeId].c_str(), spanText(m).c_str(),
                    kindText(m).c_str(), std::string(severityName(m.severity)).c_str(), rater.c_str(),
                    detail.c_str());
    }
    std::fprintf(stderr, "%zu mark(s)\n", marks.size());
    return kExitOk;
}

int runDelete(const Arguments& args) {
    Session session = Session::open(onlyFile(args));
    actAsRater(session, args);
    const auto id = args.number("id");
    if (!id || *id < 1 || std::floor(*id) != *id) throw UsageError("needs --id N (a mark id from mark list)");
    const MarkEdit edit = session.deleteMark(static_cast<MarkId>(*id));
    std::printf("deleted mark %lld (take %lld, %s, %s)\n", static_cast<long long>(edit.markId()),
                static_cast<long long>(edit.takeId), spanText(*edit.before).c_str(), kindText(*edit.before).c_str());
    return kExitOk;
}

const std::map<std::string, Action>& actions() {
    static const std::map<std::string, Action> table = {
        {"add",
         {"FILE --take ID --start S --end S --category C [OPTIONS]",
          "pin a mark on a span of a take; prints the new mark's id",
          {{"take", "ID", "", "take id, line id or audio file name"},
           {"start", "S", "", "span start, seconds from the start of the take"},
           {"end", "S", "", "span end, seconds"},
           {"category", "C", "", "one of " + categoryNameList()},
           {"subtype", "T", "", "a subtype of the category, e.g. flat, rushed, click"},
           {"severity", "V", "minor", "one of " + severityNameList()},
           {"note", "TEXT", "", "free note (UTF-8)"},
           raterOption()},
          runAdd}},
        {"list",
         {"FILE [--take ID] [--json FILE|-]", "list marks by queue order and time, with their rater",
          {{"take", "ID", "", "only the marks of this take"},
           {"json", "FILE|-", "", "also write them as a defect list JSON (docs/defect-list.md; each mark's "
                                  "\"rater\"); - = stdout, instead of the table"}},
          runList}},
        {"delete", {"FILE --id N", "delete one mark", {{"id", "N", "", "the mark's id"}, raterOption()}, runDelete}},
    };
    return table;
}

void printActions(std::FILE* to) {
    std::fprintf(to, "usage: earmark-cli mark ACTION FILE [OPTIONS]\n\nactions:\n");
    for (const auto& [name, a] : actions()) std::fprintf(to, "  %-7s %s\n", name.c_str(), a.summary);
    std::fprintf(to, "\ncategories and subtypes:\n");
    for (MarkCategory c : allMarkCategories())
        std::fprintf(to, "  %-14s %s\n", std::string(categoryName(c)).c_str(),
                     subtypesOf(c).empty() ? "-" : subtypeNameList(c).c_str());
    std::fprintf(to, "\n'earmark-cli mark ACTION --help' lists the options of an action.\n");
}

}  // namespace

int runMark(const std::vector<std::string>& argv) {
    return runActions("mark", actions(), argv, printActions);
}

}  // namespace earmark::cli
