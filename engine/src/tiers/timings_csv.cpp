#include "earmark/tiers/timings_csv.hpp"

#include "earmark/core/error.hpp"
#include "row_check.hpp"
#include "text_util.hpp"

#include <algorithm>
#include <array>
#include <cctype>

namespace earmark {
namespace {

using namespace tiers_detail;

struct Record {
    std::size_t line = 0;  // 1-based line where the record starts
    std::vector<std::string> fields;
};

// RFC 4180 records. A line break inside quotes belongs to the field.
std::vector<Record> splitRecords(std::string_view text, const std::string& source) {
    std::vector<Record> records;
    std::size_t line = 1;
    std::size_t i = 0;
    while (i < text.size()) {
        Record rec;
        rec.line = line;
        std::string field;
        bool fieldWasQuoted = false;
        bool endOfRecord = false;
        while (!endOfRecord) {
            if (i >= text.size()) {
                endOfRecord = true;
            } else if (text[i] == '"' && field.empty() && !fieldWasQuoted) {
                fieldWasQuoted = true;
                ++i;
                for (;;) {
                    if (i >= text.size())
                        throw InputError(source, "line " + std::to_string(rec.line) + ": a quoted field is not closed");
                    if (text[i] == '"') {
                        if (i + 1 < text.size() && text[i + 1] == '"') {
                            field += '"';
                            i += 2;
                            continue;
                        }
                        ++i;
                        break;
                    }
                    if (text[i] == '\n') ++line;
                    field += text[i++];
                }
                if (i < text.size() && text[i] != ',' && text[i] != '\n' && text[i] != '\r')
                    throw InputError(source, "line " + std::to_string(line) +
                                                 ": text after the closing quote of a field");
            } else if (text[i] == ',') {
                rec.fields.push_back(std::move(field));
                field.clear();
                fieldWasQuoted = false;
                ++i;
            } else if (text[i] == '\r' || text[i] == '\n') {
                if (text[i] == '\r' && i + 1 < text.size() && text[i + 1] == '\n') ++i;
                ++i;
                ++line;
                endOfRecord = true;
            } else if (text[i] == '"') {
                throw InputError(source, "line " + std::to_string(line) +
                                             ": a quote inside an unquoted field (RFC 4180 needs the field quoted)");
            } else {
                field += text[i++];
            }
        }
        rec.fields.push_back(std::move(field));
        const bool blank = rec.fields.size() == 1 && !fieldWasQuoted &&
                           rec.fields[0].find_first_not_of(" \t") == std::string::npos;
        if (!blank) records.push_back(std::move(rec));
    }
    return records;
}

std::string lowerTrimmed(std::string s) {
    s.erase(0, s.find_first_not_of(" \t"));
    s.erase(s.find_last_not_of(" \t") + 1);
    std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return std::tolower(c); });
    return s;
}

// Column index of each known field; -1 = absent.
struct Columns {
    int start = 0, end = 1, label = 2, tier = 3, confidence = 4;
};

Columns columnsFromHeader(const Record& header, const std::string& source) {
    Columns c{-1, -1, -1, -1, -1};
    for (std::size_t k = 0; k < header.fields.size(); ++k) {
        const std::string name = lowerTrimmed(header.fields[k]);
        const int idx = static_cast<int>(k);
        if (name == "start") c.start = idx;
        else if (name == "end") c.end = idx;
        else if (name == "label" || name == "text") c.label = idx;
        else if (name == "tier") c.tier = idx;
        else if (name == "confidence") c.confidence = idx;
    }
    if (c.start < 0 || c.end < 0 || c.label < 0)
        throw InputError(source, "line " + std::to_string(header.line) +
                                     ": the header needs columns start, end and label");
    return c;
}

std::string quoted(const std::string& field) {
    if (field.find_first_of(",\"\r\n") == std::string::npos) return field;
    std::string out = "\"";
    for (char ch : field) {
        if (ch == '"') out += '"';
        out += ch;
    }
    return out + "\"";
}

}  // namespace

LoadedTimings parseTimingsCsv(std::string_view text, const std::string& source,
                              const TimingsReadOptions& options) {
    const std::vector<Record> records = splitRecords(stripBom(text), source);
    Columns cols;
    std::size_t first = 0;
    const auto isHeader = [](const Record& rec) {
        if (parseNumber(rec.fields[0])) return false;
        return std::any_of(rec.fields.begin(), rec.fields.end(),
                           [](const std::string& f) { return lowerTrimmed(f) == "start"; });
    };
    if (!records.empty() && isHeader(records[0])) {
        cols = columnsFromHeader(records[0], source);
        first = 1;
    }
    const int needed = std::max({cols.start, cols.end, cols.label}) + 1;

    LoadedTimings out;
    RowNames rows;
    for (std::size_t r = first; r < records.size(); ++r) {
        const Record& rec = records[r];
        const std::string where = "line " + std::to_string(rec.line);
        if (static_cast<int>(rec.fields.size()) < needed)
            throw InputError(source, where + ": expected start,end,label[,tier] but found " +
                                         std::to_string(rec.fields.size()) + " field(s)");
        const auto field = [&](int idx) -> std::string {
            return idx >= 0 && idx < static_cast<int>(rec.fields.size()) ? rec.fields[idx] : std::string();
        };
        Interval iv;
        const auto start = parseNumber(field(cols.start));
        const auto end = parseNumber(field(cols.end));
        if (!start) throw InputError(source, where + ": start '" + field(cols.start) + "' is not a number of seconds");
        if (!end) throw InputError(source, where + ": end '" + field(cols.end) + "' is not a number of seconds");
        iv.startS = *start;
        iv.endS = *end;
        iv.label = field(cols.label);
        if (const std::string c = field(cols.confidence); !lowerTrimmed(c).empty()) {
            const auto conf = parseNumber(c);
            if (!conf) throw InputError(source, where + ": confidence '" + c + "' is not a number");
            iv.confidence = *conf;
        }
        std::string tierName = field(cols.tier);
        if (lowerTrimmed(tierName).empty()) tierName = options.defaultTier;
        const std::size_t before = out.tiers.tiers.size();
        Tier& tier = out.tiers.getOrAdd(tierName);
        if (out.tiers.tiers.size() != before) rows.emplace_back();
        const std::size_t t = static_cast<std::size_t>(&tier - out.tiers.tiers.data());
        tier.intervals.push_back(std::move(iv));
        rows[t].push_back(where + " (tier '" + tierName + "')");
    }
    out.warnings = validateRows(out.tiers, rows, source, options.takeDurationS);
    return out;
}

std::string timingsToCsv(const TierSet& set) {
    bool anyConfidence = false;
    for (const Tier& t : set.tiers)
        for (const Interval& iv : t.intervals) anyConfidence |= iv.confidence.has_value();
    std::string out = anyConfidence ? "start,end,label,tier,confidence\r\n" : "start,end,label,tier\r\n";
    for (const Tier& t : set.tiers) {
        for (const Interval& iv : t.intervals) {
            // Appended piece by piece: GCC 12 warns falsely (-Wrestrict) on long operator+ chains.
            for (const std::string& field : {formatNumber(iv.startS), formatNumber(iv.endS), quoted(iv.label)}) {
                out += field;
                out += ',';
            }
            out += quoted(t.name);
            if (anyConfidence) {
                out += ',';
                if (iv.confidence) out += formatNumber(*iv.confidence);
            }
            out += "\r\n";
        }
    }
    return out;
}

}  // namespace earmark
