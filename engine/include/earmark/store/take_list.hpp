// Lists of takes in CSV (RFC 4180), as in samples/lines.csv: a header row
// naming at least the columns `id` and `audio` (plus `text`, optional; other
// columns are ignored), one take per row. Audio paths are relative to the
// CSV file's folder. Text must be UTF-8 (a leading byte-order mark is skipped).
#pragma once

#include "earmark/store/take.hpp"

#include <string>
#include <string_view>
#include <vector>

namespace earmark {

// Splits RFC 4180 text into records of fields. Accepts CRLF or LF line
// breaks; quoted fields may hold commas, quotes ("") and line breaks. Throws
// InputError(subject, "line N: …") for a quote that is not closed or text
// after a closing quote.
std::vector<std::vector<std::string>> parseCsv(std::string_view text, const std::string& subject);

// Reads the file and returns one NewTake per row, with audioPath resolved
// against the CSV's folder and `build` set to the given label. Throws
// InputError naming the CSV (missing columns, empty id or audio, bad UTF-8,
// a row with fewer fields than the header).
std::vector<NewTake> readTakeList(const std::string& csvPath, const std::string& build = "");

}  // namespace earmark
