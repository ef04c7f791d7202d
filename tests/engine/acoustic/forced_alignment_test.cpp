// Reusing the context-free state scores of an earlier pass: the second
// pass of word evidence reads them instead of evaluating the Gaussians
// again, so its result must equal a pass that computes them itself.
// Audio: a real recording with its transcript from pocketsphinx-testdata.
#include "earmark/acoustic/forced_alignment.hpp"
#include "earmark/acoustic/senone_scorer.hpp"
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"

#include <gtest/gtest.h>

namespace earmark {
namespace {

const AcousticModel& loadedModel() {
    static const AcousticModel m = AcousticModel::load(*AcousticModel::installedEnglishModel());
    return m;
}

struct CardsTake {
    const AcousticModel* model = &loadedModel();
    std::shared_ptr<const PronouncingDictionary> dictionary =
        sharedDictionary(*AcousticModel::installedEnglishDictionary(), *model);
    ModelFeatures features =
        computeModelFeatures(loadAudio("/usr/share/pocketsphinx/test/data/cards/001.wav").signal, model->frontEnd());
    std::vector<ScriptWord> words = scriptWords("ten of clubs", *dictionary, *model, "en-us");
};

TEST(ForcedAlignment, GivenContextFreeScoresGiveTheSamePath) {
    const CardsTake s;
    std::vector<float> contextFree;
    const ForcedAlignment computed = forceAlign(*s.model, s.features, s.words, contextFree);
    EXPECT_EQ(contextFree, contextFreeScores(*s.model, s.features));

    ForcedAlignmentParams reuse;
    reuse.contextFreeGiven = true;
    const std::vector<float> before = contextFree;
    const ForcedAlignment reused = forceAlign(*s.model, s.features, s.words, contextFree, reuse);
    EXPECT_EQ(contextFree, before);
    ASSERT_TRUE(computed.reachedEnd);
    ASSERT_TRUE(reused.reachedEnd);
    EXPECT_EQ(reused.logLikelihood, computed.logLikelihood);
    ASSERT_EQ(reused.path.size(), computed.path.size());
    for (std::size_t i = 0; i < computed.path.size(); ++i) {
        EXPECT_EQ(reused.path[i].startFrame, computed.path[i].startFrame) << i;
        EXPECT_EQ(reused.path[i].basePhone, computed.path[i].basePhone) << i;
    }
}

TEST(ForcedAlignment, GivenScoresOfTheWrongSizeAreRefused) {
    const CardsTake s;
    std::vector<float> contextFree(7, 0.0f);
    ForcedAlignmentParams reuse;
    reuse.contextFreeGiven = true;
    EXPECT_THROW(forceAlign(*s.model, s.features, s.words, contextFree, reuse), ParamError);
}

}  // namespace
}  // namespace earmark
