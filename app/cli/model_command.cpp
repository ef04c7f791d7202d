// earmark-cli model: a synthesis model's own outputs set against the audio —
// a predicted mel spectrogram (mel-diff) and an attention matrix (attention).
// docs/model-outputs.md.
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/io/audio_file.hpp"
#include "earmark/model/array_layout.hpp"
#include "earmark/model/model_json.hpp"
#include "earmark/tiers/timings_json.hpp"

#include <cmath>
#include <cstdio>
#include <limits>

namespace earmark::cli {
namespace {

Arguments melDiffArguments() {
    const MelSettings d;
    return Arguments(
        "model mel-diff", "AUDIO PREDICTED.npy [OPTIONS]",
        {
            {"layout", "bands-frames|frames-bands", "from the sidecar or the band count", "how the array is stored"},
            {"sidecar", "FILE", "PREDICTED.npy.json if present", "read the mel settings from this JSON file"},
            {"no-sidecar", "", "", "ignore any sidecar"},
            {"sample-rate", "HZ", std::to_string(static_cast<int>(d.sampleRateHz)), "sample rate of the model's audio"},
            {"hop", "N", std::to_string(d.hopSize), "hop between frames, samples"},
            {"fft", "N", std::to_string(d.fftSize), "FFT length, samples"},
            {"window-size", "N", std::to_string(d.windowSize), "analysis window length, samples"},
            {"bands", "N", std::to_string(d.bands), "mel bands"},
            {"fmin", "HZ", "0", "lowest band edge"},
            {"fmax", "HZ", "8000", "highest band edge"},
            {"mel-scale", "slaney|htk", "slaney", "mel scale"},
            {"norm", "area|none", "area", "band normalisation"},
            {"spectrum", "magnitude|power", "magnitude", "filterbank applied to |X| or |X|^2"},
            {"log", "natural|log10|decibel|none", "natural", "log applied to the mel"},
            {"log-floor", "X", "1e-05 (decibel: -100)", "floor inside the log (dB for decibel)"},
            {"frame-alignment", "centred|vocoder-padded", "centred",
             "frame i centred at i*hop, or padded by (fft-hop)/2 without centring"},
            {"channel", "N|mix", "mix", "channel of AUDIO to use (1 = first), or mix"},
            {"json", "OUT|-", "", "write the difference as JSON to OUT, or to stdout with -"},
            {"progress", "", "", "show progress on stderr even when it is not a terminal"},
        });
}

Arguments attentionArguments() {
    const AttentionParams d;
    return Arguments(
        "model attention", "MATRIX.npy --tokens FILE [OPTIONS]",
        {
            {"tokens", "FILE", "", "the input tokens: one per line, or a JSON array of strings"},
            {"layout", "frames-tokens|tokens-frames", "from the token count", "how the array is stored"},
            {"hop", "N", std::to_string(d.frame.hopSize), "samples per decoder frame"},
            {"sample-rate", "HZ", std::to_string(static_cast<int>(d.frame.sampleRate)), "sample rate of the audio"},
            {"min-hold", "N", std::to_string(d.minHoldFrames), "argmax runs shorter than this are flicker"},
            {"json", "OUT|-", "", "write path, token times and faults as JSON to OUT, or to stdout with -"},
            {"timings", "OUT|-", "", "write the token tier as Earmark timings JSON"},
        });
}

template <typename T>
std::optional<T> wholeNumber(const Arguments& args, const char* name, double least) {
    const auto v = args.number(name);
    if (!v) return std::nullopt;
    if (*v < least || std::floor(*v) != *v || *v > std::numeric_limits<int>::max())
        throw UsageError(std::string("--") + name + " expects a whole number of at least " +
                         std::to_string(static_cast<int>(least)));
    return static_cast<T>(*v);
}

std::optional<double> positive(const Arguments& args, const char* name, bool zeroOk = false) {
    const auto v = args.number(name);
    if (v && !(*v > 0 || (zeroOk && *v == 0))) throw UsageError(std::string("--") + name + " must be positive");
    return v;
}

template <typename T>
std::optional<T> choice(const Arguments& args, const char* name, const std::vector<std::pair<const char*, T>>& names) {
    const auto v = args.value(name);
    if (!v) return std::nullopt;
    std::string known;
    for (const auto& [text, value] : names) {
        if (*v == text) return value;
        known += (known.empty() ? "" : ", ") + std::string(text);
    }
    throw UsageError(std::string("--") + name + " expects one of " + known + ", got '" + *v + "'");
}

PredictedMelOptions melOptions(const Arguments& args) {
    PredictedMelOptions o;
    o.layout =
        choice<MelLayout>(args, "layout",
                          {{"bands-frames", MelLayout::BandsByFrames}, {"frames-bands", MelLayout::FramesByBands}})
            .value_or(MelLayout::Auto);
    if (args.has("sidecar") && args.has("no-sidecar")) throw UsageError("give --sidecar or --no-sidecar, not both");
    o.sidecarPath = args.value("sidecar");
    o.useSidecar = !args.has("no-sidecar");
    MelSettingsGiven& g = o.settings;
    g.sampleRateHz = positive(args, "sample-rate");
    g.hopSize = wholeNumber<int>(args, "hop", 1);
    g.fftSize = wholeNumber<int>(args, "fft", 2);
    g.windowSize = wholeNumber<int>(args, "window-size", 2);
    g.bands = wholeNumber<int>(args, "bands", 1);
    g.fminHz = positive(args, "fmin", true);
    g.fmaxHz = positive(args, "fmax");
    g.scale = choice<MelScale>(args, "mel-scale", {{"slaney", MelScale::Slaney}, {"htk", MelScale::Htk}});
    g.normalisation =
        choice<MelNormalisation>(args, "norm", {{"area", MelNormalisation::Area}, {"none", MelNormalisation::None}});
    g.spectrum = choice<SpectrumKind>(args, "spectrum",
                                      {{"magnitude", SpectrumKind::Magnitude}, {"power", SpectrumKind::Power}});
    g.log = choice<MelLogBase>(args, "log",
                               {{"natural", MelLogBase::Natural},
                                {"log10", MelLogBase::Log10},
                                {"decibel", MelLogBase::Decibel},
                                {"none", MelLogBase::Linear}});
    g.logFloor = args.number("log-floor");
    g.alignment = choice<FrameAlignment>(
        args, "frame-alignment",
        {{"centred", FrameAlignment::Centred}, {"vocoder-padded", FrameAlignment::VocoderPadded}});
    return o;
}

void printMelDifference(const std::string& audio, const std::string& path, const PredictedMel& p,
                        const MelDifference& d) {
    const MelSettings& s = p.settings;
    std::printf("prediction: %s  %s, %d bands x %d frames (%s, from the %s)%s%s\n", path.c_str(), p.dtype.c_str(),
                p.mel.bins, p.mel.frames, melLayoutName(p.layout), p.layoutFrom.c_str(),
                p.sidecarPath ? ", sidecar " : "", p.sidecarPath ? p.sidecarPath->c_str() : "");
    std::printf("settings:   %.0f Hz, hop %d, fft %d/%d, %d bands %.0f-%.0f Hz %s/%s, %s, %s log (floor %g), %s\n",
                s.sampleRateHz, s.hopSize, s.fftSize, s.windowSize, s.bands, s.fminHz, s.fmaxHz, sidecarName(s.scale),
                sidecarName(s.normalisation), sidecarName(s.spectrum), melLogBaseName(s.log), s.logFloor,
                sidecarName(s.alignment));
    std::printf("audio:      %s\n", audio.c_str());
    std::printf("difference: predicted minus computed, dB; frames %d-%d of %d compared (audio gives %d)\n",
                d.firstFrame, d.firstFrame + d.comparedFrames - 1, d.predictedFrames, d.computedFrames);
    const double hzAt = p.mel.binCentresHz[static_cast<std::size_t>(d.maxBand)];
    std::printf(
        "  mean %+.2f dB, mean |d| %.2f dB, RMS %.2f dB, max |d| %.2f dB at frame %d (%.3f s), band %d (%.0f Hz)\n",
        d.meanDb, d.meanAbsDb, d.rmsDb, d.maxAbsDb, d.maxFrame, p.mel.frameTime(d.maxFrame), d.maxBand, hzAt);
    if (d.regions.empty()) {
        std::printf("regions:    none reaches %.0f dB\n", MelDifferenceParams{}.regionThresholdDb);
    } else {
        std::printf("regions (|d| >= %.0f dB, largest first):\n", MelDifferenceParams{}.regionThresholdDb);
        for (const MelDifferenceRegion& r : d.regions)
            std::printf(
                "  frames %d-%d (%.3f-%.3f s), bands %d-%d (%.0f-%.0f Hz): mean %+.1f dB, peak %+.1f dB, %d cells\n",
                r.firstFrame, r.lastFrame, r.startS, r.endS, r.firstBand, r.lastBand, r.lowHz, r.highHz, r.meanDb,
                r.peakDb, r.cells);
    }
    for (const std::string& w : d.warnings) std::printf("warning: %s\n", w.c_str());
}

int runMelDiff(const std::vector<std::string>& argv) {
    Arguments args = melDiffArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 2)
        throw UsageError("expects AUDIO and PREDICTED.npy (see earmark-cli model mel-diff --help)");
    const std::string audioPath = args.positionals()[0], npyPath = args.positionals()[1];
    const PredictedMelOptions options = melOptions(args);
    refuseClobbering({{"--json", args.valueOr("json", "-")}}, {audioPath, npyPath});
    ChannelSelection channels;
    if (const std::string channel = args.valueOr("channel", "mix"); channel != "mix") {
        channels.mode = ChannelMode::Pick;
        channels.channel = wholeNumber<int>(args, "channel", 1).value() - 1;
    }
    PredictedMel predicted;
    try {
        predicted = readPredictedMel(npyPath, options);
    } catch (const AmbiguousLayout& e) {
        throw UsageError(std::string(e.what()) + "; choose with --layout bands-frames or --layout frames-bands");
    }
    MelDifference difference;
    {
        TerminalProgress bar("comparing " + npyPath + " with " + audioPath, args.has("progress"));
        const LoadedAudio audio = loadAudio(audioPath, channels, {}, bar.progress().sub(0.0, 0.2));
        try {
            difference = diffPredictedMel(predicted, audio.signal, {}, bar.progress().sub(0.2, 1.0));
        } catch (const InputError& e) {
            if (e.subject() == "audio") throw InputError(audioPath, e.problem());
            if (e.subject() == "mel difference") throw InputError(npyPath, e.problem());
            throw;
        }
    }
    const auto json = args.value("json");
    if (json) writeTextOutput(*json, melDifferenceToJson(predicted, difference, npyPath, audioPath));
    if (!json || *json != "-") printMelDifference(audioPath, npyPath, predicted, difference);
    return kExitOk;
}

void printAttention(const std::string& path, const AttentionAlignment& a, const std::vector<std::string>& labels,
                    const AttentionParams& params) {
    const double hop = params.hopSeconds();
    const auto quoted = [&](int first, int last) {
        std::string s;
        for (int k = first; k <= last; ++k) s += (k > first ? " " : "") + labels[static_cast<std::size_t>(k)];
        return "'" + s + "'";
    };
    std::printf("matrix:  %s  %zu frames x %zu tokens, hop %d at %.0f Hz (%.2f ms), %.3f s\n", path.c_str(),
                a.argmax.size(), labels.size(), params.frame.hopSize, params.frame.sampleRate, 1000.0 * hop,
                a.durationS);
    std::printf("path:    monotonic, summed attention %.2f\n", a.path.score);
    std::printf("faults:  %zu\n", a.faults.size());
    for (const AttentionEvent& e : a.faults) {
        const std::string tokens = e.firstToken == e.lastToken
                                       ? "token " + std::to_string(e.firstToken)
                                       : "tokens " + std::to_string(e.firstToken) + "-" + std::to_string(e.lastToken);
        if (e.kind == AttentionFault::Skip)
            std::printf("  skip    frame %d (%.3f s): %s %s never attended\n", e.firstFrame, e.startS, tokens.c_str(),
                        quoted(e.firstToken, e.lastToken).c_str());
        else
            std::printf("  repeat  frames %d-%d (%.3f-%.3f s): back to %s %s\n", e.firstFrame, e.lastFrame, e.startS,
                        e.endS, tokens.c_str(), quoted(e.firstToken, e.lastToken).c_str());
    }
    std::printf("\n  %5s  %8s  %8s  %6s  %s\n", "token", "start s", "end s", "frames", "text");
    for (std::size_t k = 0; k < labels.size(); ++k) {
        const int f0 = a.path.firstFrame[k], f1 = a.path.lastFrame[k];
        std::printf("  %5zu  %8.3f  %8.3f  %6d  %s\n", k, f0 * hop, (f1 + 1) * hop, f1 - f0 + 1, labels[k].c_str());
    }
}

int runAttention(const std::vector<std::string>& argv) {
    Arguments args = attentionArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1)
        throw UsageError("expects one MATRIX.npy (see earmark-cli model attention --help)");
    if (!args.has("tokens")) throw UsageError("needs --tokens FILE: the input tokens the matrix attends to");
    const std::string path = args.positionals()[0];
    refuseClobbering({{"--json", args.valueOr("json", "-")}, {"--timings", args.valueOr("timings", "-")}},
                     {path, *args.value("tokens")});
    AttentionParams params;
    params.frame.hopSize = wholeNumber<int>(args, "hop", 1).value_or(params.frame.hopSize);
    params.frame.sampleRate = positive(args, "sample-rate").value_or(params.frame.sampleRate);
    params.minHoldFrames = wholeNumber<int>(args, "min-hold", 1).value_or(params.minHoldFrames);
    const auto layout = choice<AttentionLayout>(
        args, "layout",
        {{"frames-tokens", AttentionLayout::FramesByTokens}, {"tokens-frames", AttentionLayout::TokensByFrames}});
    const std::vector<std::string> labels = readTokenList(*args.value("tokens"));
    AttentionMatrix matrix;
    try {
        matrix = readAttentionNpy(path, static_cast<int>(labels.size()), layout.value_or(AttentionLayout::Auto));
    } catch (const AmbiguousLayout& e) {
        throw UsageError(std::string(e.what()) + "; choose with --layout frames-tokens or --layout tokens-frames");
    }
    AttentionAlignment alignment;
    try {
        alignment = alignAttention(matrix, labels, params);
    } catch (const InputError& e) {
        if (e.subject() == "attention") throw InputError(path, e.problem());
        throw;
    }
    bool toStdout = false;
    if (auto out = args.value("json")) {
        writeTextOutput(*out, attentionToJson(alignment, labels, params, path));
        toStdout = *out == "-";
    }
    if (auto out = args.value("timings")) {
        TierSet set;
        set.durationS = alignment.durationS;
        set.tiers.push_back(alignment.tokens);
        std::string text = timingsToJson(set);
        if (!text.empty() && text.back() == '\n') text.pop_back();  // writeTextOutput ends the file itself
        writeTextOutput(*out, text);
        toStdout = toStdout || *out == "-";
    }
    if (!toStdout) printAttention(path, alignment, labels, params);
    return kExitOk;
}

void printModelUsage(std::FILE* to) {
    std::fprintf(to,
                 "usage: earmark-cli model ACTION [OPTIONS]\n\nactions:\n"
                 "  mel-diff   a predicted mel spectrogram (.npy) against Earmark's mel of the audio\n"
                 "  attention  token times, skips and repeats from an attention matrix (.npy)\n\n"
                 "'earmark-cli model ACTION --help' lists the options of an action.\n");
}

}  // namespace

int runModel(const std::vector<std::string>& argv) {
    if (argv.empty() || argv[0] == "--help" || argv[0] == "-h") {
        printModelUsage(argv.empty() ? stderr : stdout);
        return argv.empty() ? kExitUsage : kExitOk;
    }
    const std::vector<std::string> rest(argv.begin() + 1, argv.end());
    if (argv[0] == "mel-diff") return runMelDiff(rest);
    if (argv[0] == "attention") return runAttention(rest);
    throw UsageError("unknown action '" + argv[0] + "' (known: mel-diff, attention)");
}

}  // namespace earmark::cli
