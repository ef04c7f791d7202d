// Defect lists: CSV read back by Python's csv module (RFC 4180 reference
// outside this project), JSON checked against docs/defect-list.schema.json.
#include "earmark/export/defect_list.hpp"

#include "engine/export/json_schema_subset.hpp"
#include "engine/store/store_test_util.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>

namespace earmark {
namespace {

using ::testing::ElementsAre;
using ::testing::IsEmpty;
using test::draftAt;
using test::slurp;
using test::TempDir;
using test::writeTake;

test::SchemaSubset loadSchema() {
    return test::SchemaSubset(
        nlohmann::json::parse(slurp(std::string(EARMARK_SOURCE_DIR) + "/docs/defect-list.schema.json")));
}

struct DefectListFixture {
    TempDir dir;
    Session session = Session::create(dir.file("list.earmark"));
    TakeId a = 0, b = 0;
    MarkId m1 = 0, m2 = 0, m3 = 0;
    DefectListFixture() {
        const auto ids = session.addTakes({{writeTake(dir.file("a.wav"), 2.0), "line-a", "Mind the gap, please.", "v2"},
                                           {writeTake(dir.file("b b.wav"), 3.0), "", "", ""}});
        a = ids[0], b = ids[1];
        session.setTiers(a, {{"words", 0.2, 0.5, "Mind"}, {"words", 0.5, 0.7, "the"}, {"words", 0.7, 1.1, "gap,"},
                             {"words", 1.1, 1.6, "please."}});
        MarkDraft d1 = draftAt(0.45, 1.2, MarkCategory::Emphasis, "misplaced");
        d1.note = "stress on \"the\", not on gap";
        d1.rater = "Zoë";
        d1.measures = {{"duration_s", 0.75}, {"f0_mean_hz", 131.25}};
        m1 = session.addMark(a, d1).markId();
        MarkDraft d2 = draftAt(1.2, 1.6, MarkCategory::Other, "");
        d2.note = "two lines:\nsecond, with comma";
        d2.measures = {{"duration_s", 0.4}, {"pause_s", 0.1}};
        m2 = session.addMark(a, d2).markId();
        MarkDraft d3 = draftAt(0.1, 2.9, MarkCategory::Artifact, "buzz");
        d3.note = " leading space";
        d3.severity = Severity::Blocker;
        d3.measures = {};
        m3 = session.addMark(b, d3).markId();
    }
};

// Parses CSV with Python's csv module and returns the records as JSON.
nlohmann::json parseWithPython(const TempDir& dir, const std::string& csvText) {
    std::ofstream(dir.file("in.csv"), std::ios::binary) << csvText;
    std::ofstream(dir.file("read.py")) << "import csv, json, sys\n"
                                          "with open(sys.argv[1], newline='', encoding='utf-8') as f:\n"
                                          "    rows = list(csv.reader(f, strict=True))\n"
                                          "json.dump(rows, open(sys.argv[2], 'w', encoding='utf-8'))\n";
    const std::string cmd = "/usr/bin/python3 '" + dir.file("read.py") + "' '" + dir.file("in.csv") + "' '" +
                            dir.file("rows.json") + "'";
    if (std::system(cmd.c_str()) != 0) return nullptr;
    return nlohmann::json::parse(slurp(dir.file("rows.json")));
}

TEST(DefectList, CsvReadsBackFieldForFieldInPython) {
    DefectListFixture f;
    const DefectList list = collectDefects(f.session);
    const std::string csv = defectListToCsv(list);
    const auto rows = parseWithPython(f.dir, csv);
    ASSERT_TRUE(rows.is_array()) << "needs /usr/bin/python3";
    ASSERT_EQ(rows.size(), 4u);
    const auto& header = rows[0];
    EXPECT_EQ(header.size(), 17u + 3u);  // fixed columns + the union of measure names
    EXPECT_EQ(header[0], "mark_id");
    EXPECT_EQ(header[17], "measure.duration_s");
    EXPECT_EQ(header[18], "measure.f0_mean_hz");
    EXPECT_EQ(header[19], "measure.pause_s");
    auto field = [&](std::size_t row, const std::string& name) {
        for (std::size_t i = 0; i < header.size(); ++i)
            if (header[i] == name) return rows[row][i].get<std::string>();
        return std::string("<no column>");
    };
    EXPECT_EQ(field(1, "mark_id"), std::to_string(f.m1));
    EXPECT_EQ(field(1, "line_id"), "line-a");
    EXPECT_EQ(field(1, "text"), "Mind the gap, please.");
    EXPECT_EQ(field(1, "start_s"), "0.45");
    EXPECT_EQ(field(1, "end_s"), "1.2");
    EXPECT_EQ(field(1, "words"), "the gap,");
    EXPECT_EQ(field(1, "category"), "emphasis");
    EXPECT_EQ(field(1, "subtype"), "misplaced");
    EXPECT_EQ(field(1, "note"), "stress on \"the\", not on gap");
    EXPECT_EQ(field(1, "rater"), "Zoë");
    EXPECT_EQ(field(1, "measure.f0_mean_hz"), "131.25");
    EXPECT_EQ(field(1, "measure.pause_s"), "");
    EXPECT_EQ(field(2, "note"), "two lines:\nsecond, with comma");
    EXPECT_EQ(field(2, "words"), "please.");
    EXPECT_EQ(field(2, "subtype"), "");
    EXPECT_EQ(field(3, "audio"), "b b.wav");
    EXPECT_EQ(field(3, "note"), " leading space");
    EXPECT_EQ(field(3, "severity"), "blocker");
    EXPECT_EQ(field(3, "measure.duration_s"), "");
    // RFC 4180: every record ends in CRLF; the LF inside the quoted note is data.
    std::size_t crlf = 0, pos = 0;
    while ((pos = csv.find("\r\n", pos)) != std::string::npos) ++crlf, pos += 2;
    EXPECT_EQ(crlf, 4u);
    EXPECT_EQ(csv.substr(csv.size() - 2), "\r\n");
}

TEST(DefectList, JsonConformsToTheCommittedSchema) {
    DefectListFixture f;
    const auto schema = loadSchema();
    EXPECT_THAT(schema.unknownKeywords(), IsEmpty());  // the validator checks every keyword the schema uses
    const auto doc = nlohmann::json::parse(defectListToJson(collectDefects(f.session)));
    EXPECT_THAT(schema.validate(doc), IsEmpty());
    EXPECT_EQ(doc["format"], "earmark-defect-list");
    EXPECT_EQ(doc["session"], "list.earmark");
    EXPECT_THAT(doc["measure_names"], ElementsAre("duration_s", "f0_mean_hz", "pause_s"));
    const auto& m = doc["marks"][0];
    EXPECT_EQ(m["mark_id"], f.m1);
    EXPECT_EQ(m["start_s"], 0.45);
    EXPECT_EQ(m["end_s"], 1.2);
    EXPECT_EQ(m["words"], "the gap,");
    EXPECT_EQ(m["measures"]["f0_mean_hz"], 131.25);
    EXPECT_TRUE(doc["marks"][2]["measures"].empty());
}

TEST(DefectList, SchemaCheckRejectsBrokenDocuments) {
    DefectListFixture f;
    const auto schema = loadSchema();
    const auto good = nlohmann::json::parse(defectListToJson(collectDefects(f.session)));
    auto broken = [&](auto&& change) {
        auto doc = good;
        change(doc);
        return schema.validate(doc).size();
    };
    EXPECT_GT(broken([](auto& d) { d["marks"][0].erase("severity"); }), 0u);
    EXPECT_GT(broken([](auto& d) { d["marks"][0]["category"] = "tone"; }), 0u);
    EXPECT_GT(broken([](auto& d) { d["marks"][0]["measures"]["f0_mean_hz"] = "high"; }), 0u);
    EXPECT_GT(broken([](auto& d) { d["marks"][0]["measures"]["F0 Mean"] = 1.0; }), 0u);
    EXPECT_GT(broken([](auto& d) { d["marks"][0]["created_utc"] = "yesterday"; }), 0u);
    EXPECT_GT(broken([](auto& d) { d["marks"][1]["start_s"] = -1; }), 0u);
    EXPECT_GT(broken([](auto& d) { d["version"] = 2; }), 0u);
    EXPECT_GT(broken([](auto& d) { d["extra"] = true; }), 0u);
}

TEST(DefectList, OneTakeOnlyAndEmptySessions) {
    DefectListFixture f;
    const DefectList onlyB = collectDefects(f.session, f.b);
    ASSERT_EQ(onlyB.rows.size(), 1u);
    EXPECT_EQ(onlyB.rows[0].mark.id, f.m3);
    TempDir dir;
    const Session empty = Session::create(dir.file("e.earmark"));
    const DefectList none = collectDefects(empty);
    EXPECT_EQ(defectListToCsv(none).find("\r\n"), defectListToCsv(none).size() - 2);  // header only
    EXPECT_THAT(loadSchema().validate(nlohmann::json::parse(defectListToJson(none))), IsEmpty());
}

TEST(DefectList, NumbersReadBackExactly) {
    std::mt19937_64 rng(3);
    std::uniform_real_distribution<double> any(-1e6, 1e6);
    for (int i = 0; i < 10000; ++i) {
        const double x = any(rng) * std::pow(10.0, static_cast<int>(rng() % 40) - 20);
        EXPECT_EQ(std::strtod(formatNumber(x).c_str(), nullptr), x);
    }
    EXPECT_EQ(formatNumber(0.1), "0.1");
    EXPECT_EQ(formatNumber(2.0), "2");
}

TEST(DefectList, CsvFieldQuoting) {
    EXPECT_EQ(csvField("plain"), "plain");
    EXPECT_EQ(csvField("a,b"), "\"a,b\"");
    EXPECT_EQ(csvField("say \"hi\""), "\"say \"\"hi\"\"\"");
    EXPECT_EQ(csvField("x\ny"), "\"x\ny\"");
    EXPECT_EQ(csvField(""), "");
    EXPECT_EQ(csvRecord({"a", "b c", ""}), "a,b c,\r\n");
}

}  // namespace
}  // namespace earmark
