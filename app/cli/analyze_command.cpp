// earmark-cli analyze: measure one take and print a summary or JSON.
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/analysis/take_analysis.hpp"
#include "earmark/export/analysis_json.hpp"
#include "earmark/export/mel_npy.hpp"

#include <cmath>
#include <cstdio>
#include <sstream>

namespace earmark::cli {
namespace {

Arguments analyzeArguments() {
    const PitchParams pitch;
    return Arguments(
        "analyze", "AUDIO [OPTIONS]",
        {
            {"channel", "N|mix", "mix", "channel to analyse (1 = first), or mix = average of all"},
            {"tracks", "LIST", "f0,energy,mel,loudness", "comma-separated tracks to compute"},
            {"f0-min", "HZ", "60", "lowest F0 searched"},
            {"f0-max", "HZ", "500", "highest F0 searched"},
            {"hop-ms", "MS", "5", "frame step of the F0 and energy tracks"},
            {"mel-bands", "N", "80", "mel bands"},
            {"mel-scale", "htk|slaney", "slaney", "mel scale (Slaney uses area normalisation)"},
            {"json", "OUT|-", "", "write the analysis as JSON to OUT, or to stdout with -"},
            {"mel-npy", "OUT", "", "write the mel spectrogram as a (bands, frames) float32 .npy "
                                   "plus OUT.json with its settings (implies mel)"},
            {"progress", "", "", "show progress on stderr even when it is not a terminal"},
        });
}

TrackSelection parseTracks(const std::string& list) {
    TrackSelection t{false, false, false, false};
    std::stringstream in(list);
    std::string item;
    while (std::getline(in, item, ',')) {
        if (item == "f0") t.f0 = true;
        else if (item == "energy") t.energy = true;
        else if (item == "mel") t.mel = true;
        else if (item == "loudness") t.loudness = true;
        else if (!item.empty())
            throw UsageError("--tracks: unknown track '" + item + "' (known: f0, energy, mel, loudness)");
    }
    return t;
}

AnalysisParams makeParams(const Arguments& args) {
    AnalysisParams p;
    const std::string channel = args.valueOr("channel", "mix");
    if (channel != "mix") {
        const auto n = args.number("channel");
        if (!n || *n < 1 || std::floor(*n) != *n)
            throw UsageError("--channel expects a channel number from 1, or 'mix'");
        p.channels.mode = ChannelMode::Pick;
        p.channels.channel = static_cast<int>(*n) - 1;
    }
    p.tracks = parseTracks(args.valueOr("tracks", "f0,energy,mel,loudness"));
    if (args.has("mel-npy")) p.tracks.mel = true;
    if (auto v = args.number("f0-min")) p.pitch.minF0Hz = *v;
    if (auto v = args.number("f0-max")) p.pitch.maxF0Hz = *v;
    if (auto v = args.number("hop-ms")) {
        if (!(*v > 0)) throw UsageError("--hop-ms must be positive");
        p.pitch.hopSeconds = *v / 1000.0;
        p.energy.hopSeconds = *v / 1000.0;
    }
    if (auto v = args.number("mel-bands")) {
        if (*v < 1 || std::floor(*v) != *v) throw UsageError("--mel-bands expects a whole number >= 1");
        p.mel.bands = static_cast<int>(*v);
    }
    const std::string scale = args.valueOr("mel-scale", "slaney");
    if (scale == "htk") {
        p.mel.scale = MelScale::Htk;
        p.mel.normalisation = MelNormalisation::None;
    } else if (scale != "slaney") {
        throw UsageError("--mel-scale expects htk or slaney, got '" + scale + "'");
    }
    return p;
}

std::string formatOptional(const std::optional<double>& v, const char* fmt) {
    if (!v || !std::isfinite(*v)) return "n/a";
    char buf[64];
    std::snprintf(buf, sizeof buf, fmt, *v);
    return buf;
}

void printSummary(const TakeAnalysis& a) {
    std::printf("file:      %s\n", a.info.path.c_str());
    std::printf("audio:     %.3f s, %.0f Hz, %d channel(s), %s\n", a.info.durationSeconds(),
                a.info.sampleRate, a.info.channels, a.info.format.c_str());
    if (a.pitch) {
        const auto& s = a.pitchSummary;
        std::printf("F0:        median %s Hz, 5-95 %% %s-%s Hz (%s st), voiced %.1f %%\n",
                    formatOptional(s.medianHz, "%.1f").c_str(), formatOptional(s.p5Hz, "%.1f").c_str(),
                    formatOptional(s.p95Hz, "%.1f").c_str(),
                    formatOptional(s.rangeSemitones, "%.1f").c_str(), 100.0 * s.voicedFraction);
    }
    if (a.loudnessLufs)
        std::printf("loudness:  %s LUFS (BS.1770-4 integrated)\n",
                    formatOptional(*a.loudnessLufs, "%.1f").c_str());
    std::printf("level:     peak %s dBFS, %lld clipped sample(s), DC offset %.5f\n",
                formatOptional(a.sampleStats.samplePeakDbfs, "%.2f").c_str(),
                static_cast<long long>(a.sampleStats.clippedSamples), a.sampleStats.dcOffset);
    if (a.energy) std::printf("energy:    %zu frames every %.1f ms\n", a.energy->db.size(), a.energy->hopSeconds * 1000);
    if (a.mel)
        std::printf("mel:       %d frames x %d bands every %.2f ms\n", a.mel->frames, a.mel->bins,
                    a.mel->hopSeconds * 1000);
}

}  // namespace

int runAnalyze(const std::vector<std::string>& argv) {
    Arguments args = analyzeArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1)
        throw UsageError("expects exactly one AUDIO file (see earmark-cli analyze --help)");
    const std::string path = args.positionals().front();
    const AnalysisParams params = makeParams(args);
    const std::string npyOut = args.valueOr("mel-npy", "-");
    refuseClobbering({{"--json", args.valueOr("json", "-")},
                      {"--mel-npy", npyOut},
                      {"--mel-npy's settings", npyOut == "-" ? "-" : npyOut + ".json"}},
                     {path});

    TakeAnalysis analysis;
    {
        TerminalProgress bar("analyzing " + path, args.has("progress"));
        analysis = analyseFile(path, params, bar.progress());
    }
    const auto json = args.value("json");
    if (json) writeTextOutput(*json, analysisToJson(analysis, params));
    if (auto npy = args.value("mel-npy")) writeMelNpy(*npy, *analysis.mel, params.mel);
    if (!json || *json != "-") printSummary(analysis);
    return kExitOk;
}

}  // namespace earmark::cli
