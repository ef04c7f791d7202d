#include "earmark/store/take_list.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/text_file.hpp"
#include "earmark/marks/utf8.hpp"

#include <filesystem>
#include <fstream>
#include <sstream>

namespace earmark {

std::vector<std::vector<std::string>> parseCsv(std::string_view text, const std::string& subject) {
    std::vector<std::vector<std::string>> records;
    std::vector<std::string> record;
    std::string field;
    bool quoted = false;       // inside a quoted field
    bool afterQuote = false;   // a quoted field just closed; only a separator may follow
    bool fieldStarted = false;
    int line = 1;
    int quoteLine = 1;  // where the open quoted field started, for the error message
    auto endField = [&] {
        record.push_back(std::move(field));
        field.clear();
        afterQuote = fieldStarted = false;
    };
    auto endRecord = [&] {
        endField();
        records.push_back(std::move(record));
        record.clear();
    };
    for (std::size_t i = 0; i < text.size(); ++i) {
        const char c = text[i];
        if (quoted) {
            if (c == '"') {
                if (i + 1 < text.size() && text[i + 1] == '"') {
                    field += '"';
                    ++i;
                } else {
                    quoted = false;
                    afterQuote = true;
                }
            } else {
                if (c == '\n') ++line;
                field += c;
            }
            continue;
        }
        if (c == ',') {
            endField();
        } else if (c == '\n' || c == '\r') {
            if (c == '\r' && i + 1 < text.size() && text[i + 1] == '\n') ++i;
            endRecord();
            ++line;
        } else if (afterQuote) {
            throw InputError(subject, "line " + std::to_string(line) + ": text after a closing quote");
        } else if (c == '"' && !fieldStarted) {
            quoted = fieldStarted = true;
            quoteLine = line;
        } else {
            field += c;
            fieldStarted = true;
        }
    }
    if (quoted) throw InputError(subject, "line " + std::to_string(quoteLine) + ": a quoted field is not closed");
    if (fieldStarted || !record.empty()) endRecord();
    return records;
}

std::vector<NewTake> readTakeList(const std::string& csvPath, const std::string& build) {
    const std::string text = withoutByteOrderMark(readTextFile(csvPath));
    if (auto bad = firstInvalidUtf8(text))
        throw InputError(csvPath, "is not UTF-8 text (bad byte at offset " + std::to_string(*bad) + ")");

    const auto records = parseCsv(text, csvPath);
    if (records.empty()) throw InputError(csvPath, "is empty; expected a header row id,audio,text");
    const auto& header = records.front();
    auto column = [&](const std::string& name) -> int {
        for (std::size_t i = 0; i < header.size(); ++i)
            if (header[i] == name) return static_cast<int>(i);
        return -1;
    };
    const int idCol = column("id"), audioCol = column("audio"), textCol = column("text");
    if (idCol < 0 || audioCol < 0)
        throw InputError(csvPath, "needs a header row with the columns id and audio (and optionally text)");

    const std::filesystem::path folder = std::filesystem::absolute(csvPath).parent_path();
    std::vector<NewTake> takes;
    for (std::size_t r = 1; r < records.size(); ++r) {
        const auto& row = records[r];
        if (row.size() == 1 && row[0].empty()) continue;  // blank line
        const std::string where = "row " + std::to_string(r + 1);
        if (row.size() < header.size())
            throw InputError(csvPath, where + " has " + std::to_string(row.size()) + " fields; the header has " +
                                          std::to_string(header.size()));
        NewTake t;
        t.lineId = row[static_cast<std::size_t>(idCol)];
        const std::string audio = row[static_cast<std::size_t>(audioCol)];
        if (t.lineId.empty() || audio.empty()) throw InputError(csvPath, where + " has an empty id or audio");
        const std::filesystem::path p(audio);
        t.audioPath = (p.is_absolute() ? p : folder / p).lexically_normal().string();
        if (textCol >= 0) t.text = row[static_cast<std::size_t>(textCol)];
        t.build = build;
        takes.push_back(std::move(t));
    }
    return takes;
}

}  // namespace earmark
