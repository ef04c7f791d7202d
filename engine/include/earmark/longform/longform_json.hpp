// The JSON form of a long-form report, as written by `earmark-cli longform
// --json`, and the chunk-list file read by `--chunks`. Schema and field
// meanings: docs/longform.md. Non-finite numbers are written as null.
#pragma once

#include "earmark/longform/findings.hpp"
#include "earmark/longform/long_alignment.hpp"

#include <string>
#include <vector>

namespace earmark {

struct LongformJsonInfo {
    std::string file;           // the audio path as given
    double sampleRateHz = 0.0;
    int channels = 0;
};

// `text`, when given, adds "text": the paragraph and sentence intervals and
// the word count and mean confidence of the long text alignment.
std::string longformToJson(const LongformReport& report, const LongformRules& rules, const LongformJsonInfo& info,
                           const LongAlignResult* text = nullptr);

// A chunk list: one join time in seconds per line (the start of every chunk
// but the first); blank lines and lines starting with '#' are skipped.
// Throws InputError(path, …) naming the line for anything else, for times that
// are not finite or not increasing, and when the file cannot be read.
std::vector<double> readChunkList(const std::string& path);

}  // namespace earmark
