// earmark-cli align: word and phone timings of a take from its text.
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/acoustic/model_aligner.hpp"
#include "earmark/align/text_aligner.hpp"
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/io/text_file.hpp"
#include "earmark/tiers/timings_csv.hpp"
#include "earmark/tiers/timings_json.hpp"
#include "earmark/tiers/timings_vtt.hpp"

#include <cerrno>
#include <cmath>
#include <cstdio>
#include <cstring>
#include <fstream>
#include <sstream>

namespace earmark::cli {
namespace {

Arguments alignArguments() {
    const AlignParams defaults;
    return Arguments(
        "align", "AUDIO (--text \"...\" | --text-file FILE) [OPTIONS]",
        {
            {"text", "\"...\"", "", "the words spoken in AUDIO (UTF-8)"},
            {"text-file", "FILE", "", "read the words from a UTF-8 text file instead"},
            {"method", "auto|model|reference", "auto",
             "model: HMM forced alignment with the trained US-English acoustic model (pocketsphinx-en-us); "
             "reference: an espeak-ng reading matched by DTW; auto: model for English voices when installed"},
            {"voice", "NAME", defaults.speech.voice,
             "espeak-ng voice reading the reference (en-gb-x-rp, en+f3, de…); same language as the text"},
            {"rate", "WPM", std::to_string(defaults.speech.rateWpm), "reference speaking rate, words per minute (80-450)"},
            {"channel", "N|mix", "mix", "channel to align (1 = first), or mix = average of all"},
            {"no-refine", "", "", "keep boundaries where the warping path puts them (no energy refinement)"},
            {"json", "OUT|-", "", "write words and phones as Earmark JSON to OUT, or to stdout with -"},
            {"csv", "OUT|-", "", "write words and phones as CSV (start,end,label,tier,confidence)"},
            {"vtt", "OUT|-", "", "write the words as WebVTT cues"},
            {"progress", "", "", "show progress on stderr even when it is not a terminal"},
        });
}

// writeTextOutput adds the final line end itself.
std::string withoutFinalNewline(std::string text) {
    while (!text.empty() && (text.back() == '\n' || text.back() == '\r')) text.pop_back();
    return text;
}

void printSummary(const std::string& path, const AlignResult& r, const std::string& method) {
    std::printf("file:      %s\n", path.c_str());
    std::printf("method:    %s\n", method.c_str());
    if (method == "reference")
        std::printf("voice:     %s; reading %.2f s, speech in the take %.2f-%.2f s\n", r.voiceName.c_str(),
                    r.referenceSeconds, r.speechStartS, r.speechEndS);
    std::printf("words:     %zu, mean confidence %.2f\n\n", r.tiers.find(kWordsTier)->intervals.size(),
                r.meanConfidence);
    std::printf("  %8s  %8s  %5s  %s\n", "start s", "end s", "conf", "word");
    for (const Interval& w : r.tiers.find(kWordsTier)->intervals)
        std::printf("  %8.3f  %8.3f  %5.2f  %s\n", w.startS, w.endS, w.confidence.value_or(0.0), w.label.c_str());
}

}  // namespace

int runAlign(const std::vector<std::string>& argv) {
    Arguments args = alignArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1)
        throw UsageError("expects exactly one AUDIO file (see earmark-cli align --help)");
    if (args.has("text") == args.has("text-file"))
        throw UsageError("give the words with exactly one of --text or --text-file");
    const std::string audioPath = args.positionals().front();
    const std::string textSubject = args.has("text-file") ? *args.value("text-file") : "--text";
    const std::string text = args.has("text") ? *args.value("text") : withoutByteOrderMark(readTextFile(*args.value("text-file")));

    AlignParams params;
    params.speech.voice = args.valueOr("voice", params.speech.voice);
    if (auto rate = args.number("rate")) {
        if (*rate < 80 || *rate > 450 || std::floor(*rate) != *rate)
            throw UsageError("--rate expects a whole number of words per minute, 80-450");
        params.speech.rateWpm = static_cast<int>(*rate);
    }
    params.refine = !args.has("no-refine");
    ChannelSelection channels;
    if (const std::string channel = args.valueOr("channel", "mix"); channel != "mix") {
        const auto n = args.number("channel");
        if (!n || *n < 1 || std::floor(*n) != *n) throw UsageError("--channel expects a channel number from 1, or 'mix'");
        channels.mode = ChannelMode::Pick;
        channels.channel = static_cast<int>(*n) - 1;
    }

    const std::string method = resolveAlignMethod(args.valueOr("method", "auto"), params.speech.voice);

    AlignResult result;
    {
        TerminalProgress bar("aligning " + audioPath, args.has("progress"));
        const LoadedAudio audio = loadAudio(audioPath, channels, {}, bar.progress().sub(0.0, 0.1));
        try {
            if (method == "model") {
                result = alignWithModel(audio.signal, text, params.speech.voice, bar.progress().sub(0.1, 1.0));
            } else {
                result = alignText(audio.signal, text, params, bar.progress().sub(0.1, 1.0));
            }
        } catch (const InputError& e) {
            // Name the file the problem is in.
            if (e.subject() == "audio") throw InputError(audioPath, e.problem());
            if (e.subject() == "text") throw InputError(textSubject, e.problem());
            throw;
        }
    }

    bool toStdout = false;
    if (auto out = args.value("json")) {
        writeTextOutput(*out, withoutFinalNewline(timingsToJson(result.tiers)));
        toStdout = toStdout || *out == "-";
    }
    if (auto out = args.value("csv")) {
        writeTextOutput(*out, withoutFinalNewline(timingsToCsv(result.tiers)));
        toStdout = toStdout || *out == "-";
    }
    if (auto out = args.value("vtt")) {
        writeTextOutput(*out, withoutFinalNewline(tierToVtt(*result.tiers.find(kWordsTier))));
        toStdout = toStdout || *out == "-";
    }
    if (!toStdout) printSummary(audioPath, result, method);
    return kExitOk;
}

}  // namespace earmark::cli
