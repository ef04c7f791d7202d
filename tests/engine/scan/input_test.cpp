// Scan input: RFC 4180 CSV reading and writing, manifests (including the demo
// samples/lines.csv), folder listing, and sharding.
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/scan/scan_input.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <set>

namespace earmark {
namespace {

void writeText(const std::filesystem::path& p, const std::string& text) {
    std::ofstream(p, std::ios::binary) << text;
}

TEST(ScanInput, DemoManifestWithExtraColumn) {
    const std::string manifest = std::string(EARMARK_SOURCE_DIR) + "/samples/lines.csv";
    const auto items = listScanInput(manifest);
    ASSERT_EQ(items.size(), 12u);
    EXPECT_EQ(items[0].id, "ferry-001");
    EXPECT_EQ(items[0].index, 0u);
    EXPECT_EQ(items[11].index, 11u);
    EXPECT_TRUE(std::filesystem::exists(items[0].audioPath)) << items[0].audioPath;
    EXPECT_EQ(items[0].text, "Good morning, and welcome aboard the seven fifteen crossing to Wrenholm.");
    EXPECT_TRUE(items[0].timingsPath.empty());
}

TEST(ScanInput, ManifestErrorsNameTheProblem) {
    test::TempDir dir;
    writeText(dir.path() / "no-audio.csv", "id,text\na,hello\n");
    writeText(dir.path() / "dup.csv", "id,audio\na,a.wav\nb,b.wav\na,c.wav\n");
    writeText(dir.path() / "empty-id.csv", "id,audio\n,a.wav\n");
    // Byte-order mark, CRLF, a blank line, upper-case header names, an extra column.
    writeText(dir.path() / "ok.csv", "\xEF\xBB\xBFID,Audio,timings,other\r\nx,sub/x.wav,x.json,1\r\n\r\ny,/abs/y.wav,,2\r\n");
    try {
        listScanInput((dir.path() / "no-audio.csv").string());
        FAIL();
    } catch (const InputError& e) {
        EXPECT_NE(std::string(e.what()).find("'audio'"), std::string::npos) << e.what();
    }
    try {
        listScanInput((dir.path() / "dup.csv").string());
        FAIL();
    } catch (const InputError& e) {
        EXPECT_NE(std::string(e.what()).find("record 4: id 'a' already used in record 2"), std::string::npos) << e.what();
    }
    EXPECT_THROW(listScanInput((dir.path() / "empty-id.csv").string()), InputError);
    EXPECT_THROW(listScanInput((dir.path() / "missing.csv").string()), InputError);
    const auto ok = listScanInput((dir.path() / "ok.csv").string());
    ASSERT_EQ(ok.size(), 2u);
    EXPECT_EQ(ok[0].audioPath, (dir.path() / "sub/x.wav").string());
    EXPECT_EQ(ok[0].timingsPath, (dir.path() / "x.json").string());
    EXPECT_EQ(ok[1].audioPath, "/abs/y.wav");
}

TEST(ScanInput, FolderListsAudioRecursivelySorted) {
    test::TempDir dir;
    std::filesystem::create_directories(dir.path() / "b" / "deep");
    const auto tone = test::sine(220, 0.1, 16000, 0.3);
    for (const char* name : {"b/deep/z.wav", "a.WAV", "b/c.flac", "c.wav"}) writeWav((dir.path() / name).string(), tone);
    writeText(dir.path() / "notes.txt", "not audio");
    const auto items = listScanInput(dir.path().string());
    std::vector<std::string> ids;
    for (const auto& i : items) ids.push_back(i.id);
    EXPECT_EQ(ids, (std::vector<std::string>{"a", "b/c", "b/deep/z", "c"}));
    EXPECT_TRUE(isAudioFileName("x.Opus"));
    EXPECT_FALSE(isAudioFileName("x.txt"));
}

TEST(Shard, PartsAreDisjointCoverEverythingAndIgnoreOrder) {
    std::vector<ScanItem> items;
    for (int i = 0; i < 1000; ++i) {
        ScanItem it;
        it.index = static_cast<std::size_t>(i);
        it.id = "take-" + std::to_string(i);
        items.push_back(it);
    }
    std::set<std::string> seen;
    std::size_t total = 0;
    for (int k = 1; k <= 4; ++k) {
        const auto part = selectShard(items, Shard::parse(std::to_string(k) + "/4"));
        EXPECT_NEAR(static_cast<double>(part.size()), 250.0, 50.0);  // a hash splits evenly
        for (const auto& it : part) EXPECT_TRUE(seen.insert(it.id).second);
        total += part.size();
    }
    EXPECT_EQ(total, items.size());
    auto reversed = items;
    std::reverse(reversed.begin(), reversed.end());
    const Shard s = Shard::parse("3/4");
    for (const auto& it : reversed) EXPECT_EQ(s.holds(it), selectShard({it}, s).size() == 1);
    // FNV-1a 64 test vectors (the published FNV test suite): "" and "a".
    EXPECT_EQ(fnv1a64(""), 0xcbf29ce484222325ull);
    EXPECT_EQ(fnv1a64("a"), 0xaf63dc4c8601ec8cull);
    for (const char* bad : {"0/4", "5/4", "1/0", "x/2", "2", "1/2/3", ""}) EXPECT_THROW(Shard::parse(bad), ParamError) << bad;
}

}  // namespace
}  // namespace earmark
