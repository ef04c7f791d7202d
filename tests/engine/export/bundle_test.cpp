// Example bundles: clip lengths, rates and content, fades, manifests, the
// image callback, and never replacing a folder by surprise.
#include "earmark/export/bundle.hpp"

#include "earmark/core/error.hpp"
#include "engine/export/json_schema_subset.hpp"
#include "engine/store/store_test_util.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <numbers>
#include <sstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;
using ::testing::HasSubstr;
using ::testing::IsEmpty;
using test::draftAt;
using test::slurp;
using test::TempDir;

struct BundleFixture {
    TempDir dir;
    Session session = Session::create(dir.file("b.earmark"));
    Signal noise16 = test::whiteNoise(2.0, 16000, 0.2, 1);
    Signal noise22 = test::whiteNoise(3.0, 22050, 0.2, 2);
    TakeId a = 0, b = 0;
    BundleFixture() {
        writeWav(dir.file("a.wav"), noise16);
        writeWav(dir.file("b.wav"), noise22);
        // Reload: the bundle cuts from the file as stored (16-bit), not from these floats.
        noise16 = loadAudio(dir.file("a.wav")).signal;
        noise22 = loadAudio(dir.file("b.wav")).signal;
        const auto ids = session.addTakes({{dir.file("a.wav"), "take-a", "", ""}, {dir.file("b.wav"), "", "", ""}});
        a = ids[0], b = ids[1];
        session.addMark(a, draftAt(0.8, 1.2));                                       // middle: full padding
        session.addMark(a, draftAt(0.1, 0.4, MarkCategory::Artifact, "click"));      // clamped at the start
        session.addMark(b, draftAt(2.9, 3.0, MarkCategory::Artifact, "truncation")); // clamped at the end
    }
};

TEST(Bundle, ClipsHaveTheSpanPlusPaddingAtTheSourceRate) {
    BundleFixture f;
    const std::string out = f.dir.file("bundle");
    const BundleResult r = writeBundle(f.session, out);
    EXPECT_EQ(r.clips, 3);
    const auto manifest = nlohmann::json::parse(slurp(fs::path(out) / "manifest.json"));
    ASSERT_EQ(manifest["marks"].size(), 3u);

    struct Expect {
        double rate, start, end;
        const Signal* source;
    };
    // span ± 0.3 s, clamped to the take: [0.5, 1.5], [0, 0.7] of a 2 s take; [2.6, 3.0] of a 3 s take.
    const Expect expected[] = {{16000, 0.0, 0.7, &f.noise16}, {16000, 0.5, 1.5, &f.noise16},
                               {22050, 2.6, 3.0, &f.noise22}};
    for (std::size_t i = 0; i < 3; ++i) {
        const auto& clipInfo = manifest["marks"][i]["clip"];
        const LoadedAudio clip = loadAudio((fs::path(out) / clipInfo["file"].get<std::string>()).string());
        const Expect& e = expected[i];
        EXPECT_EQ(clip.info.sampleRate, e.rate) << i;
        const auto frames = static_cast<std::size_t>(std::lround((e.end - e.start) * e.rate));
        EXPECT_EQ(clip.signal.size(), frames) << i;
        EXPECT_EQ(clipInfo["frames"], frames);
        EXPECT_NEAR(clipInfo["start_s"].get<double>(), e.start, 1e-9);
        EXPECT_NEAR(clipInfo["end_s"].get<double>(), e.end, 1e-9);
        EXPECT_NEAR(clipInfo["mark_offset_s"].get<double>(),
                    manifest["marks"][i]["start_s"].get<double>() - e.start, 1e-9);
        // Past the fades, the clip is the take's own samples (16-bit both ways).
        const auto first = static_cast<std::size_t>(std::lround(e.start * e.rate));
        const std::size_t fade = static_cast<std::size_t>(std::lround(0.01 * e.rate));
        double worst = 0;
        for (std::size_t k = fade; k + fade < clip.signal.size(); ++k)
            worst = std::max(worst, std::abs(double(clip.signal.samples[k]) - e.source->samples[first + k]));
        EXPECT_LE(worst, 2.0 / 32768) << i;
    }
}

TEST(Bundle, FadeIsARaisedCosineOverTenMilliseconds) {
    Signal take;
    take.sampleRate = 1000;
    take.samples.assign(1000, 1.0f);
    double start = 0, end = 0;
    const Signal clip = cutClip(take, 0.4, 0.6, 0.1, 0.01, &start, &end);
    EXPECT_EQ(start, 0.3);
    EXPECT_EQ(end, 0.7);
    ASSERT_EQ(clip.size(), 400u);
    for (std::size_t i = 0; i < 10; ++i) {
        const double g = std::pow(std::sin(0.5 * std::numbers::pi * (i + 0.5) / 10.0), 2.0);
        EXPECT_NEAR(clip.samples[i], g, 1e-6);
        EXPECT_NEAR(clip.samples[clip.size() - 1 - i], g, 1e-6);
    }
    EXPECT_EQ(clip.samples[10], 1.0f);
    EXPECT_EQ(clip.samples[389], 1.0f);
    // Gains rise monotonically from near 0 to near 1 with no step.
    EXPECT_LT(clip.samples[0], 0.03f);
    EXPECT_GT(clip.samples[9], 0.97f);
    // A clip shorter than two fades fades over half its length.
    const Signal tiny = cutClip(take, 0.5, 0.504, 0.0, 0.01);
    ASSERT_EQ(tiny.size(), 4u);
    EXPECT_NEAR(tiny.samples[1], tiny.samples[2], 1e-6);
}

TEST(Bundle, ManifestsMatchTheSchemaAndEachOther) {
    BundleFixture f;
    const std::string out = f.dir.file("bundle");
    writeBundle(f.session, out);
    const auto schema = test::SchemaSubset(
        nlohmann::json::parse(slurp(std::string(EARMARK_SOURCE_DIR) + "/docs/defect-list.schema.json")));
    const auto manifest = nlohmann::json::parse(slurp(fs::path(out) / "manifest.json"));
    EXPECT_THAT(schema.validate(manifest), IsEmpty());
    EXPECT_EQ(manifest["format"], "earmark-bundle");
    EXPECT_EQ(manifest["pad_s"], 0.3);
    EXPECT_TRUE(manifest["marks"][0]["clip"]["image"].is_null());
    const std::string csv = slurp(fs::path(out) / "manifest.csv");
    EXPECT_THAT(csv, HasSubstr(",clip_file,clip_start_s,clip_end_s,image_file\r\n"));
    for (const auto& m : manifest["marks"]) EXPECT_THAT(csv, HasSubstr("," + m["clip"]["file"].get<std::string>() + ","));
    EXPECT_EQ(manifest["marks"][0]["clip"]["file"], "clips/mark-0002_take-a_artifact-click.wav");
    EXPECT_EQ(manifest["marks"][2]["clip"]["file"], "clips/mark-0003_b_artifact-truncation.wav");
}

TEST(Bundle, ImageRendererGetsEachClipSpan) {
    BundleFixture f;
    std::vector<std::pair<double, double>> spans;
    const BundleImageRenderer render = [&](const BundleImageRequest& req) {
        spans.emplace_back(req.clipStartSeconds, req.clipEndSeconds);
        EXPECT_EQ(req.audio.sampleRate, req.take.sampleRate);
        if (req.mark.category == MarkCategory::Artifact) std::ofstream(req.pngPath) << "png";  // draws some only
    };
    const BundleResult r = writeBundle(f.session, f.dir.file("bundle"), {}, render);
    ASSERT_EQ(spans.size(), 3u);
    EXPECT_NEAR(spans[1].first, 0.5, 1e-9);
    EXPECT_NEAR(spans[1].second, 1.5, 1e-9);
    EXPECT_EQ(r.images, 2);
    const auto manifest = nlohmann::json::parse(slurp(fs::path(f.dir.file("bundle")) / "manifest.json"));
    EXPECT_EQ(manifest["marks"][0]["clip"]["image"], "images/mark-0002_take-a_artifact-click.png");
    EXPECT_TRUE(manifest["marks"][1]["clip"]["image"].is_null());
    EXPECT_TRUE(fs::exists(fs::path(f.dir.file("bundle")) / "images/mark-0002_take-a_artifact-click.png"));
}

TEST(Bundle, NeverReplacesAFolderBySurprise) {
    BundleFixture f;
    const fs::path out = f.dir.file("bundle");
    writeBundle(f.session, out.string());
    const std::string first = slurp(out / "manifest.json");
    try {
        writeBundle(f.session, out.string());
        FAIL() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_THAT(e.what(), HasSubstr("already exists and is not empty"));
    }
    EXPECT_EQ(slurp(out / "manifest.json"), first);

    // Allowed to replace: an earlier bundle is replaced whole (a stray file goes too).
    std::ofstream(out / "clips/stray.wav") << "x";
    f.session.deleteMark(1);
    BundleParams replace;
    replace.replaceExisting = true;
    EXPECT_EQ(writeBundle(f.session, out.string(), replace).clips, 2);
    EXPECT_FALSE(fs::exists(out / "clips/stray.wav"));

    // Never an unrelated folder, even when replacing is allowed.
    const fs::path mine = f.dir.file("my documents");
    fs::create_directories(mine);
    std::ofstream(mine / "thesis.txt") << "precious";
    try {
        writeBundle(f.session, mine.string(), replace);
        FAIL() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_THAT(e.what(), HasSubstr("is not an Earmark bundle"));
    }
    EXPECT_EQ(slurp(mine / "thesis.txt"), "precious");
    // An empty folder is fine to fill.
    fs::create_directories(f.dir.file("empty"));
    EXPECT_EQ(writeBundle(f.session, f.dir.file("empty") + "/").clips, 2);
    // No staging folders are left behind.
    for (const auto& entry : fs::directory_iterator(f.dir.path()))
        EXPECT_EQ(entry.path().filename().string().find(".partial-"), std::string::npos);
}

TEST(Bundle, MissingAudioOrCancelLeavesNothing) {
    BundleFixture f;
    fs::rename(f.dir.file("b.wav"), f.dir.file("moved.wav"));
    try {
        writeBundle(f.session, f.dir.file("bundle"));
        FAIL() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_THAT(e.what(), HasSubstr("b.wav: audio of take 2 is missing"));
    }
    EXPECT_FALSE(fs::exists(f.dir.file("bundle")));
    fs::rename(f.dir.file("moved.wav"), f.dir.file("b.wav"));

    int calls = 0;
    const Progress stopHalfWay([&](double fraction) { return ++calls < 3 && fraction < 0.5; });
    EXPECT_THROW(writeBundle(f.session, f.dir.file("bundle"), {}, {}, stopHalfWay), Cancelled);
    EXPECT_FALSE(fs::exists(f.dir.file("bundle")));
    std::size_t entries = 0;
    for (const auto& entry : fs::directory_iterator(f.dir.path())) entries += entry.is_directory() ? 1 : 0;
    EXPECT_EQ(entries, 0u);  // no staging folder either
}

TEST(Bundle, ParamsAreChecked) {
    BundleParams p;
    p.padSeconds = -0.1;
    EXPECT_THROW(p.validate(), ParamError);
    p.padSeconds = 0.3;
    p.fadeSeconds = std::nan("");
    EXPECT_THROW(p.validate(), ParamError);
}

}  // namespace
}  // namespace earmark
