// earmark-cli: the batch side of Earmark.
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "terminal_progress.hpp"

#include "earmark/core/error.hpp"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <exception>
#include <functional>
#include <map>
#include <string>
#include <vector>

namespace {

using earmark::cli::ExitCode;

struct Subcommand {
    std::function<int(const std::vector<std::string>&)> run;
    const char* summary;
};

const std::map<std::string, Subcommand>& subcommands() {
    static const std::map<std::string, Subcommand> table = {
        {"analyze", {earmark::cli::runAnalyze,
                     "measure one take: F0 (YIN), energy, mel spectrogram, loudness"}},
        {"session", {earmark::cli::runSession, "create a listening session, add takes, list the queue"}},
        {"mark", {earmark::cli::runMark, "add, list or delete marks (defects pinned on a span of a take)"}},
        {"export", {earmark::cli::runExport, "write a session's marks as CSV, JSON or an example bundle"}},
        {"scan", {earmark::cli::runScan, "measure many takes, raise suspects, rank them for listening"}},
        {"merge", {earmark::cli::runMerge, "combine the outputs of sharded scans into one ranking"}},
        {"align", {earmark::cli::runAlign, "word and phone timings of a take from its text (acoustic model, or espeak-ng + DTW)"}},
        {"words", {earmark::cli::runWords, "pronunciation score of every word and the script's coverage (skipped, repeated, early end)"}},
        {"compare", {earmark::cli::runCompare, "two takes of the same text as a pair: per-word table, F0, MCD"}},
        {"model", {earmark::cli::runModel, "a model's predicted mel or attention matrix against the audio"}},
        {"listen", {earmark::cli::runListen, "listening tests (MOS, CMOS, MUSHRA, A/B): create, plan, import, analyse"}},
        {"longform", {earmark::cli::runLongform, "one long take over time: seams at chunk joins, drifts, stretches"}},
        {"agreement", {earmark::cli::runAgreement, "how far raters agree on the takes several of them reviewed: kappa, alpha, span matches"}},
        {"artefacts", {earmark::cli::runArtefacts, "list the clicks, noise bursts, buzz and drop-outs in one take"}},
    };
    return table;
}

void printUsage(std::FILE* to) {
    std::fprintf(to, "usage: earmark-cli COMMAND [OPTIONS]\n\ncommands:\n");
    for (const auto& [name, cmd] : subcommands()) std::fprintf(to, "  %-10s %s\n", name.c_str(), cmd.summary);
    std::fprintf(to, "\n'earmark-cli COMMAND --help' lists the options of a command.\n"
                     "exit codes: 0 ok, 1 internal error, 2 bad usage, 3 bad input, 4 cannot write,\n"
                     "130 interrupted.\n");
}

// A message stays one line even when a file name holds a line break or
// other control characters: they are shown as \n, \r, \t or \xHH.
std::string oneLine(const char* message) {
    std::string out;
    for (const char* p = message; *p; ++p) {
        const auto c = static_cast<unsigned char>(*p);
        if (c == '\n') out += "\\n";
        else if (c == '\r') out += "\\r";
        else if (c == '\t') out += "\\t";
        else if (c < 0x20 || c == 0x7F) {
            char hex[8];
            std::snprintf(hex, sizeof hex, "\\x%02X", c);
            out += hex;
        } else out += *p;
    }
    return out;
}

}  // namespace

int main(int argc, char** argv) {
    std::vector<std::string> args(argv + 1, argv + argc);
    if (args.empty() || args[0] == "--help" || args[0] == "-h" || args[0] == "help") {
        printUsage(args.empty() ? stderr : stdout);
        return args.empty() ? earmark::cli::kExitUsage : earmark::cli::kExitOk;
    }
    const auto it = subcommands().find(args[0]);
    if (it == subcommands().end()) {
        std::fprintf(stderr, "earmark-cli: unknown command '%s'\n", args[0].c_str());
        printUsage(stderr);
        return earmark::cli::kExitUsage;
    }
    earmark::cli::installInterruptHandler();
    const std::string name = args[0];
    args.erase(args.begin());
    try {
        const int code = it->second.run(args);
        // Output to a full disk or a closed pipe must not pass for success.
        if (std::fflush(stdout) != 0 || std::ferror(stdout)) {
            std::fprintf(stderr, "earmark-cli %s: standard output: write failed: %s\n", name.c_str(),
                         std::strerror(errno));
            return earmark::cli::kExitCannotWrite;
        }
        return code;
    } catch (const earmark::cli::UsageError& e) {
        std::fprintf(stderr, "earmark-cli %s: %s\n", name.c_str(), oneLine(e.what()).c_str());
        return earmark::cli::kExitUsage;
    } catch (const earmark::ParamError& e) {
        std::fprintf(stderr, "earmark-cli %s: invalid setting: %s\n", name.c_str(), oneLine(e.what()).c_str());
        return earmark::cli::kExitUsage;
    } catch (const earmark::InputError& e) {
        std::fprintf(stderr, "earmark-cli %s: %s\n", name.c_str(), oneLine(e.what()).c_str());
        return earmark::cli::kExitBadInput;
    } catch (const earmark::Cancelled&) {
        std::fprintf(stderr, "earmark-cli %s: interrupted\n", name.c_str());
        return earmark::cli::kExitCancelled;
    } catch (const earmark::WriteError& e) {
        std::fprintf(stderr, "earmark-cli %s: %s\n", name.c_str(), e.what());
        return earmark::cli::kExitCannotWrite;
    } catch (const earmark::Error& e) {
        std::fprintf(stderr, "earmark-cli %s: %s\n", name.c_str(), oneLine(e.what()).c_str());
        return earmark::cli::kExitFailure;
    } catch (const std::bad_alloc&) {
        std::fprintf(stderr, "earmark-cli %s: out of memory\n", name.c_str());
        return earmark::cli::kExitFailure;
    } catch (const std::exception& e) {
        std::fprintf(stderr, "earmark-cli %s: internal error: %s\n", name.c_str(), oneLine(e.what()).c_str());
        return earmark::cli::kExitFailure;
    }
}
