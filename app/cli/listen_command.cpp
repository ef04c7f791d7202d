// earmark-cli listen: listening tests in a session — create a test from the
// session's builds or from folders, print a rater's blind plan, import
// ratings gathered elsewhere, analyse into JSON, CSV and SVG pictures.
#include "actions.hpp"
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/core/error.hpp"
#include "earmark/listening/design_files.hpp"
#include "earmark/listening/report_files.hpp"
#include "earmark/store/listening_store.hpp"

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <limits>

namespace earmark::cli {
namespace {

namespace fs = std::filesystem;
using namespace earmark::listening;

const std::string& sessionFile(const Arguments& args) {
    if (args.positionals().empty()) throw UsageError("expects the session FILE first (see --help)");
    return args.positionals().front();
}

std::string requireName(const Arguments& args) {
    const auto name = args.value("test");
    if (!name || name->empty()) throw UsageError("needs --test NAME");
    return *name;
}

int wholeNumber(const Arguments& args, const char* name, int fallback, int min, int max) {
    const auto v = args.number(name);
    if (!v) return fallback;
    if (std::floor(*v) != *v || *v < min || *v > max)
        throw UsageError(std::string("--") + name + " must be a whole number from " + std::to_string(min) + " to " +
                         std::to_string(max));
    return static_cast<int>(*v);
}

std::uint64_t seedOf(const Arguments& args, const char* name) {
    const auto v = args.value(name);
    if (!v) return 1;
    try {
        std::size_t used = 0;
        const unsigned long long s = std::stoull(*v, &used);
        if (used != v->size()) throw std::invalid_argument("trailing text");
        return s;
    } catch (const std::exception&) {
        throw UsageError(std::string("--") + name + " must be a whole number >= 0");
    }
}

std::vector<std::string> commaList(const std::string& text) {
    std::vector<std::string> out;
    std::size_t start = 0;
    while (start <= text.size()) {
        const auto end = text.find(',', start);
        const std::string item = text.substr(start, end == std::string::npos ? std::string::npos : end - start);
        if (!item.empty()) out.push_back(item);
        if (end == std::string::npos) break;
        start = end + 1;
    }
    return out;
}

int runCreate(const Arguments& args) {
    const auto kind = parseKind(args.valueOr("kind", "mos"));
    if (!kind) throw UsageError("--kind must be mos, cmos, mushra or ab");
    Session session = Session::open(sessionFile(args));
    std::vector<SourceTake> takes;
    const std::vector<std::string> folders(args.positionals().begin() + 1, args.positionals().end());
    if (folders.empty()) {
        for (const Take& t : session.takes()) takes.push_back({t.build, t.lineId, t.text, t.audioPath});
    } else {
        takes = takesFromFolders(folders);
    }
    std::vector<std::pair<std::string, SystemRole>> roles;
    auto addRoles = [&](const char* option, SystemRole role) {
        for (const std::string& name : commaList(args.valueOr(option, ""))) roles.push_back({name, role});
    };
    addRoles("reference", SystemRole::Reference);
    addRoles("low-anchor", SystemRole::LowAnchor);
    addRoles("mid-anchor", SystemRole::MidAnchor);
    std::vector<std::pair<std::string, std::pair<double, double>>> attention;
    for (const std::string& spec : commaList(args.valueOr("attention", ""))) {
        double lo = 0, hi = 0;
        const auto colon = spec.find(':');
        const auto dots = spec.find("..", colon == std::string::npos ? 0 : colon);
        if (colon == std::string::npos || dots == std::string::npos ||
            std::sscanf(spec.c_str() + colon + 1, "%lf", &lo) != 1 || std::sscanf(spec.c_str() + dots + 2, "%lf", &hi) != 1)
            throw UsageError("--attention expects SYSTEM:MIN..MAX (the accepted answers), e.g. hum:1..2");
        roles.push_back({spec.substr(0, colon), SystemRole::AttentionCheck});
        attention.push_back({spec.substr(0, colon), {lo, hi}});
    }
    std::string subject = session.path();
    if (!folders.empty()) {
        subject.clear();
        for (const std::string& f : folders) subject += (subject.empty() ? "" : ", ") + f;
    }
    DesignDraft draft = designFromTakes(requireName(args), *kind, takes, roles, args.has("drop-incomplete"), subject);
    TestDesign& d = draft.design;
    for (const auto& [name, range] : attention) {
        System& s = d.systems[static_cast<std::size_t>(d.systemIndex(name))];
        s.acceptMin = range.first;
        s.acceptMax = range.second;
    }
    if (auto text = args.value("instructions")) d.instructions = *text;
    d.plan.raters = wholeNumber(args, "raters", 8, 1, 10000);
    d.plan.linesPerRater = wholeNumber(args, "lines-per-rater", 0, 0, 1000000);
    d.plan.repeatsPerRater = wholeNumber(args, "repeats", 0, 0, 1000000);
    d.plan.attentionPerRater = wholeNumber(args, "attention-trials", 0, 0, 1000000);
    d.plan.seed = seedOf(args, "seed");
    for (const std::string& note : draft.notes) std::fprintf(stderr, "note: %s\n", note.c_str());
    const ListeningTestInfo info = ListeningStore(session).createTest(d);
    const Plan plan = ListeningStore(session).plan(info.name);
    std::printf("created %s test '%s': %zu systems, %zu lines, %d rater slots, %zu trials per rater, seed %llu\n",
                std::string(kindName(d.kind)).c_str(), info.name.c_str(), d.systems.size(), d.lines.size(),
                d.plan.raters, plan.raters.front().trials.size(), static_cast<unsigned long long>(d.plan.seed));
    return kExitOk;
}

int runList(const Arguments& args) {
    Session session = Session::open(sessionFile(args), OpenMode::ReadOnly);
    for (const ListeningTestInfo& t : ListeningStore(session).tests())
        std::printf("%s\t%s\t%d/%d raters\t%d answers\t%s\n", t.name.c_str(), std::string(kindName(t.kind)).c_str(),
                    t.ratersJoined, t.raterSlots, t.answers, t.createdUtc.c_str());
    return kExitOk;
}

int runPlan(const Arguments& args) {
    const std::string name = requireName(args);
    const auto rater = args.value("rater");
    const auto slotArg = args.number("slot");
    if (!rater == !slotArg) throw UsageError("needs either --rater NAME (joins the test) or --slot N");
    Session session = Session::open(sessionFile(args), rater ? OpenMode::ReadWrite : OpenMode::ReadOnly);
    ListeningStore store(session);
    const TestDesign d = store.design(name);
    const int slot = rater ? store.joinRater(name, *rater) : wholeNumber(args, "slot", 1, 1, d.plan.raters) - 1;
    const Plan plan = store.plan(name);
    std::printf("# %s, rater slot %d%s\n# %s\n# trial\tline\ttakes\ttext\n", name.c_str(), slot + 1,
                rater ? (" (" + *rater + ")").c_str() : "", d.instructions.c_str());
    std::fputs(blindView(d, plan.raters[static_cast<std::size_t>(slot)]).c_str(), stdout);
    return kExitOk;
}

int runImport(const Arguments& args) {
    if (args.positionals().size() != 2) throw UsageError("expects FILE and one ratings CSV (see --help)");
    Session session = Session::open(sessionFile(args));
    const std::string csv = args.positionals()[1];
    const int stored = ListeningStore(session).importAnswers(requireName(args), readAnswersCsv(csv), csv);
    std::printf("imported %d answer(s) from %s\n", stored, csv.c_str());
    return kExitOk;
}

int runAnalyse(const Arguments& args) {
    const std::string name = requireName(args);
    const auto out = args.value("out");
    if (!out) throw UsageError("needs --out FOLDER for the report files");
    Session session = Session::open(sessionFile(args), OpenMode::ReadOnly);
    ListeningStore store(session);
    const TestDesign d = store.design(name);
    std::vector<Answer> answers = store.answers(name);
    checkAnswers(d, answers, session.path());
    listening::AnalysisParams p;
    p.bootstrapRounds = wholeNumber(args, "bootstrap", 2000, 0, 1000000);
    p.bootstrapSeed = seedOf(args, "seed");
    const auto test = parsePairedTest(args.valueOr("paired-test", "auto"));
    if (!test) throw UsageError("--paired-test must be auto, wilcoxon or paired-t");
    p.test = *test;
    ScreeningParams sp;
    sp.mushraPostScreening = !args.has("no-post-screening");
    if (auto v = args.number("max-repeat-difference")) sp.maxRepeatDifference = *v;
    sp.maxAttentionFailures = wholeNumber(args, "max-attention-failures", 0, 0, 1000000);
    TerminalProgress bar("analyse", false);
    const Report r = analyse(d, answers, p, sp, store.raters(name), bar.progress());

    std::error_code ec;
    fs::create_directories(*out, ec);
    if (ec) throw WriteError(*out, "cannot be created: " + ec.message());
    const fs::path dir(*out);
    // The texts end with their own line break; writeTextOutput adds one, so drop ours
    // (a CSV's last record keeps its CRLF).
    auto write = [&dir](const char* name, std::string text) {
        if (!text.empty() && text.back() == '\n') text.pop_back();
        writeTextOutput((dir / name).string(), text);
    };
    write("report.json", reportToJson(d, r));
    write("exclusions.csv", exclusionsCsv(r));
    write("answers.csv", answersToCsv(answers));
    write("means.svg", meansSvg(d, r));
    if (d.kind == TestKind::Ab) {
        write("preferences.csv", preferencesCsv(r));
    } else {
        write("systems.csv", systemsCsv(r));
        write("pairs.csv", pairsCsv(r));
        write("lines.svg", linesSvg(d, r));
    }
    std::printf("%s: %zu rater(s) kept, %zu exclusion(s), %d answer(s) used\n", name.c_str(), r.screening.kept.size(),
                r.screening.excluded.size(), r.answersUsed);
    for (const Exclusion& e : r.screening.excluded)
        std::printf("  excluded %s (%s): %s\n", e.rater.c_str(), e.rule.c_str(), e.reason.c_str());
    for (const SystemSummary& s : r.systems)
        std::printf("  %-16s mean %.3f  95%% CI [%.3f, %.3f]  bootstrap [%.3f, %.3f]  n=%d\n", s.system.c_str(),
                    s.t.mean, s.t.low, s.t.high, s.bootLow, s.bootHigh, s.t.n);
    for (const Preference& pr : r.preferences)
        std::printf("  %s over %s: %d of %d decisive (%.1f %%), p=%.4g, Holm p=%.4g\n", pr.a.c_str(), pr.b.c_str(),
                    pr.aPreferred, pr.aPreferred + pr.bPreferred, 100 * pr.test.share, pr.test.p, pr.pHolm);
    std::printf("report written to %s\n", out->c_str());
    return kExitOk;
}

const std::map<std::string, Action>& actions() {
    static const std::map<std::string, Action> table = {
        {"create",
         {"FILE --test NAME --kind K [FOLDER...] [OPTIONS]",
          "create a test from the session's builds (or one folder per system) with its plan",
          {{"test", "NAME", "", "the test's name"},
           {"kind", "K", "mos", "mos, cmos, mushra or ab"},
           {"reference", "SYSTEM", "", "the reference system (CMOS, MUSHRA)"},
           {"low-anchor", "SYSTEMS", "", "MUSHRA low-range anchors, comma-separated"},
           {"mid-anchor", "SYSTEMS", "", "MUSHRA mid-range anchors, comma-separated"},
           {"attention", "SYS:MIN..MAX", "", "attention systems with their accepted answers, comma-separated"},
           {"raters", "N", "8", "rater slots in the plan"},
           {"lines-per-rater", "N", "all", "lines each rater hears (balanced blocks)"},
           {"repeats", "N", "0", "trials each rater hears twice (consistency check)"},
           {"attention-trials", "N", "0", "attention-check trials per rater"},
           {"seed", "S", "1", "seed of the plan's randomisation"},
           {"instructions", "TEXT", "per kind", "what raters read first"},
           {"drop-incomplete", "", "", "leave out lines some system lacks (listed) instead of failing"}},
          runCreate}},
        {"list", {"FILE", "list the session's listening tests", {}, runList}},
        {"plan",
         {"FILE --test NAME (--rater NAME | --slot N)", "print one rater's plan, blind: no system or file names",
          {{"test", "NAME", "", "the test"},
           {"rater", "NAME", "", "the rater (joins the test, taking the next free slot)"},
           {"slot", "N", "", "a slot by number (1-based), without joining"}},
          runPlan}},
        {"import",
         {"FILE RATINGS.csv --test NAME", "store ratings gathered elsewhere (all rows or none)",
          {{"test", "NAME", "", "the test"}},
          runImport}},
        {"analyse",
         {"FILE --test NAME --out FOLDER [OPTIONS]",
          "screen raters, then means, intervals and paired tests as JSON, CSV and SVG",
          {{"test", "NAME", "", "the test"},
           {"out", "FOLDER", "", "where report.json, the CSV tables (with every stored answer) and the SVG pictures go"},
           {"bootstrap", "N", "2000", "bootstrap rounds over raters and lines (0 = none)"},
           {"seed", "S", "1", "seed of the bootstrap"},
           {"paired-test", "T", "auto", "auto (paired t when balanced, else Wilcoxon), wilcoxon or paired-t"},
           {"no-post-screening", "", "", "keep MUSHRA raters who fail the BS.1534-3 rule"},
           {"max-repeat-difference", "X", "1/4 of the scale", "mean |first - repeat| above which a rater is excluded"},
           {"max-attention-failures", "N", "0", "failed attention checks a rater may have"}},
          runAnalyse}},
    };
    return table;
}

void printActions(std::FILE* to) {
    std::fprintf(to, "usage: earmark-cli listen ACTION FILE [OPTIONS]\n\nactions:\n");
    for (const auto& [name, a] : actions()) std::fprintf(to, "  %-8s %s\n", name.c_str(), a.summary);
    std::fprintf(to, "\nformats: docs/listening-tests.md. 'earmark-cli listen ACTION --help' lists the options.\n");
}

}  // namespace

int runListen(const std::vector<std::string>& argv) { return runActions("listen", actions(), argv, printActions); }

}  // namespace earmark::cli
