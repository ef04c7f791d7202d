// Long text alignment: the outline of a text, and chunked alignment of a
// built read whose sentence placement is known (the renderer's audio placed
// by support/long_read.hpp is the truth).
#include "earmark/core/error.hpp"
#include "earmark/longform/long_alignment.hpp"
#include "earmark/longform/text_outline.hpp"

#include "support/long_read.hpp"

#include <gtest/gtest.h>

#include <cmath>

namespace earmark {
namespace {

TEST(TextOutline, ParagraphsAndSentences) {
    const TextOutline o = outlineText("First one. Is it second?\n  \n\"Third!\" said she… Fourth (really.)\n\n\n  ");
    ASSERT_EQ(o.paragraphs.size(), 2u);
    ASSERT_EQ(o.paragraphs[0].sentences.size(), 2u);
    EXPECT_EQ(o.paragraphs[0].sentences[1].text, "Is it second?");
    ASSERT_EQ(o.paragraphs[1].sentences.size(), 3u);
    EXPECT_EQ(o.paragraphs[1].sentences[0].text, "\"Third!\"");
    EXPECT_EQ(o.paragraphs[1].sentences[1].text, "said she…");
    EXPECT_EQ(o.paragraphs[1].sentences[2].text, "Fourth (really.)");
    EXPECT_EQ(o.sentenceCount(), 5u);
    EXPECT_TRUE(outlineText(" \n\n ... \n").paragraphs.empty());
}

TEST(LongAlignment, SentencesAndParagraphsMatchThePlacement) {
    const test::LongRead& read = test::twelveSentenceRead();
    int calls = 0;
    const ChunkAligner base = referenceWarpingAligner();
    const ChunkAligner counting = [&](const Signal& audio, const std::string& text, Progress p) {
        ++calls;
        return base(audio, text, p);
    };
    LongAlignParams params;
    params.chunkTargetSeconds = 12.0;  // several chunks in a minute of speech
    const LongAlignResult r = alignLongText(read.audio, read.text, counting, params);
    EXPECT_GE(r.chunks, 3);
    EXPECT_EQ(calls, r.chunks);
    const Tier* sentences = r.tiers.find(kSentencesTier);
    const Tier* paragraphs = r.tiers.find(kParagraphsTier);
    const Tier* words = r.tiers.find(kWordsTier);
    ASSERT_TRUE(sentences && paragraphs && words);
    ASSERT_EQ(sentences->intervals.size(), 12u);
    for (std::size_t i = 0; i < 12; ++i) {
        SCOPED_TRACE(i);
        EXPECT_NEAR(sentences->intervals[i].startS, read.sentenceStartS[i], 0.15);
        EXPECT_NEAR(sentences->intervals[i].endS, read.sentenceEndS[i], 0.15);
        EXPECT_EQ(sentences->intervals[i].label, test::longReadSentence(static_cast<int>(i)));
    }
    ASSERT_EQ(paragraphs->intervals.size(), 2u);  // six sentences per paragraph
    EXPECT_NEAR(paragraphs->intervals[1].startS, read.sentenceStartS[6], 0.15);
    EXPECT_GT(words->intervals.size(), 12u * 10);
    for (std::size_t i = 1; i < words->intervals.size(); ++i)
        ASSERT_GE(words->intervals[i].startS, words->intervals[i - 1].endS - 1e-9) << i;
    TierSet copy = r.tiers;
    EXPECT_NO_THROW(validateTierSet(copy, "aligned"));
}

TEST(LongAlignment, TextCoveringHalfTheAudioIsBadInput) {
    const test::LongRead& read = test::twelveSentenceRead();
    std::string half;
    for (int i = 0; i < 6; ++i) half += test::longReadSentence(i) + " ";
    try {
        alignLongText(read.audio, half, referenceWarpingAligner());
        FAIL() << "no error";
    } catch (const InputError& e) {
        EXPECT_EQ(e.subject(), "text");
        EXPECT_NE(std::string(e.what()).find("covers only"), std::string::npos) << e.what();
    }
}

TEST(LongAlignment, TextLongerThanTheTakeIsBadInput) {
    const test::LongRead& read = test::twelveSentenceRead();
    std::string twice = read.text + "\n\n" + read.text;
    EXPECT_THROW(alignLongText(read.audio, twice, referenceWarpingAligner()), InputError);
    EXPECT_THROW(alignLongText(read.audio, " ... ", referenceWarpingAligner()), InputError);
}

}  // namespace
}  // namespace earmark
