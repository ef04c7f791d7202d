// The acoustic model reader against the recogniser's own tools: the binary
// model definition as pocketsphinx_mdef_convert (Debian package pocketsphinx)
// prints it in text form, and the front end against libsphinxbase's
// fe_process_utt on a real recording shipped in pocketsphinx-testdata.
#include "earmark/acoustic/acoustic_model.hpp"
#include "earmark/acoustic/model_features.hpp"
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"
#include "support/temp_dir.hpp"

#include <gtest/gtest.h>
#include <sphinxbase/cmd_ln.h>
#include <sphinxbase/err.h>
#include <sphinxbase/fe.h>

#include <cmath>
#include <cstdlib>
#include <fstream>
#include <sstream>

namespace earmark {
namespace {

const AcousticModel& model() {
    static const AcousticModel m = AcousticModel::load(*AcousticModel::installedEnglishModel());
    return m;
}

TEST(AcousticModel, ShapeOfTheInstalledEnglishModel) {
    const AcousticModel& m = model();
    EXPECT_EQ(m.basePhoneCount(), 42);
    EXPECT_EQ(m.basePhoneName(m.silencePhone()), "SIL");
    EXPECT_EQ(m.senoneCount(), 5126);
    EXPECT_EQ(m.codebookCount(), 42);  // phonetically tied: one codebook per base phone
    EXPECT_EQ(m.featureSize(), 39);
    EXPECT_EQ(m.frontEnd().filters, 25);
    EXPECT_EQ(m.frontEnd().lifter, 22);
}

TEST(AcousticModel, MixtureWeightsSumToOneWithinTheirQuantisation) {
    // 8-bit weights in steps of 0.1 nats: each sum stays within ~10 % of 1.
    const AcousticModel& m = model();
    double worst = 0;
    for (int s = 0; s < m.senoneCount(); ++s)
        for (int f = 0; f < m.streams(); ++f) {
            double sum = 0;
            for (int d = 0; d < m.densities(); ++d) sum += std::exp(m.logWeight(s, f, d));
            worst = std::max(worst, std::fabs(sum - 1.0));
        }
    EXPECT_LT(worst, 0.12);
}

TEST(AcousticModel, EveryTriphoneMatchesTheRecognisersTextDump) {
    test::TempDir dir;
    const std::string out = dir.file("mdef.txt");
    const std::string cmd = "pocketsphinx_mdef_convert -text '" + (model().folder() / "mdef").string() + "' '" + out +
                            "' >/dev/null 2>&1";
    ASSERT_EQ(std::system(cmd.c_str()), 0) << "pocketsphinx_mdef_convert (Debian package pocketsphinx) is needed";
    std::ifstream in(out);
    std::string line;
    std::size_t checked = 0;
    const auto position = [](const std::string& p) {
        return p == "b" ? WordPosition::Begin : p == "e" ? WordPosition::End : p == "s" ? WordPosition::Single
                                                                                     : WordPosition::Internal;
    };
    while (std::getline(in, line)) {
        std::istringstream f(line);
        std::string base, left, right, pos, attr;
        int tmat, s0, s1, s2;
        if (!(f >> base >> left >> right >> pos >> attr >> tmat >> s0 >> s1 >> s2)) continue;
        if (left == "-") continue;  // base phones
        const int id = model().phoneModel(*model().basePhone(base), *model().basePhone(left), *model().basePhone(right),
                                          position(pos));
        ASSERT_GE(id, model().basePhoneCount()) << line;
        EXPECT_EQ(model().states(id)[0], s0) << line;
        EXPECT_EQ(model().states(id)[1], s1) << line;
        EXPECT_EQ(model().states(id)[2], s2) << line;
        ++checked;
    }
    EXPECT_EQ(checked, 137053u);
}

TEST(ModelFeatures, CepstraEqualLibsphinxbaseOnARealRecording) {
    const LoadedAudio audio = loadAudio("/usr/share/pocketsphinx/test/data/cards/001.wav");
    ModelFrontEnd fe = model().frontEnd();
    fe.dither = false;  // the reference runs without dither
    std::size_t frames = 0;
    const std::vector<float> ours = modelCepstra(audio.signal, fe, &frames);

    err_set_logfp(nullptr);  // the library logs its configuration otherwise
    cmd_ln_t* config = cmd_ln_init(nullptr, fe_get_args(), TRUE, "-samprate", "16000", "-lowerf", "130", "-upperf",
                                   "6800", "-nfilt", "25", "-transform", "dct", "-lifter", "22", "-dither", "no",
                                   "-remove_noise", "no", "-remove_silence", "no", nullptr);
    ASSERT_NE(config, nullptr);
    fe_t* reference = fe_init_auto_r(config);
    ASSERT_NE(reference, nullptr);
    std::vector<int16> pcm(audio.signal.size());
    for (std::size_t i = 0; i < pcm.size(); ++i)
        pcm[i] = static_cast<int16>(std::lround(audio.signal.samples[i] * 32768.0f));
    mfcc_t** cep = nullptr;
    int32 n = 0;
    ASSERT_GE(fe_process_utt(reference, pcm.data(), pcm.size(), &cep, &n), 0);
    ASSERT_EQ(static_cast<std::size_t>(n), frames);
    double worst = 0;
    for (int t = 0; t < n; ++t)
        for (int i = 0; i < 13; ++i)
            worst = std::max(worst, std::fabs(static_cast<double>(cep[t][i]) - ours[static_cast<std::size_t>(t) * 13 + static_cast<std::size_t>(i)]));
    EXPECT_LT(worst, 1e-3);  // float rounding; cepstra span about ±90
    fe_free_2d(cep);
    fe_free(reference);
    cmd_ln_free_r(config);
}

TEST(AcousticModel, DamagedFilesAreNamed) {
    test::TempDir dir;
    for (const char* f : {"mdef", "means", "variances", "sendump", "transition_matrices", "feat.params", "noisedict"})
        std::filesystem::copy_file(model().folder() / f, dir.path() / f);
    std::filesystem::resize_file(dir.path() / "means", 1000);
    try {
        AcousticModel::load(dir.path());
        FAIL() << "a truncated means file was accepted";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), (dir.path() / "means").string());
    }
    EXPECT_THROW(AcousticModel::load(dir.path() / "missing"), InputError);
}

}  // namespace
}  // namespace earmark
