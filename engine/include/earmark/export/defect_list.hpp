// Defect lists: the marks of a session as CSV (RFC 4180) or JSON, one row per
// mark with its take, span, words, category, severity, note, rater, times and
// measure snapshot. Columns, fields and units: docs/defect-list.md; the JSON
// form is described by docs/defect-list.schema.json (JSON Schema 2020-12).
//
// Pure functions of their inputs; thread-safe.
#pragma once

#include "earmark/marks/mark.hpp"
#include "earmark/store/session.hpp"
#include "earmark/store/take.hpp"

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace earmark {

struct DefectRow {
    Take take;
    Mark mark;
};

struct DefectList {
    std::string sessionName;   // the session file's name (no folder)
    std::string exportedUtc;   // ISO 8601 UTC
    std::vector<DefectRow> rows;

    // Every measure name used by any row, sorted: the CSV's measure columns.
    std::vector<std::string> measureNames() const;
};

// Marks of the session (of one take, when given) in queue order, then time.
DefectList collectDefects(const Session& session, std::optional<TakeId> take = std::nullopt);

// CSV, UTF-8 without byte-order mark, CRLF after every record (RFC 4180).
// The header row is the fixed columns of docs/defect-list.md followed by one
// "measure.<name>" column per measure name; a mark without that measure has
// an empty cell. Numbers use the shortest text that reads back exactly.
std::string defectListToCsv(const DefectList& list);

// JSON object {"format": "earmark-defect-list", "version": 1, …, "marks": […]}.
// indent < 0 writes one line.
std::string defectListToJson(const DefectList& list, int indent = 2);

// The CSV's parts, for files that add columns (the bundle manifest):
// the header fields, one row's fields, and one record with its CRLF.
std::vector<std::string> defectCsvHeader(const std::vector<std::string>& measureNames);
std::vector<std::string> defectCsvFields(const DefectRow& row, const std::vector<std::string>& measureNames);
std::string csvRecord(const std::vector<std::string>& fields);

// One RFC 4180 field: quoted (with "" for a quote) when it holds a comma,
// quote, CR or LF, or starts or ends with a space; as is otherwise.
std::string csvField(std::string_view text);

// Shortest decimal text that reads back as the same double ("0.1", "1e-07").
std::string formatNumber(double value);

}  // namespace earmark
