// earmark-cli artefacts: every click, noise burst, buzzy stretch and
// drop-out the detectors find in one take (the scan keeps only the worst of
// each kind), as text or JSON.
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"

#include "earmark/analysis/take_analysis.hpp"
#include "earmark/prosody/rules.hpp"
#include "earmark/prosody/speech_activity.hpp"

#include <nlohmann/json.hpp>

#include <cstdio>

namespace earmark::cli {
namespace {

Arguments artefactsArguments() {
    return Arguments("artefacts", "AUDIO [OPTIONS]",
                     {
                         {"rules", "FILE", "", "scan rules (docs/rules-default.json); their detector settings apply"},
                         {"all", "", "", "run the detectors the rules switch off too"},
                         {"json", "OUT|-", "", "write the events as JSON to OUT, or to stdout with -"},
                     });
}

struct Found {
    const char* kind;
    const char* unit;
    std::vector<ArtefactEvent> events;
};

}  // namespace

int runArtefacts(const std::vector<std::string>& argv) {
    Arguments args = artefactsArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1)
        throw UsageError("expects exactly one AUDIO file (see earmark-cli artefacts --help)");
    const ScanRules rules = args.has("rules") ? loadRules(*args.value("rules")) : ScanRules{};
    const bool all = args.has("all");
    AnalysisParams params;
    params.tracks.mel = false;
    params.tracks.loudness = false;
    const TakeAnalysis analysis = analyseFile(args.positionals().front(), params);
    const double level =
        detectSpeech(*analysis.energy, analysis.signal.durationSeconds(), rules.pause).speechLevelDb;
    const Signal& signal = analysis.signal;
    const PitchTrack& pitch = *analysis.pitch;
    std::vector<Found> found;
    if (all || rules.click.enabled) found.push_back({"click", "x", findClicks(signal, level, rules.click.params)});
    if (all || rules.noiseBurst.enabled)
        found.push_back({"noise-burst", "dB", findNoiseBursts(signal, pitch, level, rules.noiseBurst.params)});
    if (all || rules.buzz.enabled) found.push_back({"buzz", "s", findBuzz(signal, pitch, level, rules.buzz.params)});
    if (all || rules.dropout.enabled)
        found.push_back({"dropout", "dB", findDropouts(signal, pitch, level, rules.dropout.params)});

    if (const auto out = args.value("json")) {
        nlohmann::ordered_json doc;
        doc["file"] = args.positionals().front();
        doc["speech_level_dbfs"] = level;
        doc["events"] = nlohmann::ordered_json::array();
        for (const auto& f : found)
            for (const auto& e : f.events)
                doc["events"].push_back({{"kind", f.kind}, {"start_s", e.startS}, {"end_s", e.endS},
                                         {"value", e.value}, {"unit", f.unit}});
        writeTextOutput(*out, doc.dump(2) + "\n");
        if (*out == "-") return kExitOk;
    }
    for (const auto& f : found) {
        std::printf("%s: %zu\n", f.kind, f.events.size());
        for (const auto& e : f.events)
            std::printf("  %9.3f  %9.3f  %8.2f %s\n", e.startS, e.endS, e.value, f.unit);
    }
    return kExitOk;
}

}  // namespace earmark::cli
