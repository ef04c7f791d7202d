// earmark-cli words: per-word pronunciation scores and the script's coverage
// (skipped, repeated, substituted, extra words, an early end) of one take,
// from forced alignment with the trained acoustic model.
#include "arguments.hpp"
#include "commands.hpp"
#include "exit_codes.hpp"
#include "output_file.hpp"
#include "terminal_progress.hpp"

#include "earmark/acoustic/word_evidence.hpp"
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/io/text_file.hpp"

#include <nlohmann/json.hpp>

#include <cstdio>

namespace earmark::cli {
namespace {

using Json = nlohmann::ordered_json;

Arguments wordsArguments() {
    return Arguments("words", "AUDIO (--text \"...\" | --text-file FILE) [OPTIONS]",
                     {
                         {"text", "\"...\"", "", "the words the take should say (UTF-8, English)"},
                         {"text-file", "FILE", "", "read them from a UTF-8 text file instead"},
                         {"voice", "NAME", "en-us", "espeak-ng voice that guesses phones of words the dictionary lacks"},
                         {"json", "OUT|-", "", "write scores and coverage as JSON to OUT, or to stdout with -"},
                         {"progress", "", "", "show progress on stderr even when it is not a terminal"},
                     });
}

Json toJson(const std::string& path, const WordEvidenceResult& r) {
    Json j;
    j["file"] = path;
    j["method"] = r.method;
    j["mean_confidence"] = r.meanConfidence;
    Json words = Json::array();
    for (const WordEvidence& w : r.words) {
        Json o;
        o["word"] = w.label;
        o["index"] = w.index;
        o["spoken"] = w.spoken;
        if (w.spoken || w.substituted) {
            o["start_s"] = w.startS;
            o["end_s"] = w.endS;
        }
        if (w.spoken) {
            o["score"] = w.score;
            o["confidence"] = w.confidence;
        }
        o["guessed_phones"] = w.guessed;
        o["occurrences"] = w.occurrences;
        Json phones = Json::array();
        for (const PhoneEvidence& p : w.phones) {
            Json ph;
            ph["expected"] = p.expected;
            ph["heard"] = p.heard;
            ph["start_s"] = p.startS;
            ph["end_s"] = p.endS;
            ph["score"] = p.score;
            phones.push_back(ph);
        }
        o["phones"] = phones;
        words.push_back(o);
    }
    j["words"] = words;
    Json coverage = Json::array();
    for (const CoverageFinding& c : r.coverage) {
        Json o;
        o["kind"] = coverageKindName(c.kind);
        o["words"] = c.words;
        o["start_s"] = c.startS;
        o["end_s"] = c.endS;
        o["detail"] = c.detail;
        coverage.push_back(o);
    }
    j["coverage"] = coverage;
    j["guessed_words"] = r.guessedWords;
    return j;
}

}  // namespace

int runWords(const std::vector<std::string>& argv) {
    Arguments args = wordsArguments();
    if (args.parseOrPrintHelp(argv)) return kExitOk;
    if (args.positionals().size() != 1) throw UsageError("expects exactly one AUDIO file (see earmark-cli words --help)");
    if (args.has("text") == args.has("text-file")) throw UsageError("give the words with exactly one of --text or --text-file");
    const std::string audioPath = args.positionals().front();
    const std::string textSubject = args.has("text-file") ? *args.value("text-file") : "--text";
    const std::string text = args.has("text") ? *args.value("text") : withoutByteOrderMark(readTextFile(*args.value("text-file")));
    WordEvidenceParams params;
    params.voice = args.valueOr("voice", params.voice);
    if (!modelCoversVoice(params.voice)) {
        if (!modelCoversVoice("en"))
            throw InputError("acoustic model", "not installed (Debian package pocketsphinx-en-us)");
        throw UsageError("word scores need an English voice; '" + params.voice + "' is not one");
    }
    WordEvidenceResult result;
    {
        TerminalProgress bar("scoring " + audioPath, args.has("progress"));
        const LoadedAudio audio = loadAudio(audioPath, {}, {}, bar.progress().sub(0.0, 0.1));
        try {
            result = gatherWordEvidence(audio.signal, text, params, bar.progress().sub(0.1, 1.0));
        } catch (const InputError& e) {
            if (e.subject() == "audio") throw InputError(audioPath, e.problem());
            if (e.subject() == "text") throw InputError(textSubject, e.problem());
            throw;
        }
    }
    if (auto out = args.value("json")) {
        writeTextOutput(*out, toJson(audioPath, result).dump(2, ' ', false, Json::error_handler_t::replace));
        if (*out == "-") return kExitOk;
    }
    std::printf("file:      %s\nmethod:    %s (forced alignment, trained acoustic model)\n", audioPath.c_str(),
                result.method.c_str());
    std::printf("  %8s  %8s  %6s  %s\n", "start s", "end s", "score", "word");
    for (const WordEvidence& w : result.words) {
        if (!w.spoken) {
            std::printf("  %8s  %8s  %6s  %s (not said)\n", "-", "-", "-", w.label.c_str());
            continue;
        }
        std::string worst;
        double low = 0;
        for (const PhoneEvidence& p : w.phones)
            if (p.score < low) {
                low = p.score;
                worst = p.expected + " heard as";
                for (const auto& h : p.heard) worst += " " + h;
            }
        std::printf("  %8.3f  %8.3f  %6.2f  %s%s%s\n", w.startS, w.endS, w.score, w.label.c_str(),
                    w.guessed ? " (phones guessed)" : "", low < -1.0 ? ("  [" + worst + "]").c_str() : "");
    }
    if (result.coverage.empty()) std::printf("coverage:  every word said once, in order\n");
    for (const CoverageFinding& c : result.coverage) std::printf("coverage:  %s: %s\n", coverageKindName(c.kind), c.detail.c_str());
    return kExitOk;
}

}  // namespace earmark::cli
