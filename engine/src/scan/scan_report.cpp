#include "earmark/scan/scan_report.hpp"

#include "earmark/core/error.hpp"
#include "earmark/io/text_file.hpp"
#include "io/json_text.hpp"
#include "earmark/export/defect_list.hpp"  // csvRecord (RFC 4180)
#include "earmark/store/take_list.hpp"     // parseCsv (RFC 4180)

#include "../longform/finding_json.hpp"
#include "word_measures_json.hpp"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <functional>
#include <map>
#include <set>
#include <sstream>

namespace earmark {
namespace {

using Json = nlohmann::ordered_json;
using Opt = std::optional<double>;

// Figures merge reads back (loudness, duration, per-take score) are written
// exactly — the shortest text that reads back as the same double — so merged
// shards decide and score like one run.
constexpr int kExact = -1;

std::string fixed(double v, int decimals) {
    if (!std::isfinite(v)) return "";
    char buf[64];
    if (decimals == kExact) return std::string(buf, std::to_chars(buf, buf + sizeof buf, v).ptr);
    std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
    return buf;
}
std::string fixed(const Opt& v, int decimals) { return v ? fixed(*v, decimals) : ""; }

Opt parseNumber(const std::string& s, const std::string& what) {
    if (s.empty()) return std::nullopt;
    double v = 0;
    auto [p, ec] = std::from_chars(s.data(), s.data() + s.size(), v);
    if (ec != std::errc() || p != s.data() + s.size()) throw InputError(what, "expects a number, got '" + s + "'");
    return v;
}

SyllableSource sourceFromName(const std::string& s) {
    for (auto src : {SyllableSource::Phones, SyllableSource::Text, SyllableSource::EnergyPeaks})
        if (s == syllableSourceName(src)) return src;
    return SyllableSource::None;
}

// A per-take figure: its column / JSON key, how it is written and read back.
struct Measure {
    const char* name;
    std::function<Opt(const TakeMeasures&)> get;
    std::function<void(TakeMeasures&, Opt)> set;
    int decimals;
};

#define EARMARK_PLAIN(key, field, dec) \
    Measure{key, [](const TakeMeasures& m) -> Opt { return static_cast<double>(m.field); }, \
            [](TakeMeasures& m, Opt v) { if (v) m.field = static_cast<decltype(m.field)>(*v); }, dec}
#define EARMARK_OPTIONAL(key, field, dec) \
    Measure{key, [](const TakeMeasures& m) -> Opt { return m.field; }, [](TakeMeasures& m, Opt v) { m.field = v; }, dec}

const std::vector<Measure>& measures() {
    static const std::vector<Measure> list = {
        EARMARK_PLAIN("duration_s", durationS, kExact),
        EARMARK_PLAIN("speech_s", speechS, 3),
        EARMARK_PLAIN("leading_silence_s", leadingSilenceS, 3),
        EARMARK_PLAIN("trailing_silence_s", trailingSilenceS, 3),
        EARMARK_PLAIN("words", words, 0),
        EARMARK_PLAIN("syllables", syllables, 0),
        EARMARK_OPTIONAL("words_per_min", wordsPerMinute, 1),
        EARMARK_OPTIONAL("syllables_per_s", syllablesPerS, 2),
        EARMARK_OPTIONAL("articulation_syllables_per_s", articulationSyllablesPerS, 2),
        EARMARK_PLAIN("articulation_s", articulationS, 3),
        EARMARK_OPTIONAL("f0_median_hz", f0MedianHz, 1),
        EARMARK_OPTIONAL("f0_range_st", f0RangeSt, 2),
        EARMARK_OPTIONAL("f0_spread_st", f0SpreadSt, 2),
        EARMARK_PLAIN("voiced_fraction", voicedFraction, 3),
        EARMARK_PLAIN("pause_count", pauseCount, 0),
        EARMARK_PLAIN("pause_total_s", pauseTotalS, 3),
        EARMARK_PLAIN("pause_longest_s", longestPauseS, 3),
        EARMARK_PLAIN("speech_level_dbfs", speechLevelDb, 2),
        EARMARK_OPTIONAL("loudness_lufs", level.loudnessLufs, kExact),
        Measure{"peak_dbfs", [](const TakeMeasures& m) -> Opt { return m.level.peakDbfs; },
                [](TakeMeasures& m, Opt v) { m.level.peakDbfs = v.value_or(-INFINITY); }, 2},
        EARMARK_PLAIN("clipped_samples", level.clippedSamples, 0),
        EARMARK_PLAIN("dc_offset", level.dcOffset, 6),
    };
    return list;
}
#undef EARMARK_PLAIN
#undef EARMARK_OPTIONAL

std::string joined(const std::vector<TakeSuspect>& s, bool reasons) {
    std::string out;
    for (const auto& x : s) {
        if (!out.empty()) out += reasons ? "; " : ";";
        out += reasons ? x.reason : suspectName(x.kind);
    }
    return out;
}

std::vector<std::string> split(const std::string& s, const std::string& sep) {
    std::vector<std::string> parts;
    if (s.empty()) return parts;
    std::size_t from = 0;
    for (;;) {
        const auto at = s.find(sep, from);
        parts.push_back(s.substr(from, at - from));
        if (at == std::string::npos) break;
        from = at + sep.size();
    }
    return parts;
}

Json numberOrNull(double v) { return std::isfinite(v) ? Json(v) : Json(nullptr); }
double numberFrom(const Json& j) { return j.is_number() ? j.get<double>() : NAN; }

// Word-evidence columns: word lists are space-separated (a script word holds
// no white space); the extra stretches are separated by " | ".
using Kind = CoverageFinding::Kind;

std::string spaced(const std::vector<std::string>& words, const std::string& sep = " ") {
    std::string out;
    for (const auto& w : words) out += (out.empty() ? "" : sep) + w;
    return out;
}

const CoverageFinding* earlyEndOf(const TakeWords& w) {
    for (const auto& c : w.coverage)
        if (c.kind == Kind::EarlyEnd) return &c;
    return nullptr;
}

std::vector<std::string> extraNear(const TakeWords& w) {
    std::vector<std::string> out;
    for (const auto& c : w.coverage)
        if (c.kind == Kind::Extra) out.push_back(spaced(c.words));
    return out;
}

const std::vector<std::string>& wordColumns() {
    static const std::vector<std::string> c = {"alignment_method", "lowest_word_score", "lowest_word",
                                               "missing_words",    "repeated_words",    "extra_near",
                                               "early_end_s",      "early_end_words"};
    return c;
}

std::vector<std::string> wordCells(const TakeWords& w) {
    if (!w.gathered()) return std::vector<std::string>(wordColumns().size());
    const ScannedWord* low = w.lowest();
    const CoverageFinding* end = earlyEndOf(w);
    return {w.method,
            low ? fixed(low->score, 3) : "",
            low ? low->label : "",
            spaced(w.wordsOf(Kind::Skipped)),
            spaced(w.wordsOf(Kind::Repeated)),
            spaced(extraNear(w), " | "),
            end ? fixed(end->startS, 3) : "",
            end ? spaced(end->words) : ""};
}

// The columns back into a TakeWords without per-word scores.
TakeWords wordsFromCells(const std::function<std::string(const std::string&)>& cell, const std::string& where) {
    TakeWords w;
    w.method = cell("alignment_method");
    if (w.method.empty()) return w;
    if (const auto low = parseNumber(cell("lowest_word_score"), where + " lowest_word_score"))
        w.words.push_back({cell("lowest_word"), NAN, NAN, *low, ""});
    auto finding = [&](Kind kind, std::vector<std::string> words) {
        CoverageFinding f;
        f.kind = kind;
        f.words = std::move(words);
        f.startS = f.endS = NAN;
        w.coverage.push_back(std::move(f));
    };
    for (const auto& word : split(cell("missing_words"), " ")) finding(Kind::Skipped, {word});
    for (const auto& word : split(cell("repeated_words"), " ")) finding(Kind::Repeated, {word});
    for (const auto& near : split(cell("extra_near"), " | ")) finding(Kind::Extra, split(near, " "));
    if (const auto end = parseNumber(cell("early_end_s"), where + " early_end_s")) {
        finding(Kind::EarlyEnd, split(cell("early_end_words"), " "));
        w.coverage.back().startS = *end;
    }
    return w;
}

Json wordsToJson(const TakeWords& w) {
    if (!w.gathered()) return nullptr;
    const ScannedWord* low = w.lowest();
    const CoverageFinding* end = earlyEndOf(w);
    Json j;
    j["method"] = w.method;
    j["lowest_word_score"] = low ? numberOrNull(low->score) : Json(nullptr);
    j["lowest_word"] = low ? Json(low->label) : Json(nullptr);
    j["missing_words"] = w.wordsOf(Kind::Skipped);
    j["repeated_words"] = w.wordsOf(Kind::Repeated);
    j["extra_near"] = extraNear(w);
    j["early_end_s"] = end ? numberOrNull(end->startS) : Json(nullptr);
    j["early_end_words"] = end ? Json(end->words) : Json::array();
    Json coverage = Json::array();
    for (const auto& c : w.coverage)
        coverage.push_back({{"kind", coverageKindName(c.kind)},
                            {"words", c.words},
                            {"start_s", numberOrNull(c.startS)},
                            {"end_s", numberOrNull(c.endS)},
                            {"detail", c.detail}});
    j["coverage"] = coverage;
    if (w.scoresKnown) {
        Json scores = Json::array();
        for (const auto& s : w.words)
            scores.push_back({{"word", s.label},
                              {"start_s", s.startS},
                              {"end_s", s.endS},
                              {"score", numberOrNull(s.score)},
                              {"off_phones", s.offPhones}});
        j["scores"] = scores;
    }
    return j;
}

TakeWords wordsFromJson(const Json& j) {
    TakeWords w;
    if (j.is_null()) return w;
    w.method = j.at("method").get<std::string>();
    for (const auto& c : j.at("coverage")) {
        CoverageFinding f;
        const std::string kind = c.at("kind").get<std::string>();
        for (auto k : {Kind::Skipped, Kind::Repeated, Kind::Extra, Kind::EarlyEnd, Kind::Substituted})
            if (kind == coverageKindName(k)) f.kind = k;
        f.words = c.at("words").get<std::vector<std::string>>();
        f.startS = numberFrom(c.at("start_s"));
        f.endS = numberFrom(c.at("end_s"));
        f.detail = c.at("detail").get<std::string>();
        w.coverage.push_back(std::move(f));
    }
    if (j.contains("scores")) {
        w.scoresKnown = true;
        for (const auto& s : j.at("scores"))
            w.words.push_back({s.at("word").get<std::string>(), numberFrom(s.at("start_s")), numberFrom(s.at("end_s")),
                               numberFrom(s.at("score")), s.at("off_phones").get<std::string>()});
    } else if (j.at("lowest_word_score").is_number()) {
        w.words.push_back({j.at("lowest_word").get<std::string>(), NAN, NAN, j.at("lowest_word_score").get<double>(), ""});
    }
    return w;
}

const std::vector<std::string>& leadColumns() {
    static const std::vector<std::string> c = {"rank", "id", "file", "status"};
    return c;
}
const std::vector<std::string>& tailColumns() {
    static const std::vector<std::string> c = {"suspect_count", "score", "suspects", "reasons",
                                               "score_take", "position", "partial"};
    return c;
}

// Positions beyond this cannot come from a real listing; checked before any cast.
constexpr double kMaxPosition = 1e15;


ScanReport readCsvReport(const std::string& text, const std::string& path) {
    auto records = parseCsv(text, path);
    std::erase_if(records, [](const std::vector<std::string>& r) { return r.size() == 1 && r[0].empty(); });
    if (records.empty()) throw InputError(path, "is empty (expected a scan CSV with a header)");
    std::map<std::string, std::size_t> col;
    for (std::size_t i = 0; i < records[0].size(); ++i) col[records[0][i]] = i;
    for (const char* need : {"id", "file", "status", "score_take", "suspects", "reasons", "position", "partial"})
        if (!col.count(need)) throw InputError(path, std::string("is not a scan CSV: no '") + need + "' column");
    ScanReport report;
    for (std::size_t r = 1; r < records.size(); ++r) {
        const auto& rec = records[r];
        const std::string where = path + " row " + std::to_string(r + 1);
        auto cell = [&](const std::string& name) -> std::string {
            auto it = col.find(name);
            return it != col.end() && it->second < rec.size() ? rec[it->second] : "";
        };
        ScanRow row;
        row.id = cell("id");
        row.file = cell("file");
        row.status = cell("status");
        row.failed = row.status.rfind("error", 0) == 0;
        const auto position = parseNumber(cell("position"), where + " position");
        if (!position || !(*position >= 1 && *position <= kMaxPosition) || std::floor(*position) != *position)
            throw InputError(where, "position must be a whole number >= 1");
        row.index = static_cast<std::size_t>(*position) - 1;
        row.takeScore = parseNumber(cell("score_take"), where + " score_take").value_or(0.0);
        if (cell("partial") == "yes") report.partial = true;
        if (!row.failed) {
            TakeMeasures m;
            for (const auto& meas : measures())
                if (col.count(meas.name)) meas.set(m, parseNumber(cell(meas.name), where + " " + meas.name));
            if (col.count("syllable_source")) m.syllableSource = sourceFromName(cell("syllable_source"));
            row.measures = m;
            row.words = wordsFromCells(cell, where);
            row.wordTimesFrom = cell("word_times");
        }
        const auto names = split(cell("suspects"), ";");
        const auto reasons = split(cell("reasons"), "; ");
        if (names.size() != reasons.size())
            throw InputError(where, "the suspects and reasons columns do not match (" + std::to_string(names.size()) +
                                        " names, " + std::to_string(reasons.size()) + " reasons)");
        for (std::size_t i = 0; i < names.size(); ++i) {
            const auto kind = suspectKindFromName(names[i]);
            if (!kind) throw InputError(where, "unknown suspect '" + names[i] + "'");
            TakeSuspect s;
            s.kind = *kind;
            s.value = s.threshold = s.startS = s.endS = NAN;
            s.reason = reasons[i];
            row.suspects.push_back(std::move(s));
        }
        row.score = row.takeScore;
        report.rows.push_back(std::move(row));
    }
    report.takesListed = report.rows.size();
    return report;
}

WordScoreCalibration calibrationFromJson(const Json& j) {
    WordScoreCalibration c;
    c.medianScore = j.at("median_score").get<double>();
    c.mad = j.at("mad").get<double>();
    c.words = j.at("words").get<std::size_t>();
    c.typicalWordSeconds = j.value("typical_word_s", 0.0);  // absent in reports written before it
    c.supplied = j.value("supplied", false);
    if (j.contains("same_words")) {  // absent in reports written before it
        for (const auto& [word, w] : j.at("same_words").items())
            c.sameWords[word] = {w.at("mad").get<double>(), w.at("count").get<std::size_t>()};
    }
    return c;
}

Json parseScanJson(const std::string& text, const std::string& path) {
    const Json doc = io_detail::parseJsonText<Json>(text, path);
    if (!doc.is_object() || doc.value("format", "") != "earmark-scan" || !doc.contains("takes"))
        throw InputError(path, "is not an earmark scan JSON (no \"format\": \"earmark-scan\" with \"takes\")");
    return doc;
}

ScanReport readJsonReport(const std::string& text, const std::string& path) {
    const Json doc = parseScanJson(text, path);
    ScanReport report;
    try {
        report.partial = doc.value("partial", false);
        if (const auto listed = doc.find("takes_listed"); listed != doc.end() && listed->is_number_unsigned())
            report.takesListed = static_cast<std::size_t>(listed->get<std::uint64_t>());
        if (doc.contains("word_score_calibration") && doc.at("word_score_calibration").is_object())
            report.wordCalibration = calibrationFromJson(doc.at("word_score_calibration"));
        for (const auto& t : doc.at("takes")) {
            ScanRow row;
            const Json& position = t.at("position");
            if (!position.is_number_unsigned() || position.get<std::uint64_t>() < 1 ||
                position.get<std::uint64_t>() > kMaxPosition)
                throw InputError(path, "take " + std::to_string(report.rows.size() + 1) +
                                           ": position must be a whole number >= 1");
            row.index = static_cast<std::size_t>(position.get<std::uint64_t>()) - 1;
            row.id = io_detail::pathFromJson(t, "id", path);
            row.file = io_detail::pathFromJson(t, "file", path);
            row.status = t.at("status").get<std::string>();
            row.failed = row.status.rfind("error", 0) == 0;
            row.takeScore = t.at("score_take").get<double>();
            row.score = row.takeScore;
            if (!row.failed && t.contains("measures")) {
                TakeMeasures m;
                const auto& jm = t.at("measures");
                for (const auto& meas : measures())
                    if (jm.contains(meas.name) && jm.at(meas.name).is_number())
                        meas.set(m, jm.at(meas.name).get<double>());
                m.syllableSource = sourceFromName(jm.value("syllable_source", "none"));
                row.measures = m;
            }
            if (t.contains("words")) row.words = wordsFromJson(t.at("words"));
            row.wordTimesFrom = t.value("word_times", "");
            if (t.contains("word_measures"))
                row.wordProsody = detail::wordMeasuresFromJson(t.at("word_measures"), path, row.id);
            for (const auto& js : t.at("suspects")) {
                const auto kind = suspectKindFromName(js.at("name").get<std::string>());
                if (!kind) throw InputError(path, "take '" + row.id + "': unknown suspect '" +
                                                      js.at("name").get<std::string>() + "'");
                TakeSuspect s;
                s.kind = *kind;
                s.value = numberFrom(js.at("value"));
                s.threshold = numberFrom(js.at("threshold"));
                s.unit = js.value("unit", "");
                s.startS = numberFrom(js.at("start_s"));
                s.endS = numberFrom(js.at("end_s"));
                s.reason = js.at("reason").get<std::string>();
                row.suspects.push_back(std::move(s));
            }
            if (t.contains("findings"))
                for (const auto& jf : t.at("findings")) row.findings.push_back(detail::findingFromJson(jf, path, row.id));
            report.rows.push_back(std::move(row));
        }
    } catch (const Json::exception& e) {
        throw InputError(path, std::string("a field is missing or has the wrong type: ") + e.what());
    }
    return report;
}

}  // namespace

namespace {

// Pronunciation against the set (or the supplied calibration).
void applyPronunciation(ScanReport& report, const ScanRules& rules,
                        const std::optional<WordScoreCalibration>& supplied) {
    std::vector<double> scores, seconds;
    std::vector<std::string> labels;
    for (const auto& row : report.rows)
        if (!row.failed && row.words.scoresKnown)
            for (const auto& w : row.words.words) {
                scores.push_back(w.score);
                seconds.push_back(w.endS - w.startS);
                labels.push_back(w.label);
            }
    report.wordCalibration = supplied;
    if (report.wordCalibration) report.wordCalibration->supplied = true;
    else report.wordCalibration = calibrateWordScores(std::move(scores), rules.pronunciation, std::move(seconds), std::move(labels));
    for (auto& row : report.rows) {
        if (row.failed) continue;
        if (!row.words.scoresKnown) {
            // Read back from a CSV: the suspect found then stays, at its weight.
            for (const auto& s : row.suspects)
                if (s.kind == SuspectKind::Pronunciation) row.score += rules.pronunciation.weight;
            continue;
        }
        if (!rules.pronunciation.enabled || !report.wordCalibration) continue;
        if (auto s = pronunciationSuspect(row.words, *report.wordCalibration, rules)) {
            row.score += suspectScore(*s, rules);
            row.suspects.push_back(std::move(*s));
        }
    }
}

}  // namespace

void applySetRules(ScanReport& report, const ScanRules& rules, const std::optional<WordScoreCalibration>& calibration) {
    std::vector<double> lufs;
    for (auto& row : report.rows) {
        std::erase_if(row.suspects, [&](const TakeSuspect& s) {
            return isSetLevel(s.kind) && (s.kind != SuspectKind::Pronunciation || row.words.scoresKnown);
        });
        row.score = row.takeScore;
        if (!row.failed && row.measures && row.measures->level.loudnessLufs)
            lufs.push_back(*row.measures->level.loudnessLufs);
    }
    applyPronunciation(report, rules, calibration);
    report.setMedianLufs.reset();
    if (!rules.loudness.enabled || lufs.size() < static_cast<std::size_t>(rules.loudness.minTakes)) return;
    std::sort(lufs.begin(), lufs.end());
    const std::size_t n = lufs.size();
    const double median = n % 2 ? lufs[n / 2] : 0.5 * (lufs[n / 2 - 1] + lufs[n / 2]);
    report.setMedianLufs = median;
    for (auto& row : report.rows) {
        if (row.failed || !row.measures || !row.measures->level.loudnessLufs) continue;
        if (auto s = loudnessSuspect(*row.measures->level.loudnessLufs, median, row.measures->durationS, rules)) {
            row.score += suspectScore(*s, rules);
            row.suspects.push_back(std::move(*s));
        }
    }
}

void rankRows(std::vector<ScanRow>& rows) {
    std::stable_sort(rows.begin(), rows.end(), [](const ScanRow& a, const ScanRow& b) {
        if (a.failed != b.failed) return !a.failed;
        // Compare at the precision written (0.001), so a merge of CSV parts ranks exactly like one run.
        const double sa = std::round(a.score * 1000.0), sb = std::round(b.score * 1000.0);
        if (!a.failed && sa != sb) return sa > sb;
        return a.index < b.index;
    });
}

ScanReport makeReport(ScanRun run, const ScanRules& rules, const std::optional<WordScoreCalibration>& calibration) {
    ScanReport report;
    report.rows = std::move(run.rows);
    report.partial = run.partial;
    report.takesListed = run.total;
    applySetRules(report, rules, calibration);
    rankRows(report.rows);
    return report;
}

std::string reportToCsv(const ScanReport& report) {
    std::vector<std::string> header = leadColumns();
    for (const auto& m : measures()) header.push_back(m.name);
    header.push_back("syllable_source");
    header.push_back("word_times");
    header.insert(header.end(), wordColumns().begin(), wordColumns().end());
    header.insert(header.end(), tailColumns().begin(), tailColumns().end());
    std::string out = csvRecord(header);
    std::size_t rank = 0;
    for (const auto& row : report.rows) {
        std::vector<std::string> rec = {std::to_string(++rank), row.id, row.file, row.status};
        for (const auto& m : measures()) rec.push_back(row.measures ? fixed(m.get(*row.measures), m.decimals) : "");
        rec.push_back(row.measures ? syllableSourceName(row.measures->syllableSource) : "");
        rec.push_back(row.wordTimesFrom);
        for (auto& c : wordCells(row.words)) rec.push_back(std::move(c));
        rec.push_back(row.failed ? "" : std::to_string(row.suspects.size()));
        rec.push_back(row.failed ? "" : fixed(row.score, 3));
        rec.push_back(joined(row.suspects, false));
        rec.push_back(joined(row.suspects, true));
        rec.push_back(row.failed ? "" : fixed(row.takeScore, kExact));
        rec.push_back(std::to_string(row.index + 1));
        rec.push_back(report.partial ? "yes" : "no");
        out += csvRecord(rec);
    }
    return out;
}

std::string reportToJson(const ScanReport& report, const ScanRules& rules) {
    Json doc;
    doc["format"] = "earmark-scan";
    doc["version"] = 1;
    doc["partial"] = report.partial;
    doc["takes_listed"] = report.takesListed;
    doc["takes_scanned"] = report.rows.size();
    doc["set_median_loudness_lufs"] = report.setMedianLufs ? Json(*report.setMedianLufs) : Json(nullptr);
    if (report.wordCalibration) {
        const auto& c = *report.wordCalibration;
        doc["word_score_calibration"] = {{"median_score", c.medianScore}, {"mad", c.mad}, {"words", c.words},
                                         {"typical_word_s", c.typicalWordSeconds}, {"supplied", c.supplied}, {"limit", c.limit(rules.pronunciation)}};
        Json same = Json::object();
        for (const auto& [word, w] : c.sameWords) same[word] = {{"mad", w.mad}, {"count", w.count}};
        doc["word_score_calibration"]["same_words"] = same;
    } else {
        doc["word_score_calibration"] = nullptr;
    }
    doc["rules"] = Json::parse(rulesToJson(rules));
    Json takes = Json::array();
    std::size_t rank = 0;
    for (const auto& row : report.rows) {
        Json t;
        t["rank"] = ++rank;
        t["position"] = row.index + 1;
        io_detail::putPath(t, "id", row.id);
        io_detail::putPath(t, "file", row.file);
        t["status"] = row.status;
        t["score"] = row.score;
        t["score_take"] = row.takeScore;
        if (row.measures) {
            Json m;
            for (const auto& meas : measures()) {
                const Opt v = meas.get(*row.measures);
                m[meas.name] = v ? numberOrNull(*v) : Json(nullptr);
            }
            m["syllable_source"] = syllableSourceName(row.measures->syllableSource);
            t["measures"] = m;
        } else {
            t["measures"] = nullptr;
        }
        Json suspects = Json::array();
        for (const auto& s : row.suspects) {
            suspects.push_back({{"name", suspectName(s.kind)},
                                {"value", numberOrNull(s.value)},
                                {"threshold", numberOrNull(s.threshold)},
                                {"unit", s.unit},
                                {"start_s", numberOrNull(s.startS)},
                                {"end_s", numberOrNull(s.endS)},
                                {"score", std::isfinite(s.value) ? Json(suspectScore(s, rules)) : Json(nullptr)},
                                {"reason", s.reason}});
        }
        t["suspects"] = suspects;
        t["words"] = wordsToJson(row.words);
        t["word_times"] = row.wordTimesFrom;
        t["word_measures"] = detail::wordMeasuresToJson(row.wordProsody);
        Json findings = Json::array();
        for (const Finding& f : row.findings) findings.push_back(detail::findingToJson(f));
        t["findings"] = findings;
        takes.push_back(std::move(t));
    }
    doc["takes"] = std::move(takes);
    return doc.dump(2, ' ', false, Json::error_handler_t::replace);
}

ScanReport readReport(const std::string& path) {
    const std::string text = readTextFile(path);
    const auto first = text.find_first_not_of(" \t\r\n");
    if (first != std::string::npos && text[first] == '{') return readJsonReport(text, path);
    return readCsvReport(text, path);
}

WordScoreCalibration readWordCalibration(const std::string& path) {
    const Json doc = parseScanJson(readTextFile(path), path);
    const Json& c = doc.contains("word_score_calibration") ? doc.at("word_score_calibration") : Json();
    if (!c.is_object()) throw InputError(path, "holds no word_score_calibration (the scan had too few scored words)");
    try {
        WordScoreCalibration out = calibrationFromJson(c);
        out.supplied = true;
        return out;
    } catch (const Json::exception& e) {
        throw InputError(path, std::string("word_score_calibration: a field is missing or has the wrong type: ") + e.what());
    }
}

ScanReport mergeReports(std::vector<ScanReport> parts, const ScanRules& rules) {
    ScanReport merged;
    std::set<std::string> ids;
    for (auto& part : parts) {
        merged.partial = merged.partial || part.partial;
        merged.takesListed += part.takesListed;
        for (auto& row : part.rows) {
            if (!ids.insert(row.id).second)
                throw InputError("merge", "take '" + row.id + "' appears in more than one part (overlapping shards?)");
            merged.rows.push_back(std::move(row));
        }
    }
    applySetRules(merged, rules);
    rankRows(merged.rows);
    return merged;
}

}  // namespace earmark
