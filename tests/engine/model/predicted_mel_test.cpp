// Predicted mel spectrograms: reading (layouts, dtypes, sidecars, log
// bases) and the difference from Earmark's mel of the audio.
//
// Outside checks: numpy's own mel of tests/data/mel/signal.npy (written by
// tests/data/model/make_model_data.py from the published mel formulas, as
// the spectral tests use) stands in for a model's prediction, stored as
// float16, float32 and float64 in both layouts, one copy with a planted
// +12 dB patch whose place the script wrote down.
#include "earmark/core/error.hpp"
#include "earmark/export/mel_npy.hpp"
#include "earmark/export/npy.hpp"
#include "earmark/model/array_layout.hpp"
#include "earmark/model/mel_difference.hpp"
#include "engine/model/model_data.hpp"
#include "support/temp_dir.hpp"
#include "support/test_signals.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>

namespace earmark {
namespace {

using ::testing::HasSubstr;

Signal referenceSignal() {
    const NpyArray a = readNpy(std::string(EARMARK_TEST_DATA_DIR) + "/mel/signal.npy");
    return Signal{a.data, 22050.0};
}

bool anyContains(const std::vector<std::string>& lines, const std::string& part) {
    for (const auto& l : lines)
        if (l.find(part) != std::string::npos) return true;
    return false;
}

// Largest |difference| outside frames f0…f1 × bands b0…b1 (predicted frame indices).
double worstOutside(const MelDifference& d, int f0, int f1, int b0, int b1) {
    double worst = 0.0;
    for (int i = 0; i < d.difference.frames; ++i)
        for (int b = 0; b < d.difference.bins; ++b) {
            const int f = i + d.firstFrame;
            if (f >= f0 && f <= f1 && b >= b0 && b <= b1) continue;
            worst = std::max(worst, std::abs(static_cast<double>(d.difference.at(i, b))));
        }
    return worst;
}

TEST(PredictedMel, EarmarksOwnMelGivesNoDifferenceInEitherLayout) {
    test::TempDir dir;
    const Signal s = test::speechLike(1.5, 22050);
    const MelParams params;
    const Spectrogram mel = computeMelSpectrogram(s, params);

    // Bands × frames with Earmark's sidecar.
    const std::string own = dir.file("own.npy");
    writeMelNpy(own, mel, params);
    const PredictedMel p = readPredictedMel(own);
    EXPECT_EQ(p.layout, MelLayout::BandsByFrames);
    EXPECT_EQ(p.layoutFrom, "sidecar");
    EXPECT_TRUE(p.assumed.empty());
    const MelDifference d = diffPredictedMel(p, s);
    EXPECT_EQ(d.comparedFrames, mel.frames);
    EXPECT_LT(d.maxAbsDb, 1e-4);
    EXPECT_TRUE(d.warnings.empty()) << d.warnings.front();
    EXPECT_TRUE(d.regions.empty());

    // Frames × bands, no sidecar: the layout is read off the band count, the
    // settings are assumed (and are the defaults the mel was made with).
    std::vector<float> frameMajor = mel.values;
    const std::string flipped = dir.file("flipped.npy");
    writeNpyFloat32(flipped, frameMajor, {mel.frames, mel.bins});
    const PredictedMel q = readPredictedMel(flipped);
    EXPECT_EQ(q.layout, MelLayout::FramesByBands);
    EXPECT_EQ(q.layoutFrom, "band count");
    EXPECT_FALSE(q.assumed.empty());
    const MelDifference e = diffPredictedMel(q, s);
    EXPECT_LT(e.maxAbsDb, 1e-4);
    EXPECT_TRUE(anyContains(e.warnings, "assumed hop_size 256"));
    RecordProperty("max_abs_db_bands_frames", std::to_string(d.maxAbsDb));
    RecordProperty("max_abs_db_frames_bands", std::to_string(e.maxAbsDb));
}

TEST(PredictedMel, PlantedDistortionInANumpyMelIsFoundAtItsFramesAndBands) {
    const auto ref = test::modelReference()["predicted_mel"];
    const auto planted = ref["planted"];
    const PredictedMel p = readPredictedMel(test::modelDataPath(ref["planted_file"]));
    EXPECT_EQ(p.dtype, "<f8");
    EXPECT_EQ(p.layout, MelLayout::FramesByBands);
    EXPECT_EQ(p.layoutFrom, "sidecar");
    const MelDifference d = diffPredictedMel(p, referenceSignal());
    ASSERT_FALSE(d.regions.empty());
    const MelDifferenceRegion& r = d.regions.front();
    EXPECT_EQ(r.firstFrame, planted["first_frame"].get<int>());
    EXPECT_EQ(r.lastFrame, planted["last_frame"].get<int>());
    EXPECT_EQ(r.firstBand, planted["first_band"].get<int>());
    EXPECT_EQ(r.lastBand, planted["last_band"].get<int>());
    EXPECT_EQ(r.cells, 100);
    EXPECT_NEAR(r.meanDb, planted["db"].get<double>(), 0.01);
    EXPECT_NEAR(r.startS, 30 * 256 / 22050.0, 1e-9);
    EXPECT_EQ(d.regions.size(), 1u);  // nothing else reaches 6 dB
    // Elsewhere numpy's float64 mel and Earmark's agree (the spectral tests
    // bound ln magnitudes within 5e-4, i.e. 0.0043 dB).
    EXPECT_LT(worstOutside(d, 30, 39, 20, 29), 0.005);
    EXPECT_TRUE(d.warnings.empty()) << d.warnings.front();
    RecordProperty("worst_outside_patch_db", std::to_string(worstOutside(d, 30, 39, 20, 29)));
    RecordProperty("patch_mean_db", std::to_string(r.meanDb));
}

TEST(PredictedMel, Float16AndLog10FilesReadTheSame) {
    const auto ref = test::modelReference()["predicted_mel"];
    const Signal s = referenceSignal();
    const PredictedMel h = readPredictedMel(test::modelDataPath(ref["f16_bands_frames"]));
    EXPECT_EQ(h.dtype, "<f2");
    EXPECT_EQ(h.layout, MelLayout::BandsByFrames);
    EXPECT_EQ(h.mel.frames, 87);
    // float16 keeps 11 bits: ln values of magnitude ≤ 16 round by ≤ 2^-7 → ≤ 0.034 dB.
    EXPECT_LT(diffPredictedMel(h, s).maxAbsDb, 0.04);
    const PredictedMel t = readPredictedMel(test::modelDataPath(ref["log10_bands_frames"]));
    EXPECT_EQ(t.settings.log, MelLogBase::Log10);
    EXPECT_EQ(t.mel.log, LogScale::Natural);  // converted on reading
    EXPECT_LT(diffPredictedMel(t, s).maxAbsDb, 0.005);
}

TEST(PredictedMel, VocoderPaddedFramesAreMatchedByTime) {
    // numpy's mel with (fft − hop)/2 reflect padding and no centring (tests/data/mel, 86 frames × 80 bands).
    const std::string path = std::string(EARMARK_TEST_DATA_DIR) + "/mel/melspec_tts_vocoder.npy";
    PredictedMelOptions o;
    o.settings.alignment = FrameAlignment::VocoderPadded;
    const PredictedMel p = readPredictedMel(path, o);
    EXPECT_EQ(p.mel.frames, 86);
    EXPECT_DOUBLE_EQ(p.mel.frameTime(0), 128 / 22050.0);  // starts at sample −384, centred 512 samples later
    const MelDifference d = diffPredictedMel(p, referenceSignal());
    EXPECT_EQ(d.comparedFrames, 86);
    EXPECT_LT(d.maxAbsDb, 0.005);
    // Against Earmark's centred frames: matched by nearest time, and said so.
    const MelParams centred;
    const Spectrogram computed = computeMelSpectrogram(referenceSignal(), centred);
    const MelDifference m = compareMels(p, computed, melSettingsOf(centred, 22050));
    EXPECT_TRUE(anyContains(m.warnings, "frame alignment differs"));
    EXPECT_GT(m.maxAbsDb, 1.0);  // half a hop apart: the chirp moves between them
}

TEST(PredictedMel, ASquareArrayAsksForTheLayout) {
    const auto ref = test::modelReference()["predicted_mel"];
    const std::string path = test::modelDataPath(ref["square"]);
    try {
        readPredictedMel(path);
        ADD_FAILURE() << "expected AmbiguousLayout";
    } catch (const AmbiguousLayout& e) {
        EXPECT_EQ(e.subject(), path);
        EXPECT_THAT(e.problem(), HasSubstr("(80, 80)"));
        EXPECT_THAT(e.problem(), HasSubstr("bands × frames or frames × bands"));
    }
    PredictedMelOptions o;
    o.layout = MelLayout::FramesByBands;
    const PredictedMel p = readPredictedMel(path, o);
    EXPECT_EQ(p.layoutFrom, "option");
    const MelDifference d = diffPredictedMel(p, referenceSignal());
    EXPECT_LT(d.maxAbsDb, 0.005);
    EXPECT_EQ(d.comparedFrames, 80);
    EXPECT_TRUE(anyContains(d.warnings, "the prediction has 80 frames, Earmark's mel of the audio 87"));
}

TEST(PredictedMel, BandCountMismatchIsAClearError) {
    const auto ref = test::modelReference()["predicted_mel"];
    const std::string path = test::modelDataPath(ref["f16_bands_frames"]);
    PredictedMelOptions o;
    o.settings.bands = 100;
    try {
        readPredictedMel(path, o);
        ADD_FAILURE() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_THAT(e.problem(), HasSubstr("shape (80, 87) has no axis of 100 bands"));
    }
    o.layout = MelLayout::BandsByFrames;
    try {
        readPredictedMel(path, o);
        ADD_FAILURE() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_THAT(e.problem(), HasSubstr("has 80 bands, but the settings say 100"));
    }
    // Against a computed mel of another band count.
    const PredictedMel p = readPredictedMel(path);
    MelParams fewer;
    fewer.bands = 64;
    const Spectrogram computed = computeMelSpectrogram(referenceSignal(), fewer);
    try {
        compareMels(p, computed, melSettingsOf(fewer, 22050));
        ADD_FAILURE() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "mel difference");
        EXPECT_THAT(e.problem(), HasSubstr("band counts differ (80 predicted, 64 computed)"));
    }
}

TEST(PredictedMel, FmaxMismatchIsWarnedAndShows) {
    const auto ref = test::modelReference()["predicted_mel"];
    const PredictedMel p = readPredictedMel(test::modelDataPath(ref["planted_file"]));
    MelParams other;
    other.fmaxHz = 7600;
    const Spectrogram computed = computeMelSpectrogram(referenceSignal(), other);
    const MelDifference d = compareMels(p, computed, melSettingsOf(other, 22050));
    EXPECT_TRUE(anyContains(d.warnings, "band range differs (0-8000 Hz predicted, 0-7600 Hz computed)"));
    EXPECT_GT(worstOutside(d, 30, 39, 20, 29), 0.1);  // the top bands cover other frequencies

    // An option that contradicts the sidecar is used, and said so.
    PredictedMelOptions o;
    o.settings.fmaxHz = 7600;
    const PredictedMel q = readPredictedMel(test::modelDataPath(ref["planted_file"]), o);
    EXPECT_EQ(q.settings.fmaxHz, 7600);
    EXPECT_TRUE(anyContains(q.warnings, "fmax_hz: 7600 (option) instead of 8000 (sidecar)"));
}

TEST(PredictedMel, HopAndRateMismatchesAreWarned) {
    const auto ref = test::modelReference()["predicted_mel"];
    const PredictedMel p = readPredictedMel(test::modelDataPath(ref["planted_file"]));
    MelParams other;
    other.stft.hopSize = 200;
    const Spectrogram computed = computeMelSpectrogram(referenceSignal(), other);
    const MelDifference d = compareMels(p, computed, melSettingsOf(other, 22050));
    EXPECT_TRUE(anyContains(d.warnings, "hops differ (256 samples at 22050 Hz = 11.61 ms predicted, 200 samples"));
    // Frames matched by time: the first predicted frame meets the computed frame at the same time.
    EXPECT_EQ(d.firstFrame, 0);
    EXPECT_GT(d.comparedFrames, 80);

    // Audio at 16 kHz has nothing above 8 kHz, but this mel reaches 11.025 kHz.
    PredictedMelOptions o;
    o.settings.fmaxHz = 11025;
    const PredictedMel wide = readPredictedMel(test::modelDataPath(ref["f16_bands_frames"]), o);
    const Signal low = test::speechLike(1.0, 16000);
    const MelDifference w = diffPredictedMel(wide, low);
    EXPECT_TRUE(anyContains(w.warnings, "the audio (16000 Hz) holds nothing above 8000 Hz"));
}

TEST(PredictedMel, ImplausibleValuesForTheLogBaseAreWarned) {
    test::TempDir dir;
    const Signal s = test::speechLike(1.0, 22050);
    MelParams db;
    db.log = LogScale::Decibel;
    db.floor = -100;
    const Spectrogram mel = computeMelSpectrogram(s, db);
    const std::string path = dir.file("db.npy");
    writeNpyFloat32(path, mel.values, {mel.frames, mel.bins});  // no sidecar: natural log assumed
    const PredictedMel p = readPredictedMel(path);
    EXPECT_TRUE(anyContains(p.warnings, "looks like decibels, not a natural log"));
    PredictedMelOptions o;
    o.settings.log = MelLogBase::Decibel;
    const PredictedMel q = readPredictedMel(path, o);
    EXPECT_EQ(q.settings.logFloor, -100.0);  // the dB default floor follows the log base
    EXPECT_TRUE(q.warnings.empty());
    EXPECT_LT(diffPredictedMel(q, s).maxAbsDb, 1e-3);
}

TEST(PredictedMel, BadFilesAreInputErrors) {
    test::TempDir dir;
    const std::string oneD = dir.file("one.npy");
    writeNpyFloat32(oneD, {1, 2, 3}, {3});
    EXPECT_THROW(readPredictedMel(oneD), InputError);
    const std::string batched = dir.file("batched.npy");
    writeNpyFloat32(batched, std::vector<float>(80 * 3, -5.0f), {1, 80, 3});  // a batch of one: fine
    EXPECT_EQ(readPredictedMel(batched).mel.frames, 3);
    const std::string bad = dir.file("bad.npy");
    writeNpyFloat32(bad, std::vector<float>(80 * 3, -5.0f), {80, 3});
    std::ofstream(bad + ".json") << R"({"mel_scale": "bark"})";
    try {
        readPredictedMel(bad);
        ADD_FAILURE() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_THAT(e.what(), HasSubstr("mel_scale: \"bark\" is not a valid value"));
    }
}

}  // namespace
}  // namespace earmark
