// Attention matrices: the monotonic path, the token tier, and skip/repeat
// detection, on matrices built frame by frame with a known path by
// tests/data/model/make_model_data.py (numpy), plus small hand-made ones.
#include "earmark/core/error.hpp"
#include "earmark/export/npy.hpp"
#include "earmark/model/array_layout.hpp"
#include "earmark/model/attention_alignment.hpp"
#include "engine/model/model_data.hpp"
#include "support/temp_dir.hpp"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <functional>

namespace earmark {
namespace {

using ::testing::HasSubstr;

struct Loaded {
    AttentionMatrix matrix;
    std::vector<std::string> tokens;
};

Loaded load(const std::string& key) {
    const auto ref = test::modelReference()["attention"];
    Loaded l;
    l.tokens = readTokenList(test::modelDataPath(ref["tokens_file"]));
    l.matrix = readAttentionNpy(test::modelDataPath(ref[key]), static_cast<int>(l.tokens.size()));
    return l;
}

// A frames × tokens matrix that puts weight 0.9 on path[f] and shares 0.1 among the rest.
AttentionMatrix fromPath(const std::vector<int>& path, int tokens) {
    AttentionMatrix m;
    m.frames = static_cast<int>(path.size());
    m.tokens = tokens;
    m.weights.assign(path.size() * static_cast<std::size_t>(tokens), 0.1f / static_cast<float>(tokens - 1));
    for (std::size_t f = 0; f < path.size(); ++f) m.weights[f * static_cast<std::size_t>(tokens) + path[f]] = 0.9f;
    return m;
}

TEST(Attention, CleanDiagonalGivesTheDiagonalPathAndNoFaults) {
    const auto ref = test::modelReference()["attention"];
    const Loaded l = load("clean");
    ASSERT_EQ(l.tokens.size(), 24u);
    ASSERT_EQ(l.matrix.frames, ref["clean_frames"].get<int>());
    const AttentionAlignment a = alignAttention(l.matrix, l.tokens);
    EXPECT_TRUE(a.faults.empty());
    const int per = ref["frames_per_token"];
    for (int k = 0; k < l.matrix.tokens; ++k) {
        EXPECT_EQ(a.path.firstFrame[k], k * per) << k;
        EXPECT_EQ(a.path.lastFrame[k], k * per + per - 1) << k;
    }
    // The tier: one interval per token, 5 frames of 256 samples at 22 050 Hz each.
    ASSERT_EQ(a.tokens.intervals.size(), 24u);
    const double hop = 256 / 22050.0;
    EXPECT_EQ(a.tokens.name, "tokens");
    EXPECT_EQ(a.tokens.intervals[11].label, "slipway");
    EXPECT_NEAR(a.tokens.intervals[11].startS, 55 * hop, 1e-12);
    EXPECT_NEAR(a.tokens.intervals[11].endS, 60 * hop, 1e-12);
    EXPECT_GT(*a.tokens.intervals[11].confidence, 0.5);
    EXPECT_FALSE(checkTier(a.tokens, a.durationS).error);
}

TEST(Attention, SkippedAndRepeatedTokensAreFlaggedAtTheirFrames) {
    const auto ref = test::modelReference()["attention"];
    const Loaded l = load("faulty");
    const AttentionAlignment a = alignAttention(l.matrix, l.tokens);
    ASSERT_EQ(a.faults.size(), 2u);
    const AttentionEvent& skip = a.faults[0];
    EXPECT_EQ(skip.kind, AttentionFault::Skip);
    EXPECT_EQ(skip.firstFrame, ref["skip"]["frame"].get<int>());
    EXPECT_EQ(skip.firstToken, 9);
    EXPECT_EQ(skip.lastToken, 9);
    EXPECT_NEAR(skip.startS, 45 * 256 / 22050.0, 1e-12);
    const AttentionEvent& repeat = a.faults[1];
    EXPECT_EQ(repeat.kind, AttentionFault::Repeat);
    EXPECT_EQ(repeat.firstFrame, ref["repeat"]["first_frame"].get<int>());
    EXPECT_EQ(repeat.lastFrame, ref["repeat"]["last_frame"].get<int>());
    EXPECT_EQ(repeat.firstToken, 16);
    EXPECT_EQ(repeat.lastToken, 16);
    EXPECT_NEAR(repeat.endS, 89 * 256 / 22050.0, 1e-12);
    // The monotonic path still gives every token a frame, the skipped one too.
    EXPECT_EQ(a.path.lastFrame.back(), l.matrix.frames - 1);
    for (int k = 1; k < l.matrix.tokens; ++k) EXPECT_EQ(a.path.firstFrame[k], a.path.lastFrame[k - 1] + 1);
}

TEST(Attention, TokensByFramesFloat16FileGivesTheSameFaults) {
    const auto ref = test::modelReference()["attention"];
    const Loaded l = load("faulty_tokens_frames");
    EXPECT_EQ(l.matrix.frames, ref["faulty_frames"].get<int>());
    const std::vector<AttentionEvent> faults = attentionFaults(l.matrix);
    ASSERT_EQ(faults.size(), 2u);
    EXPECT_EQ(faults[0].firstFrame, ref["skip"]["frame"].get<int>());
    EXPECT_EQ(faults[1].firstFrame, ref["repeat"]["first_frame"].get<int>());
}

TEST(Attention, OneFrameFlickerIsNotARepeatUnlessAskedFor) {
    // Token 2 flickers back to 1 for a single frame.
    const AttentionMatrix m = fromPath({0, 0, 1, 1, 2, 2, 1, 2, 2, 3, 3}, 4);
    EXPECT_TRUE(attentionFaults(m).empty());
    AttentionParams strict;
    strict.minHoldFrames = 1;
    const auto faults = attentionFaults(m, strict);
    ASSERT_EQ(faults.size(), 1u);
    EXPECT_EQ(faults[0].kind, AttentionFault::Repeat);
    EXPECT_EQ(faults[0].firstFrame, 6);
}

TEST(Attention, TokensNeverReachedAtTheEndAreSkipped) {
    const AttentionMatrix m = fromPath({0, 0, 1, 1, 2, 2, 2, 2}, 5);  // tokens 3 and 4 never attended
    const auto faults = attentionFaults(m);
    ASSERT_EQ(faults.size(), 1u);
    EXPECT_EQ(faults[0].kind, AttentionFault::Skip);
    EXPECT_EQ(faults[0].firstFrame, 7);
    EXPECT_EQ(faults[0].firstToken, 3);
    EXPECT_EQ(faults[0].lastToken, 4);
}

TEST(Attention, PathIsTheBestMonotonicPathByExhaustiveSearch) {
    // Every path with steps of 0 or +1 from (0, 0) to (T−1, K−1), enumerated.
    const int T = 9, K = 4;
    AttentionMatrix m;
    m.frames = T;
    m.tokens = K;
    for (int i = 0; i < T * K; ++i) m.weights.push_back(static_cast<float>(std::fmod(i * 0.6180339887, 1.0)));
    double best = -1.0;
    std::function<void(int, int, double)> walk = [&](int t, int k, double sum) {
        sum += m.at(t, k);
        if (t == T - 1) {
            if (k == K - 1) best = std::max(best, sum);
            return;
        }
        walk(t + 1, k, sum);
        if (k + 1 < K) walk(t + 1, k + 1, sum);
    };
    walk(0, 0, 0.0);
    const AttentionPath p = monotonicPath(m);
    EXPECT_NEAR(p.score, best, 1e-6);
    double sum = 0.0;
    for (int t = 0; t < T; ++t) {
        sum += m.at(t, p.tokenOfFrame[t]);
        if (t > 0) {
            EXPECT_LE(p.tokenOfFrame[t] - p.tokenOfFrame[t - 1], 1);
            EXPECT_GE(p.tokenOfFrame[t] - p.tokenOfFrame[t - 1], 0);
        }
    }
    EXPECT_NEAR(sum, best, 1e-6);
}

TEST(Attention, BadShapesAndListsAreClearErrors) {
    test::TempDir dir;
    const std::string square = dir.file("square.npy");
    writeNpyFloat32(square, std::vector<float>(9, 0.1f), {3, 3});
    EXPECT_THROW(readAttentionNpy(square, 3), AmbiguousLayout);
    EXPECT_EQ(readAttentionNpy(square, 3, AttentionLayout::TokensByFrames).frames, 3);
    try {
        readAttentionNpy(square, 4);
        ADD_FAILURE() << "expected InputError";
    } catch (const InputError& e) {
        EXPECT_THAT(e.problem(), HasSubstr("shape (3, 3) has no axis of 4 entries"));
    }
    EXPECT_THROW(monotonicPath(fromPath({0, 1}, 3)), InputError);  // fewer frames than tokens

    const std::string lines = dir.file("tokens.txt");
    std::ofstream(lines) << "a\r\n\nc\n";
    EXPECT_EQ(readTokenList(lines), (std::vector<std::string>{"a", "", "c"}));
    const std::string json = dir.file("tokens.json");
    std::ofstream(json) << R"( ["h", " ", "i"])";
    EXPECT_EQ(readTokenList(json), (std::vector<std::string>{"h", " ", "i"}));
    const std::string empty = dir.file("empty.txt");
    std::ofstream(empty) << "";
    EXPECT_THROW(readTokenList(empty), InputError);
    EXPECT_THROW(alignAttention(fromPath({0, 1, 2}, 3), {"a", "b"}), ParamError);
}

}  // namespace
}  // namespace earmark
