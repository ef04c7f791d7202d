// earmark-cli compare: two takes of the same text as a pair — per-word
// table and overall figures (docs/compare.md).
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/compare/comparison_json.hpp"
#include "earmark/compare/take_comparison.hpp"
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/io/text_file.hpp"
#include "earmark/tiers/timings_file.hpp"

#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <fstream>
#include <iterator>

namespace earmark::cli {
namespace {

Arguments compareArguments() {
    const CompareParams defaults;
    return Arguments(
        "compare", "A B [OPTIONS]",
        {
            {"words-a", "FILE", "", "word timings of take A (Earmark JSON, CSV, WebVTT or token durations)"},
            {"words-b", "FILE", "", "word timings of take B"},
            {"text", "\"...\"", "", "the words both takes say: aligned to a take that has no timings"},
            {"text-file", "FILE", "", "read those words from a UTF-8 text file instead"},
            {"voice", "NAME", defaults.text.speech.voice, "espeak-ng voice reading the reference for --text"},
            {"channel", "N|mix", "mix", "channel of both files to use (1 = first), or mix = average of all"},
            {"json", "OUT|-", "", "write the comparison as JSON to OUT, or to stdout with -"},
            {"progress", "", "", "show progress on stderr even when it is not a terminal"},
        });
}

ChannelSelection channelOption(const Arguments& args) {
    ChannelSelection channels;
    if (const std::string channel = args.valueOr("channel", "mix"); channel != "mix") {
        const auto n = args.number("channel");
        if (!n || *n < 1 || std::floor(*n) != *n)
            throw UsageError("--channel expects a channel number from 1, or 'mix'");
        channels.mode = ChannelMode::Pick;
        channels.channel = static_cast<int>(*n) - 1;
    }
    return channels;
}

std::optional<Tier> wordsOption(const Arguments& args, const char* option, double durationS) {
    const auto path = args.value(option);
    if (!path) return std::nullopt;
    TimingsReadOptions read;
    read.takeDurationS = durationS;
    const LoadedTimings loaded = loadTimings(*path, read);
    const Tier* words = loaded.tiers.find(kWordsTier);
    if (!words) throw InputError(*path, "has no 'words' tier");
    return *words;
}

std::string cell(const std::optional<double>& v, const char* fmt) {
    if (!v) return "-";
    char buf[32];
    std::snprintf(buf, sizeof buf, fmt, *v);
    return buf;
}

bool flagged(const WordComparison& w, WordDifference d) {
    for (WordDifference f : w.flags)
        if (f == d) return true;
    return false;
}

void printComparison(const std::string& pathA, const std::string& pathB, const TakeComparison& c) {
    const auto side = [](const char* name, const std::string& path, const TakeSide& s) {
        std::printf("%s:  %s  %.2f s, speech %.2f-%.2f s, words: %s (%zu)\n", name, path.c_str(), s.durationS,
                    s.speechStartS, s.speechEndS, wordSourceName(s.wordSource), s.words.intervals.size());
    };
    side("A", pathA, c.a);
    side("B", pathB, c.b);
    const OverallFigures& o = c.overall;
    std::printf("\noverall (B against A), %d aligned frame pairs of %.0f ms:\n", o.alignedPairs,
                1000.0 * c.alignment.hopSeconds);
    std::printf("  duration ratio         %.3f\n", o.durationRatio);
    std::printf("  F0 mean difference     %s st (B minus A, over %d pairs voiced in both)\n",
                cell(o.f0MeanDiffSt, "%+.2f").c_str(), o.voicedPairs);
    std::printf("  mean |F0 difference|   %s st\n", cell(o.f0MeanAbsDiffSt, "%.2f").c_str());
    std::printf("  F0 range difference    %s st (5-95 %% range, B minus A)\n", cell(o.f0RangeDiffSt, "%+.2f").c_str());
    std::printf("  mel-cepstral distortion %.2f dB (Kubichek 1993, c1-c%d)\n", o.mcdDb,
                CompareParams{}.cepstra.coefficients - 1);

    if (c.words) {
        std::printf("\n  %-16s %6s %6s %6s  %6s %6s %6s  %5s %5s  %5s %5s  %s\n", "word", "dur A", "dur B", "ratio",
                    "F0 A", "F0 B", "dF0", "rng A", "rng B", "prm A", "prm B", "flags");
        std::printf("  %-16s %6s %6s %6s  %6s %6s %6s  %5s %5s  %5s %5s\n", "", "s", "s", "B/A", "Hz", "Hz", "st", "st",
                    "st", "z", "z");
        const WordTable& t = *c.words;
        for (std::size_t i = 0; i < t.words.size(); ++i) {
            const WordComparison& w = t.words[i];
            // '*' beside a flagged difference, '!' beside the largest of its kind.
            const auto mark = [&](WordDifference d) {
                return t.largest[static_cast<std::size_t>(d)] == i ? "!" : flagged(w, d) ? "*" : " ";
            };
            std::string flags;
            for (WordDifference d : w.flags) flags += std::string(flags.empty() ? "" : ", ") + wordDifferenceName(d);
            std::printf("  %-16.16s %6.3f %6.3f %5.2f%s  %6s %6s %5s%s  %5s %5s%s %5.2f %5.2f%s %s\n", w.text.c_str(),
                        w.a.durationS, w.b.durationS, w.durationRatio, mark(WordDifference::Duration),
                        cell(w.a.f0MeanHz, "%.1f").c_str(), cell(w.b.f0MeanHz, "%.1f").c_str(),
                        cell(w.f0MeanDiffSt, "%+.2f").c_str(), mark(WordDifference::F0Mean),
                        cell(w.a.f0RangeSt, "%.1f").c_str(), cell(w.b.f0RangeSt, "%.1f").c_str(),
                        mark(WordDifference::F0Range), w.a.prominence, w.b.prominence, mark(WordDifference::Prominence),
                        flags.c_str());
        }
        std::printf("  (* flagged difference, ! the largest of its kind)\n");
    }
    std::printf("\n");
    for (const std::string& n : c.notes) std::printf("note: %s\n", n.c_str());
}

}  // namespace

int runCompare(const std::vector<std::string>& argv) {
    Arguments args = compareArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 2)
        throw UsageError("expects two audio files, A and B (see earmark-cli compare --help)");
    if (args.has("text") && args.has("text-file"))
        throw UsageError("give the words with --text or --text-file, not both");
    const std::string pathA = args.positionals()[0], pathB = args.positionals()[1];
    const std::string textSubject = args.has("text-file") ? *args.value("text-file") : "--text";
    const std::string text = args.has("text-file") ? withoutByteOrderMark(readTextFile(*args.value("text-file"))) : args.valueOr("text", "");
    CompareParams params;
    params.text.speech.voice = args.valueOr("voice", params.text.speech.voice);
    const ChannelSelection channels = channelOption(args);

    refuseClobbering({{"--json", args.valueOr("json", "-")}},
                     {pathA, pathB, args.valueOr("words-a", "-"), args.valueOr("words-b", "-")});
    TakeComparison result;
    {
        TerminalProgress bar("comparing " + pathA + " and " + pathB, args.has("progress"));
        TakeInput a{loadAudio(pathA, channels, {}, bar.progress().sub(0.0, 0.05)).signal, {}};
        TakeInput b{loadAudio(pathB, channels, {}, bar.progress().sub(0.05, 0.1)).signal, {}};
        a.words = wordsOption(args, "words-a", a.audio.durationSeconds());
        b.words = wordsOption(args, "words-b", b.audio.durationSeconds());
        try {
            result = compareTakes(a, b, text, params, bar.progress().sub(0.1, 1.0));
        } catch (const InputError& e) {
            // Name the file the problem is in.
            const auto wordsSubject = [&](const char* option) {
                return args.value(option).value_or("the words aligned from " + textSubject);
            };
            if (e.subject() == "A") throw InputError(pathA, e.problem());
            if (e.subject() == "B") throw InputError(pathB, e.problem());
            if (e.subject() == "wordsA") throw InputError(wordsSubject("words-a"), e.problem());
            if (e.subject() == "wordsB") throw InputError(wordsSubject("words-b"), e.problem());
            if (e.subject() == "text") throw InputError(textSubject, e.problem());
            throw;
        }
    }
    const auto json = args.value("json");
    if (json) writeTextOutput(*json, comparisonToJson(result, {pathA, pathB}));
    if (!json || *json != "-") printComparison(pathA, pathB, result);
    return kExitOk;
}

}  // namespace earmark::cli
