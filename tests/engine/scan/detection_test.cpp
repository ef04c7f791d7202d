// Detection on takes rendered at run time (espeak-ng + sox): half carry one
// planted fault each, half are clean. Every planted fault must be found under
// its own suspect name, and at most 10 % of the clean takes may be flagged.
#include "earmark/scan/scan_report.hpp"
#include "engine/scan/espeak_takes.hpp"
#include "support/temp_dir.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <fstream>
#include <map>

namespace earmark {
namespace {

using test::RenderSpec;

struct Planted {
    std::string id;
    std::string fault;  // suspect name expected; "" = clean
};

// Renders 21 clean and 21 faulty takes (7 faults × 3) and a manifest.
std::vector<Planted> renderSet(const std::filesystem::path& dir) {
    const auto& lines = test::tramwayLines();
    const char* voices[] = {"en-gb-x-rp", "en-us", "en-gb"};
    const int pitches[] = {40, 50, 60};
    std::vector<Planted> planted;
    std::ofstream manifest(dir / "set.csv", std::ios::binary);
    manifest << "id,audio,text,fault\r\n";
    auto add = [&](const std::string& id, RenderSpec spec, const std::string& fault, const std::string& text) {
        test::renderTake(spec, dir / (id + ".wav"));
        manifest << id << "," << id << ".wav,\"" << text << "\"," << fault << "\r\n";
        planted.push_back({id, fault});
    };
    for (std::size_t i = 0; i < lines.size(); ++i) {
        RenderSpec spec;
        spec.text = lines[i];
        spec.voice = voices[i % 3];
        spec.pitch = pitches[(i / 3) % 3];
        add("clean-" + std::to_string(i + 1), spec, "", lines[i]);
    }
    const char* faults[] = {"flat", "pause-too-long", "rushed", "clipping", "truncation", "loud", "leading-silence"};
    for (int f = 0; f < 7; ++f) {
        for (int k = 0; k < 3; ++k) {
            const std::size_t line = static_cast<std::size_t>(f * 3 + k) % lines.size();
            const std::string& text = lines[(line + 7) % lines.size()];  // a different line than the clean take
            RenderSpec spec;
            spec.text = text;
            spec.voice = voices[k];
            spec.pitch = pitches[(f + k) % 3];
            const std::string fault = faults[f];
            if (fault == "flat") {
                spec.ssml = true;
                spec.text = "<speak><prosody range=\"0%\">" + text + "</prosody></speak>";
            } else if (fault == "pause-too-long") {
                // A 1.5 s break after the fourth word, inside the sentence.
                std::string withBreak;
                int words = 0;
                for (std::size_t c = 0; c < text.size(); ++c) {
                    withBreak.push_back(text[c]);
                    if (text[c] == ' ' && ++words == 4) withBreak += "<break time=\"1500ms\"/> ";
                }
                spec.ssml = true;
                spec.text = "<speak>" + withBreak + "</speak>";
            } else if (fault == "rushed") {
                spec.speedWpm = 340;
            } else if (fault == "clipping") {
                spec.soxEffects = "gain 22";  // −16 dBFS peak + 22 dB: clipped at full scale
            } else if (fault == "truncation") {
                spec.soxEffects = "trim 0 -0.45";  // the 0.25 s pad and 0.2 s of the last word
            } else if (fault == "loud") {
                spec.soxEffects = "gain 12";  // peak −4 dBFS, no clipping
            } else {
                spec.soxEffects = "pad 2.5 0";
            }
            add(fault + "-" + std::to_string(k + 1), spec, fault, text);
        }
    }
    return planted;
}

TEST(Detection, EveryPlantedFaultFoundAndFewCleanTakesFlagged) {
    if (!test::haveSpeechTools()) GTEST_SKIP() << "espeak-ng and sox are needed";
    test::TempDir dir;
    const auto planted = renderSet(dir.path());
    ASSERT_GE(planted.size(), 40u);

    ScanSettings settings;
    settings.jobs = 2;
    const auto items = listScanInput((dir.path() / "set.csv").string());
    ASSERT_EQ(items.size(), planted.size());
    const ScanReport report = makeReport(runScan(items, settings), settings.rules);
    ASSERT_FALSE(report.partial);

    std::map<std::string, const ScanRow*> byId;
    for (const auto& row : report.rows) byId[row.id] = &row;
    // Confusion table: planted fault (row) → suspect names raised.
    std::map<std::string, std::map<std::string, int>> table;
    int cleanFlagged = 0, cleanTotal = 0;
    std::string flaggedClean;
    for (const auto& p : planted) {
        const ScanRow& row = *byId.at(p.id);
        ASSERT_FALSE(row.failed) << p.id << ": " << row.status;
        const std::string rowName = p.fault.empty() ? "clean" : p.fault;
        if (row.suspects.empty()) ++table[rowName]["(none)"];
        for (const auto& s : row.suspects) ++table[rowName][suspectName(s.kind)];
        if (p.fault.empty()) {
            ++cleanTotal;
            if (!row.suspects.empty()) {
                ++cleanFlagged;
                flaggedClean += p.id + " (" + row.suspects[0].reason + ")\n";
            }
        } else {
            const bool found = std::any_of(row.suspects.begin(), row.suspects.end(),
                                           [&](const TakeSuspect& s) { return p.fault == suspectName(s.kind); });
            EXPECT_TRUE(found) << p.id << " planted " << p.fault << " not found; status " << row.status;
        }
    }
    std::string dump;
    for (const auto& [fault, hits] : table) {
        dump += fault + ":";
        for (const auto& [name, n] : hits) dump += " " + name + "=" + std::to_string(n);
        dump += "\n";
    }
    // Margins: the closest clean take to each rate/pitch/pause threshold.
    double cleanRateMax = 0, cleanRangeMin = 1e9, cleanPauseMax = 0, rushedRateMin = 1e9;
    for (const auto& p : planted) {
        const TakeMeasures& m = *byId.at(p.id)->measures;
        if (p.fault.empty()) {
            cleanRateMax = std::max(cleanRateMax, m.articulationSyllablesPerS.value_or(0));
            cleanRangeMin = std::min(cleanRangeMin, m.f0RangeSt.value_or(1e9));
            cleanPauseMax = std::max(cleanPauseMax, m.longestPauseS);
        } else if (p.fault == "rushed") {
            rushedRateMin = std::min(rushedRateMin, m.articulationSyllablesPerS.value_or(0));
        }
    }
    char margins[256];
    std::snprintf(margins, sizeof margins,
                  "clean: max articulation %.2f syl/s, min F0 range %.2f st, longest pause %.2f s; "
                  "rushed: min articulation %.2f syl/s\n",
                  cleanRateMax, cleanRangeMin, cleanPauseMax, rushedRateMin);
    dump += margins;
    RecordProperty("confusion", dump);
    std::printf("confusion table (planted -> suspects raised):\n%s", dump.c_str());
    EXPECT_LE(cleanFlagged * 10, cleanTotal)
        << cleanFlagged << " of " << cleanTotal << " clean takes flagged:\n" << flaggedClean;
}

}  // namespace
}  // namespace earmark
