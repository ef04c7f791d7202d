// earmark-cli export --bundle: one PNG of the lanes per mark, of the size
// asked for, named in both manifests — when earmark-cli is built with the
// window (EARMARK_WITH_GUI). Built without it, the bundle has no pictures and
// its manifest says why.
#include "run_cli.hpp"

#include "earmark/io/audio_file.hpp"
#include "earmark/store/session.hpp"
#include "engine/export/json_schema_subset.hpp"
#include "engine/store/store_test_util.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#ifdef EARMARK_WITH_GUI
#include <QImage>
#endif

#include <filesystem>
#include <fstream>
#include <sstream>

namespace earmark {
namespace {

using test::slurp;

namespace fs = std::filesystem;
using test::runCli;
using ::testing::HasSubstr;
using ::testing::IsEmpty;
using K = test::VoiceSegment::Kind;

// Two takes (one with a word tier), three marks.
struct BundleScenario {
    test::TempDir dir;
    std::string session = dir.file("pictures.earmark");
    BundleScenario() {
        const auto v = test::synthesiseVoice(
            {{K::Silence, 0.3, 0, 0, 0}, {K::Voiced, 1.2, 140, 180, 0.3}, {K::Silence, 0.3, 0, 0, 0}}, 22050);
        writeWav(dir.file("one.wav"), v.signal);
        writeWav(dir.file("two.wav"), test::sine(200, 1.5, 16000, 0.2));
        Session s = Session::create(session);
        const auto ids =
            s.addTakes({{dir.file("one.wav"), "one", "all aboard now", "b1"}, {dir.file("two.wav"), "two", "", "b1"}});
        s.setTiers(ids[0], {{"words", 0.3, 0.7, "all"}, {"words", 0.7, 1.1, "aboard"}, {"words", 1.1, 1.5, "now"}});
        s.addMark(ids[0], test::draftAt(0.7, 1.1, MarkCategory::Emphasis, "missing"));
        s.addMark(ids[0], test::draftAt(1.2, 1.5, MarkCategory::Intonation, "flat"));
        s.addMark(ids[1], test::draftAt(0.1, 0.3, MarkCategory::Artifact, "click"));
    }
};

const test::SchemaSubset& schema() {
    static const test::SchemaSubset s(
        nlohmann::json::parse(slurp(std::string(EARMARK_SOURCE_DIR) + "/docs/defect-list.schema.json")));
    return s;
}

#ifdef EARMARK_WITH_GUI

// Every mark's picture: in images/, a PNG Qt can read, of the size asked for,
// and the manifests give its name and size.
void expectPictures(const fs::path& bundle, int width, int height) {
    const auto manifest = nlohmann::json::parse(slurp(bundle / "manifest.json"));
    EXPECT_THAT(schema().validate(manifest), IsEmpty());
    EXPECT_EQ(manifest["images"]["drawn"], true);
    EXPECT_EQ(manifest["images"]["width_px"], width);
    EXPECT_EQ(manifest["images"]["height_px"], height);
    ASSERT_EQ(manifest["marks"].size(), 3u);
    const std::string csv = slurp(bundle / "manifest.csv");
    std::size_t files = 0;
    for (const auto& entry : fs::directory_iterator(bundle / "images")) files += entry.is_regular_file();
    EXPECT_EQ(files, 3u);
    for (const auto& mark : manifest["marks"]) {
        const auto& clip = mark["clip"];
        ASSERT_TRUE(clip["image"].is_string()) << clip.dump();
        const std::string file = clip["image"];
        EXPECT_THAT(file, HasSubstr(fs::path(clip["file"].get<std::string>()).stem().string() + ".png"));
        EXPECT_THAT(csv, HasSubstr("," + file + "\r\n"));
        const QImage image(QString::fromStdString((bundle / file).string()), "PNG");
        ASSERT_FALSE(image.isNull()) << file;
        EXPECT_EQ(image.width(), width) << file;
        EXPECT_EQ(image.height(), height) << file;
        EXPECT_EQ(clip["image_width_px"], width);
        EXPECT_EQ(clip["image_height_px"], height);
    }
}

TEST(BundleImages, OnePngPerMarkOfTheRequestedSize) {
    BundleScenario s;
    const fs::path bundle = s.dir.path() / "bundle";
    const auto r = runCli({"export", s.session, "--bundle", bundle.string(), "--image-size", "960x540"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_THAT(r.err, HasSubstr("wrote 3 clip(s) and 3 picture(s)"));
    expectPictures(bundle, 960, 540);
    // Default size, replacing the earlier bundle.
    const auto again = runCli({"export", s.session, "--bundle", bundle.string(), "--force"});
    ASSERT_EQ(again.exitCode, 0) << again.err;
    expectPictures(bundle, 1200, 700);
}

#else

TEST(BundleImages, WithoutTheWindowTheManifestSaysThereAreNoPictures) {
    BundleScenario s;
    const fs::path bundle = s.dir.path() / "bundle";
    const auto r = runCli({"export", s.session, "--bundle", bundle.string(), "--image-size", "960x540"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_THAT(r.err, HasSubstr("wrote 3 clip(s) and 0 picture(s)"));
    const auto manifest = nlohmann::json::parse(slurp(bundle / "manifest.json"));
    EXPECT_THAT(schema().validate(manifest), IsEmpty());
    EXPECT_EQ(manifest["images"]["drawn"], false);
    EXPECT_THAT(manifest["images"]["reason"].get<std::string>(), HasSubstr("EARMARK_BUILD_GUI=OFF"));
    for (const auto& mark : manifest["marks"]) EXPECT_TRUE(mark["clip"]["image"].is_null());
    EXPECT_FALSE(fs::exists(bundle / "images"));
}

#endif

TEST(BundleImages, BadImageSizesAreRefused) {
    BundleScenario s;
    const fs::path bundle = s.dir.path() / "bundle";
    for (const char* size : {"wide", "1200", "1200x", "100x100", "1200x9000"}) {
        const auto r = runCli({"export", s.session, "--bundle", bundle.string(), "--image-size", size});
        EXPECT_EQ(r.exitCode, 2) << size;
        EXPECT_THAT(r.err, HasSubstr("--image-size")) << size;
        EXPECT_FALSE(fs::exists(bundle)) << size;
    }
}

}  // namespace
}  // namespace earmark
