// The list of takes given on the command line: audio files, or a CSV list
// with a header naming at least the columns `audio` (path, relative to the
// CSV's folder) and optionally `id` and `text` (RFC 4180 quoting).
#pragma once

#include <QString>
#include <QStringList>

#include <vector>

namespace earmark::widgets {

struct TakeEntry {
    QString id;     // shown in the list; the file's base name when there is no id
    QString audio;  // absolute path
    QString text;   // script line, may be empty
};

// Splits one CSV record (no embedded line breaks) into fields.
QStringList splitCsvLine(const QString& line);

// Reads a CSV take list. Throws earmark::InputError naming the file when it
// cannot be read or has no `audio` column.
std::vector<TakeEntry> readTakeList(const QString& csvPath);

// Expands command-line arguments: .csv files become their takes, anything
// else is taken as an audio file.
std::vector<TakeEntry> takesFromArguments(const QStringList& arguments);

}  // namespace earmark::widgets
