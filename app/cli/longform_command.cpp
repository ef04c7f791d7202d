// earmark-cli longform: measures of one long take over time, seams at chunk
// joins, drifts and stretches (docs/longform.md).
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/acoustic/model_aligner.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/io/text_file.hpp"
#include "earmark/longform/longform_json.hpp"
#include "earmark/prosody/rules.hpp"

#include "earmark/core/error.hpp"
#include "earmark/tiers/timings_json.hpp"

#include <cstdio>
#include <optional>

namespace earmark::cli {
namespace {

Arguments longformArguments() {
    return Arguments("longform", "TAKE [OPTIONS]",
                     {
                         {"json", "OUT|-", "", "write findings, per-window series, trends and joins as JSON "
                                               "to OUT, or to stdout with -"},
                         {"chunks", "FILE", "", "known join times, one per line in seconds (else pauses are "
                                                "the candidate joins)"},
                         {"text-file", "FILE", "", "the take's text (UTF-8; paragraphs separated by blank "
                                                   "lines): aligned chunk by chunk to give paragraph, sentence "
                                                   "and word timings"},
                         {"tiers", "OUT", "", "with --text-file: write the paragraph, sentence, word and phone "
                                              "tiers as Earmark timings JSON"},
                         {"method", "auto|model|reference", "auto",
                          "with --text-file: model: the trained acoustic model's forced alignment (English); "
                          "reference: an espeak-ng reading matched by DTW; auto: model for English voices when "
                          "installed"},
                         {"voice", "NAME", "en-us", "the voice the text is read in (espeak-ng's name: en-us, "
                                                    "en-gb-x-rp, de…); chooses the method and guesses unknown words"},
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
    Arguments args = longformArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1)
        throw UsageError("expects exactly one TAKE audio file (see earmark-cli longform --help)");
    const std::string path = args.positionals().front();
    const ScanRules rules = args.has("rules") ? loadRules(*args.value("rules")) : ScanRules{};
    std::vector<double> joins;
    const std::string chunks = args.valueOr("chunks", "");
    if (!chunks.empty()) joins = readChunkList(chunks);

    const std::string textFile = args.valueOr("text-file", "");
    if (args.has("tiers") && textFile.empty()) throw UsageError("--tiers needs --text-file");
    const std::string voice = args.valueOr("voice", "en-us");
    const std::string method = textFile.empty() ? std::string() : resolveAlignMethod(args.valueOr("method", "auto"), voice);
    std::string text;
    if (!textFile.empty()) text = withoutByteOrderMark(readTextFile(textFile));

    LongformReport report;
    std::optional<LongAlignResult> aligned;
    LoadedAudio audio;
    {
        TerminalProgress bar("long-form " + path, args.has("progress"));
        const Progress progress = bar.progress();
        const double measuresEnd = textFile.empty() ? 1.0 : 0.5;
        audio = loadAudio(path, {}, {}, progress.sub(0.0, 0.05));
        report = analyseLongform(audio.signal, joins, rules.longform, progress.sub(0.05, measuresEnd),
                                 chunks.empty() ? "chunks" : chunks);
        if (!textFile.empty()) {
            try {
                aligned = alignLongText(audio.signal, text, chunkAlignerFor(method, voice), {}, progress.sub(0.5, 1.0));
            } catch (const InputError& e) {
                throw InputError(textFile, e.problem());
            }
        }
    }
    if (auto tiers = args.value("tiers")) writeTextOutput(*tiers, timingsToJson(aligned->tiers));
    const auto json = args.value("json");
    if (json)
        writeTextOutput(*json, longformToJson(report, rules.longform, {path, audio.info.sampleRate, audio.info.channels},
                                              aligned ? &*aligned : nullptr));
    if (!json || *json != "-") {
        printSummary(path, report);
        if (aligned)
            std::printf("text:      %zu paragraphs, %zu sentences aligned in %d chunks (method %s), mean word "
                        "confidence %.2f\n",
                        aligned->tiers.find(kParagraphsTier)->intervals.size(),
                        aligned->tiers.find(kSentencesTier)->intervals.size(), aligned->chunks,
                        aligned->method.c_str(), aligned->meanConfidence);
    }
    return kExitOk;
}

}  // namespace earmark::cli
