// Reusing the context-free state scores of an earlier pass: the second
// pass of word evidence reads them instead of evaluating the Gaussians
// again, so its result must equal a pass that computes them itself.
// Audio: a real recording with its transcript from pocketsphinx-testdata.
#include "earmark/acoustic/forced_alignment.hpp"
#include "earmark/acoustic/senone_scorer.hpp"
#include "earmark/core/error.hpp"
#include "earmark/io/audio_file.hpp"

#include <gtest/gtest.h>

#include <algorithm>

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

// The same path to the last bit: stretches, phones and scores.
void expectSamePath(const ForcedAlignment& a, const ForcedAlignment& b) {
    ASSERT_TRUE(a.reachedEnd);
    ASSERT_TRUE(b.reachedEnd);
    EXPECT_EQ(a.logLikelihood, b.logLikelihood);
    ASSERT_EQ(a.path.size(), b.path.size());
    for (std::size_t i = 0; i < a.path.size(); ++i) {
        EXPECT_EQ(a.path[i].startFrame, b.path[i].startFrame) << i;
        EXPECT_EQ(a.path[i].basePhone, b.path[i].basePhone) << i;
        EXPECT_EQ(a.path[i].logLikelihood, b.path[i].logLikelihood) << i;
    }
}

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
    expectSamePath(reused, computed);
}

// Gaussian evaluations kept from a first pass: a second pass that reads
// them (with coverage on, so it visits other states too) finds the path a
// pass computing everything itself finds, to the last bit.
TEST(ForcedAlignment, KeptCodebookEvaluationsGiveTheSamePath) {
    const CardsTake s;
    CodebookTopCache kept(*s.model, s.features.frames, SenoneScorer::kDefaultTopDensities);
    ASSERT_TRUE(kept.enabled());
    std::vector<float> contextFree;
    ForcedAlignmentParams first;
    first.coverage = false;
    first.codebookCache = &kept;
    forceAlign(*s.model, s.features, s.words, contextFree, first);
    EXPECT_NE(kept.find(0, s.model->codebookOf(s.model->states(0)[0])), nullptr);

    ForcedAlignmentParams second;
    second.codebookCache = &kept;
    std::vector<float> scoresA, scoresB;
    const ForcedAlignment fromKept = forceAlign(*s.model, s.features, s.words, scoresA, second);
    const ForcedAlignment computed = forceAlign(*s.model, s.features, s.words, scoresB);
    EXPECT_EQ(scoresA, scoresB);
    expectSamePath(fromKept, computed);
}

// Memory stays bounded: a cache for an hour of frames keeps nothing.
TEST(ForcedAlignment, CodebookCacheHoldsNothingBeyondItsBound) {
    const AcousticModel& model = loadedModel();
    const CodebookTopCache hour(model, 360000, SenoneScorer::kDefaultTopDensities);
    EXPECT_FALSE(hour.enabled());
    EXPECT_EQ(hour.find(0, 0), nullptr);
    const CodebookTopCache minute(model, 6000, SenoneScorer::kDefaultTopDensities);
    EXPECT_TRUE(minute.enabled());
}

TEST(ForcedAlignment, GivenScoresOfTheWrongSizeAreRefused) {
    const CardsTake s;
    std::vector<float> contextFree(7, 0.0f);
    ForcedAlignmentParams reuse;
    reuse.contextFreeGiven = true;
    EXPECT_THROW(forceAlign(*s.model, s.features, s.words, contextFree, reuse), ParamError);
}

// Pause penalties per frame: none changes nothing; a prohibitive one leaves no
// pause on the path (the take's silences go to the words' phones); a vector
// of the wrong length or with a negative value is refused.
TEST(ForcedAlignment, PausePenaltiesPerFrame) {
    const CardsTake s;
    std::vector<float> contextFree;
    const ForcedAlignment plain = forceAlign(*s.model, s.features, s.words, contextFree);
    const auto pauses = [](const ForcedAlignment& a) {
        return std::count_if(a.path.begin(), a.path.end(),
                             [](const PathSegment& p) { return p.kind == PathSegment::Kind::Pause; });
    };
    ASSERT_TRUE(plain.reachedEnd);
    ASSERT_GT(pauses(plain), 0);  // the recording has silence before and after the words

    ForcedAlignmentParams zero;
    zero.pauseFramePenalty.assign(s.features.frames, 0.0f);
    const ForcedAlignment same = forceAlign(*s.model, s.features, s.words, contextFree, zero);
    EXPECT_EQ(same.logLikelihood, plain.logLikelihood);
    EXPECT_EQ(same.path.size(), plain.path.size());

    ForcedAlignmentParams ruledOut;
    ruledOut.coverage = false;
    ruledOut.pauseFramePenalty.assign(s.features.frames, 1000.0f);
    const ForcedAlignment none = forceAlign(*s.model, s.features, s.words, contextFree, ruledOut);
    ASSERT_TRUE(none.reachedEnd);
    EXPECT_EQ(pauses(none), 0);

    ForcedAlignmentParams shortVector;
    shortVector.pauseFramePenalty.assign(s.features.frames - 1, 0.0f);
    EXPECT_THROW(forceAlign(*s.model, s.features, s.words, contextFree, shortVector), ParamError);
    ForcedAlignmentParams negative;
    negative.pauseFramePenalty.assign(s.features.frames, -1.0f);
    EXPECT_THROW(forceAlign(*s.model, s.features, s.words, contextFree, negative), ParamError);
}

}  // namespace
}  // namespace earmark
