// Reading timings files: the form follows the extension (and, for .json, the
// content); file errors name the path.
#include "earmark/tiers/timings_csv.hpp"
#include "earmark/tiers/timings_file.hpp"
#include "earmark/tiers/timings_json.hpp"
#include "earmark/tiers/timings_vtt.hpp"
#include "earmark/tiers/token_durations.hpp"
#include "support/temp_dir.hpp"
#include "tier_matchers.hpp"

#include <fstream>

namespace earmark {
namespace {

void writeText(const std::string& path, const std::string& text) {
    std::ofstream(path, std::ios::binary) << text;
}

TEST(TimingsFile, PicksTheReaderByExtensionAndContent) {
    test::TempDir dir;
    const TierSet set = test::sampleTierSet(true);
    writeText(dir.file("a.json"), timingsToJson(set));
    writeText(dir.file("a.CSV"), timingsToCsv(set));
    writeText(dir.file("a.vtt"), tierToVtt(set.tiers[0]));
    writeText(dir.file("d.json"), tierToTokenDurations(set.tiers[1], TokenDurationsParams{}));

    test::expectSameTiers(set, loadTimings(dir.file("a.json")).tiers);
    test::expectSameTiers(set, loadTimings(dir.file("a.CSV")).tiers);
    EXPECT_EQ(loadTimings(dir.file("a.vtt")).tiers.tiers.at(0).intervals.size(), set.tiers[0].intervals.size());
    const LoadedTimings d = loadTimings(dir.file("d.json"));
    ASSERT_EQ(d.tiers.tiers.size(), 1u);
    EXPECT_EQ(d.tiers.tiers[0].name, "phones");
    EXPECT_EQ(d.tiers.tiers[0].intervals.size(), 3u);
}

TEST(TimingsFile, FileProblemsNameThePath) {
    test::TempDir dir;
    test::expectRowError([&] { loadTimings(dir.file("missing.json")); }, dir.file("missing.json"), "no such file", "");
    writeText(dir.file("a.txt"), "0,1,a\n");
    test::expectRowError([&] { loadTimings(dir.file("a.txt")); }, dir.file("a.txt"), "unknown timings file type", "");
    EXPECT_NO_THROW(loadTimings(dir.file("a.txt"), {}, TimingsFormat::Csv));
    test::expectRowError([&] { loadTimings(dir.path().string() + "/"); }, dir.path().string() + "/", "", "");
}

}  // namespace
}  // namespace earmark
