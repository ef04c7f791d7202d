#include "earmark/export/defect_list.hpp"

#include "earmark/store/utc_clock.hpp"

#include <nlohmann/json.hpp>

#include <charconv>
#include <filesystem>
#include <set>

namespace earmark {
namespace {

using nlohmann::ordered_json;

ordered_json rowToJson(const DefectRow& row) {
    const Take& t = row.take;
    const Mark& m = row.mark;
    ordered_json measures = ordered_json::object();
    for (const auto& [name, value] : m.measures) measures[name] = value;
    return ordered_json{
        {"mark_id", m.id},
        {"take_id", t.id},
        {"line_id", t.lineId},
        {"audio", t.storedAudioPath},
        {"build", t.build},
        {"text", t.text},
        {"start_s", m.startSeconds},
        {"end_s", m.endSeconds},
        {"duration_s", m.endSeconds - m.startSeconds},
        {"words", m.words},
        {"category", categoryName(m.category)},
        {"subtype", m.subtype},
        {"severity", severityName(m.severity)},
        {"note", m.note},
        {"rater", m.rater},
        {"created_utc", m.createdUtc},
        {"updated_utc", m.updatedUtc},
        {"measures", std::move(measures)},
    };
}

}  // namespace

std::vector<std::string> DefectList::measureNames() const {
    std::set<std::string> names;
    for (const DefectRow& r : rows)
        for (const auto& [name, value] : r.mark.measures) names.insert(name);
    return {names.begin(), names.end()};
}

DefectList collectDefects(const Session& session, std::optional<TakeId> take) {
    DefectList list;
    list.sessionName = std::filesystem::path(session.path()).filename().string();
    list.exportedUtc = store::utcNowIso8601();
    std::map<TakeId, Take> takes;
    for (Take& t : session.takes()) takes.emplace(t.id, std::move(t));
    for (Mark& m : session.marks(take)) {
        const auto it = takes.find(m.takeId);
        // marks() and takes() are separate reads; a take added in between is read on its own.
        Take t = it != takes.end() ? it->second : session.take(m.takeId);
        list.rows.push_back({std::move(t), std::move(m)});
    }
    return list;
}

std::string formatNumber(double value) {
    char buf[64];
    const auto result = std::to_chars(buf, buf + sizeof buf, value);
    return std::string(buf, result.ptr);
}

std::string csvField(std::string_view text) {
    const bool needsQuotes = text.find_first_of(",\"\r\n") != std::string_view::npos ||
                             (!text.empty() && (text.front() == ' ' || text.back() == ' '));
    if (!needsQuotes) return std::string(text);
    std::string out = "\"";
    for (char c : text) {
        if (c == '"') out += '"';
        out += c;
    }
    return out + "\"";
}

std::string csvRecord(const std::vector<std::string>& fields) {
    std::string line;
    for (std::size_t i = 0; i < fields.size(); ++i) {
        if (i) line += ',';
        line += csvField(fields[i]);
    }
    return line + "\r\n";
}

std::vector<std::string> defectCsvHeader(const std::vector<std::string>& measureNames) {
    std::vector<std::string> h = {"mark_id", "take_id", "line_id",  "audio",    "build",       "text",
                                  "start_s", "end_s",   "duration_s", "words",  "category",    "subtype",
                                  "severity", "note",   "rater",    "created_utc", "updated_utc"};
    for (const auto& name : measureNames) h.push_back("measure." + name);
    return h;
}

std::vector<std::string> defectCsvFields(const DefectRow& row, const std::vector<std::string>& measureNames) {
    const Take& t = row.take;
    const Mark& m = row.mark;
    std::vector<std::string> f = {std::to_string(m.id),
                                  std::to_string(t.id),
                                  t.lineId,
                                  t.storedAudioPath,
                                  t.build,
                                  t.text,
                                  formatNumber(m.startSeconds),
                                  formatNumber(m.endSeconds),
                                  formatNumber(m.endSeconds - m.startSeconds),
                                  m.words,
                                  std::string(categoryName(m.category)),
                                  m.subtype,
                                  std::string(severityName(m.severity)),
                                  m.note,
                                  m.rater,
                                  m.createdUtc,
                                  m.updatedUtc};
    for (const auto& name : measureNames) {
        const auto it = m.measures.find(name);
        f.push_back(it != m.measures.end() ? formatNumber(it->second) : "");
    }
    return f;
}

std::string defectListToCsv(const DefectList& list) {
    const auto names = list.measureNames();
    std::string out = csvRecord(defectCsvHeader(names));
    for (const DefectRow& row : list.rows) out += csvRecord(defectCsvFields(row, names));
    return out;
}

std::string defectListToJson(const DefectList& list, int indent) {
    ordered_json marks = ordered_json::array();
    for (const DefectRow& row : list.rows) marks.push_back(rowToJson(row));
    const ordered_json doc{
        {"format", "earmark-defect-list"},
        {"version", 1},
        {"session", list.sessionName},
        {"exported_utc", list.exportedUtc},
        {"measure_names", list.measureNames()},
        {"marks", std::move(marks)},
    };
    // Stored text is checked UTF-8 on the way in; replace guards files edited by hand.
    return doc.dump(indent, ' ', false, ordered_json::error_handler_t::replace);
}

}  // namespace earmark
