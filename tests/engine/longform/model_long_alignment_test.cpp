// Long text alignment with the trained acoustic model (modelChunkAligner) on
// a read that is not espeak-ng: eight takes of Debian's festival voice
// cmu_us_slt_arctic_hts (texts of our own, tests/data/evidence/
// render_festival_takes.py) joined into one 16 kHz read with pauses between
// them and a paragraph break after every fourth. The truth is festival's own
// word start times (its utterance structure), moved by each take's place in
// the read. Bar (issue 10's, for the model on these voices): ≥ 95 % of word
// starts within 50 ms, median < 15 ms.
#include "earmark/acoustic/word_evidence.hpp"
#include "earmark/core/error.hpp"
#include "earmark/dsp/resample.hpp"
#include "earmark/io/audio_file.hpp"
#include "earmark/longform/long_alignment.hpp"
#include "support/festival_takes.hpp"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>

namespace earmark {
namespace {

namespace fs = std::filesystem;

struct FestivalRead {
    Signal audio;
    std::string text;
    std::vector<std::pair<double, std::string>> wordStarts;  // truth
};

FestivalRead joinFestivalTakes(std::size_t count, double pauseSeconds) {
    FestivalRead read;
    read.audio.sampleRate = 16000.0;
    const auto files = test::festivalTakeFiles("slt-", false);
    for (std::size_t i = 0; i < count && i < files.size(); ++i) {
        const double offset = read.audio.durationSeconds();
        const Signal take = resample(loadAudio(files[i].string()).signal, read.audio.sampleRate);
        read.audio.samples.insert(read.audio.samples.end(), take.samples.begin(), take.samples.end());
        read.audio.samples.resize(read.audio.samples.size() + static_cast<std::size_t>(pauseSeconds * read.audio.sampleRate));
        read.text += (i == 0 ? "" : i % 4 == 0 ? "\n\n" : " ") + test::firstLine(fs::path(files[i]).replace_extension(".txt"));
        std::ifstream truth(fs::path(files[i]).replace_extension(".words"));
        double start = 0, end = 0;
        std::string label;
        while (truth >> start >> end >> label) read.wordStarts.emplace_back(offset + start, label);
    }
    return read;
}

TEST(ModelLongAlignment, FestivalReadWordStartsWithinTheBar) {
    if (!modelCoversVoice("en-us")) GTEST_SKIP() << "the acoustic model (pocketsphinx-en-us) is not installed";
    const FestivalRead read = joinFestivalTakes(8, 0.6);
    LongAlignParams params;
    params.chunkTargetSeconds = 8.0;  // several chunks in half a minute
    const LongAlignResult r = alignLongText(read.audio, read.text, modelChunkAligner("en-us"), params);
    EXPECT_GE(r.chunks, 3);
    const Tier* words = r.tiers.find(kWordsTier);
    const Tier* sentences = r.tiers.find(kSentencesTier);
    const Tier* paragraphs = r.tiers.find(kParagraphsTier);
    ASSERT_TRUE(words && sentences && paragraphs);
    EXPECT_EQ(paragraphs->intervals.size(), 2u);
    EXPECT_EQ(sentences->intervals.size(), 8u);
    ASSERT_EQ(words->intervals.size(), read.wordStarts.size());
    std::vector<double> errors;
    for (std::size_t i = 0; i < read.wordStarts.size(); ++i) {
        const Interval& w = words->intervals[i];
        EXPECT_NE(w.label.find(read.wordStarts[i].second.substr(0, 3)), std::string::npos) << w.label;
        errors.push_back(std::abs(w.startS - read.wordStarts[i].first));
    }
    const auto within = std::count_if(errors.begin(), errors.end(), [](double e) { return e <= 0.050; });
    std::sort(errors.begin(), errors.end());
    const double median = errors[errors.size() / 2];
    const double share = static_cast<double>(within) / static_cast<double>(errors.size());
    std::printf("[ figures  ] festival slt read of %.1f s, %zu words in %d chunks (method %s): %.1f %% of word starts "
                "within 50 ms, median %.0f ms, worst %.0f ms\n",
                read.audio.durationSeconds(), errors.size(), r.chunks, r.method.c_str(), 100.0 * share,
                1000.0 * median, 1000.0 * errors.back());
    EXPECT_EQ(r.method, "model");  // the model fits this voice in every chunk
    EXPECT_GE(share, 0.95);
    EXPECT_LT(median, 0.015);
    EXPECT_GT(r.meanConfidence, 0.5);
}

TEST(ModelLongAlignment, MethodsByName) {
    EXPECT_TRUE(static_cast<bool>(chunkAlignerFor("model", "en-us")));
    EXPECT_TRUE(static_cast<bool>(chunkAlignerFor("reference", "de")));
    EXPECT_THROW(chunkAlignerFor("auto", "en-us"), ParamError);
}

}  // namespace
}  // namespace earmark
